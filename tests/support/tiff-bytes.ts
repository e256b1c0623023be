/**
 * Reading and rewriting the first directory (IFD) of a classic TIFF in place, for tests that damage valid
 * fixtures: TIFF 6.0 section 2 (header, IFD entries of 12 bytes: tag, type, count, value or offset).
 */

/** Bytes per value of each TIFF field type (TIFF 6.0 p. 15-16; 16-18 from the BigTIFF types, unused here). */
const TYPE_SIZE: Record<number, number> = { 1: 1, 2: 1, 3: 2, 4: 4, 5: 8, 6: 1, 7: 1, 8: 2, 9: 4, 10: 8, 11: 4, 12: 8 };

/** One IFD entry: where it sits and where its values are. */
interface IfdEntry {
  tag: number;
  type: number;
  count: number;
  /** Byte offset of the 12-byte entry. */
  entryAt: number;
  /** Byte offset of the first value (inside the entry when the values fit in 4 bytes). */
  valuesAt: number;
}

export const TAG = {
  ImageWidth: 256,
  ImageLength: 257,
  BitsPerSample: 258,
  Compression: 259,
  StripOffsets: 273,
  SamplesPerPixel: 277,
  RowsPerStrip: 278,
  StripByteCounts: 279,
  Predictor: 317,
  TileWidth: 322,
  TileLength: 323,
  TileOffsets: 324,
  TileByteCounts: 325,
  SampleFormat: 339,
  ModelPixelScale: 33550,
  ModelTiepoint: 33922,
  GeoKeyDirectory: 34735,
} as const;

function view(b: Uint8Array): DataView {
  return new DataView(b.buffer, b.byteOffset, b.byteLength);
}

/** Whether the file is little-endian ("II"). */
export function littleEndian(b: Uint8Array): boolean {
  return b[0] === 0x49;
}

/** The entries of the first IFD of a classic (not Big) TIFF. */
export function ifdEntries(b: Uint8Array): IfdEntry[] {
  const v = view(b);
  const le = littleEndian(b);
  const ifd = v.getUint32(4, le);
  const n = v.getUint16(ifd, le);
  const out: IfdEntry[] = [];
  for (let k = 0; k < n; k++) {
    const at = ifd + 2 + 12 * k;
    const tag = v.getUint16(at, le), type = v.getUint16(at + 2, le), count = v.getUint32(at + 4, le);
    const size = (TYPE_SIZE[type] ?? 1) * count;
    out.push({ tag, type, count, entryAt: at, valuesAt: size <= 4 ? at + 8 : v.getUint32(at + 8, le) });
  }
  return out;
}

/** The entry of `tag`, or throws (a fixture without it is a mistake in the test). */
function entry(b: Uint8Array, tag: number): IfdEntry {
  const e = ifdEntries(b).find((x) => x.tag === tag);
  if (!e) throw new Error(`The TIFF has no tag ${tag}.`);
  return e;
}

/** Overwrite the values of a DOUBLE entry (e.g. ModelTiepoint, ModelPixelScale). */
export function setDoubles(b: Uint8Array, tag: number, values: number[]): void {
  const e = entry(b, tag);
  if (e.type !== 12) throw new Error(`Tag ${tag} is of type ${e.type}, not DOUBLE.`);
  const v = view(b);
  values.slice(0, e.count).forEach((x, i) => v.setFloat64(e.valuesAt + 8 * i, x, littleEndian(b)));
}

/** Overwrite the k-th value of a SHORT or LONG entry. */
export function setInt(b: Uint8Array, tag: number, value: number, k = 0): void {
  const e = entry(b, tag);
  const v = view(b);
  if (e.type === 3) v.setUint16(e.valuesAt + 2 * k, value, littleEndian(b));
  else if (e.type === 4) v.setUint32(e.valuesAt + 4 * k, value >>> 0, littleEndian(b));
  else throw new Error(`Tag ${tag} is of type ${e.type}, not SHORT or LONG.`);
}

/** Point an entry whose values do not fit in the entry at another place in the file (e.g. past its end). */
export function setValuesPointer(b: Uint8Array, tag: number, offset: number): void {
  const e = entry(b, tag);
  view(b).setUint32(e.entryAt + 8, offset >>> 0, littleEndian(b));
}
