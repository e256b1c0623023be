/** GeoTIFF header parsing for DEMs (TIFF 6.0, OGC GeoTIFF 1.1): size, layout, georeference, CRS, nodata, units. */
import { GeoTIFF } from 'geotiff';
import { pixelToMap, type GeoTransform, type GridCrs, type LengthUnit } from './grid';
import { createTransform, WGS84 } from './crs';
import { TerrainError } from './errors';
import { crsFromGeoKeys, type GeoKeys, verticalDatumFromGeoKeys, verticalUnitFromGeoKeys } from './geokeys';
import { COMPRESSION_NAMES, sampleBytes, type SampleType } from './dem-decoders';
import { checkBlocksInFile, damagedDirectory } from './dem-damage';
import { checkElevationContent, checkPlacement } from './dem-content';
import { findInternalMask, type MaskLayout } from './dem-mask';
import { JPEG, LERC, type LercExtra, lercExtraOf, refusedCompression } from './dem-codecs';
import { METRES_PER_FOOT, METRES_PER_US_SURVEY_FOOT } from './length-units';

/** What a GeoTIFF DEM says about itself, without decoding any pixel. */
export interface DemHeader {
  width: number;
  height: number;
  /** GDAL geotransform, pixel-is-area (pixel-is-point files are shifted by half a pixel). */
  transform: GeoTransform;
  crs: GridCrs;
  nodata: number | null;
  units: { horizontal: LengthUnit; vertical: LengthUnit };
  verticalDatum: { epsg: number | null; name: string } | null;
  sampleType: SampleType;
  bands: number;
  tiling: { tiled: boolean; blockWidth: number; blockHeight: number; blocksAcross: number; blocksDown: number };
  compression: string;
  predictor: number;
  rasterType: 'pixel-is-area' | 'pixel-is-point';
  byteOrder: 'little-endian' | 'big-endian';
  /** 'internal': a GDAL internal mask marks cells without data (they read as nodata). */
  mask: 'internal' | 'none';
}

/** Where the blocks of band 1 live and how to decode them (internal to the reader). */
export interface DemLayout {
  compressionCode: number;
  /** Samples in each pixel of a block: > 1 for pixel-interleaved bands, of which band 1 is read. */
  samplesPerPixel: number;
  /** LERC's additional compression (GDAL's LercParameters tag). */
  lercExtra: LercExtra;
  /** JPEG's shared quantisation and Huffman tables (JPEGTables tag), for JPEG blocks. */
  jpegTables: Uint8Array | null;
  littleEndian: boolean;
  offsets: ArrayLike<number>;
  byteCounts: ArrayLike<number>;
  /** Metres per stored height unit, and an additive offset in metres (GDAL scale/offset). */
  toMetres: { scale: number; offset: number };
  /** GDAL's internal mask, on the same block grid as the heights, or null. */
  mask: MaskLayout | null;
}

const METRES_PER: Record<LengthUnit, number> = { metre: 1, foot: METRES_PER_FOOT, 'us-survey-foot': METRES_PER_US_SURVEY_FOOT, degree: NaN };

/** Metres per unit (international foot 0.3048 m exactly; US survey foot 1200/3937 m, NIST SP 811 appendix B). */
export function metresPerUnit(unit: LengthUnit): number {
  return METRES_PER[unit];
}

/**
 * A file read by byte ranges (a stored grid on disk or in object storage), so that only the header, the block
 * tables and the blocks a window needs are ever in memory. `read` answers at most `length` bytes: fewer past the
 * end of the file, as a slice of bytes in memory would.
 */
export interface ByteRangeSource {
  readonly byteLength: number;
  read(offset: number, length: number): Promise<Uint8Array>;
}

/** Bytes already in memory as a range source: each read is a view (no copy). */
function memoryRangeSource(bytes: Uint8Array): ByteRangeSource {
  return { byteLength: bytes.byteLength, read: async (offset, length) => bytes.subarray(offset, offset + length) };
}

/** Either input form of the readers as a range source. */
export function asRangeSource(input: ArrayBuffer | Uint8Array | ByteRangeSource): ByteRangeSource {
  if (input instanceof Uint8Array || input instanceof ArrayBuffer) return memoryRangeSource(asBytes(input));
  if (input && typeof (input as ByteRangeSource).read === 'function' && Number.isFinite((input as ByteRangeSource).byteLength)) return input as ByteRangeSource;
  throw new TerrainError('invalid-input', `A DEM is read from an ArrayBuffer, a Uint8Array or a byte-range source, got ${Object.prototype.toString.call(input)}.`);
}

/** A geotiff.js source over a range source: header reads fetch (and copy) only the small slices asked for. */
function geotiffSource(src: ByteRangeSource) {
  return {
    fileSize: src.byteLength,
    async fetch(slices: Array<{ offset: number; length: number }>) {
      return Promise.all(slices.map(async (s) => (await src.read(s.offset, s.length)).slice().buffer));
    },
    async close() {},
  };
}

/** The bytes as a Uint8Array view (no copy). */
function asBytes(input: ArrayBuffer | Uint8Array): Uint8Array {
  // a plain view, so that slice() copies even when the caller passes a Node Buffer (whose slice() does not)
  if (input instanceof Uint8Array) return new Uint8Array(input.buffer, input.byteOffset, input.byteLength);
  if (input instanceof ArrayBuffer) return new Uint8Array(input);
  throw new TerrainError('invalid-input', `A DEM is read from an ArrayBuffer or Uint8Array, got ${Object.prototype.toString.call(input)}.`);
}

function sampleTypeOf(format: number, bits: number): SampleType | null {
  if (format === 3) return bits === 16 ? 'float16' : bits === 32 ? 'float32' : bits === 64 ? 'float64' : null;
  if (format === 1 || format === 4) return bits === 8 ? 'uint8' : bits === 16 ? 'uint16' : bits === 32 ? 'uint32' : null;
  if (format === 2) return bits === 8 ? 'int8' : bits === 16 ? 'int16' : bits === 32 ? 'int32' : null;
  return null;
}

function unitFromName(name: unknown): LengthUnit | null {
  if (typeof name !== 'string') return null;
  const n = name.trim().toLowerCase();
  if (['m', 'metre', 'meter', 'metres', 'meters'].includes(n)) return 'metre';
  if (['ft', 'foot', 'feet', 'international foot'].includes(n)) return 'foot';
  if (['us-ft', 'ftus', 'us survey foot', 'us survey feet', 'foot_us', 'us_survey_foot'].includes(n)) return 'us-survey-foot';
  return null;
}

/** The georeference as a GDAL geotransform, from ModelTransformation or ModelTiepoint + ModelPixelScale. */
async function geoTransformOf(fd: { loadValue(t: string): Promise<unknown> }, pixelIsPoint: boolean): Promise<GeoTransform> {
  const m = (await fd.loadValue('ModelTransformation')) as number[] | undefined;
  const tie = (await fd.loadValue('ModelTiepoint')) as number[] | undefined;
  const scale = (await fd.loadValue('ModelPixelScale')) as number[] | undefined;
  let gt: [number, number, number, number, number, number];
  if (m && m.length >= 16) {
    gt = [m[3], m[0], m[1], m[7], m[4], m[5]];
  } else if (tie && tie.length >= 6 && scale && scale.length >= 2) {
    if (tie.length > 6) {
      throw new TerrainError('no-georeference', 'The GeoTIFF is georeferenced by several control points, not an affine transform; warp it first (gdalwarp in.tif out.tif).');
    }
    const [i, j, , x, y] = tie;
    gt = [x - i * scale[0], scale[0], 0, y + j * scale[1], 0, -scale[1]];
  } else {
    throw new TerrainError('no-georeference', 'The TIFF has no georeference (no ModelTiepoint + ModelPixelScale or ModelTransformation), so Loftline cannot place it on the ground; export it from your GIS as a GeoTIFF.');
  }
  if (!gt.every(Number.isFinite) || gt[1] * gt[5] - gt[2] * gt[4] === 0) {
    throw new TerrainError('no-georeference', `The GeoTIFF's georeference is broken (pixel size ${gt[1]} x ${gt[5]}); re-export it from your GIS.`);
  }
  if (pixelIsPoint) {
    // raster (0, 0) is the centre of the first pixel: move the origin to its outer corner (GDAL does the same)
    gt[0] -= 0.5 * gt[1] + 0.5 * gt[2];
    gt[3] -= 0.5 * gt[4] + 0.5 * gt[5];
  }
  return gt;
}

/**
 * Most decoded bytes a stored byte can hold, per compression. DEFLATE cannot pack more than about 1032 to 1
 * (RFC 1951: a 258-byte match costs at least 2 bits); LZW's strings grow by one byte per code, so a constant block
 * reaches about 1365 to 1 with 12-bit codes (TIFF 6.0, section 13); PackBits repeats a byte at most 128 times for 2
 * bytes (TIFF 6.0, section 9); uncompressed blocks hold what they store. Real elevation grids pack 2-10 to 1. ZSTD
 * and LERC have no such ceiling (a constant tile is a few bytes): their blocks are bounded by DEM_MAX_PIXELS and by
 * the decoders' output limits instead. A 9.5 KB file that declared 16384 x 16384 float32 samples used to be decoded.
 */
export const MAX_BYTES_PER_STORED_BYTE: Readonly<Record<number, number>> = { 1: 1, 5: 1400, 8: 1100, 32946: 1100, 32773: 64 };

/** Refuse a size that cannot be a grid, or a block table too long for the file to hold (before reading it). */
function checkDeclaredShape(width: number, height: number, blocks: number, fileBytes: number): void {
  if (!(Number.isInteger(width) && Number.isInteger(height) && width > 0 && height > 0)) {
    throw new TerrainError('damaged', `The TIFF declares a ${width} x ${height} grid; the file is damaged, so export it again.`);
  }
  // every block needs an offset and a byte count of at least 2 bytes each somewhere in the file
  if (blocks * 4 > fileBytes) {
    throw new TerrainError('too-large', `The GeoTIFF declares ${width} x ${height} pixels in ${blocks} blocks, more than a file of ${fileBytes} bytes can list; the file is damaged or not a real grid, so export it again.`);
  }
}

/** Refuse blocks that declare more samples than their stored bytes could hold under their compression. */
function checkDeclaredSize(h: { width: number; height: number; blockWidth: number; blockHeight: number; bytesPerSample: number; compressionCode: number }, byteCounts: ArrayLike<number>, blocks: number, fileBytes: number): void {
  const ratio = MAX_BYTES_PER_STORED_BYTE[h.compressionCode];
  if (ratio === undefined) return;
  const blockBytes = h.blockWidth * h.blockHeight * h.bytesPerSample;
  let stored = 0;
  let declared = 0;
  for (let i = 0; i < blocks; i++) {
    const count = Number(byteCounts[i]);
    if (count <= 0) continue; // a sparse block is nodata and decodes to nothing
    stored += count;
    declared += blockBytes;
  }
  // a little slack per block for headers and padding of the last row or column
  if (declared > stored * ratio + blocks * 1024) {
    throw new TerrainError('too-large',
      `The GeoTIFF declares ${h.width} x ${h.height} pixels (${Math.round(declared / 2 ** 20)} MiB of samples) in ${stored} stored bytes of a ${fileBytes}-byte file, ` +
      `more than its compression can hold (at most ${ratio} bytes per stored byte); the file is damaged or not a real grid, so export it again.`);
  }
}

/**
 * Parse the first image of a GeoTIFF into a header and the block layout of band 1. Anything that breaks while
 * reading the directory (a value table past the end of the file, a bad entry) is reported as a damaged file.
 */
export async function parseDemHeader(input: Uint8Array | ByteRangeSource): Promise<{ header: DemHeader; layout: DemLayout }> {
  try {
    return await parseHeaderFields(asRangeSource(input));
  } catch (err) {
    if (err instanceof TerrainError) throw err;
    throw damagedDirectory('TIFF directory', `an entry cannot be read (${(err as Error)?.message ?? String(err)})`);
  }
}

/** A block table (TileOffsets, StripByteCounts …): its values, or a damaged-file error naming the table. */
async function blockTable(fd: { loadValue(t: string): Promise<unknown> }, tag: string, fileBytes: number): Promise<ArrayLike<number>> {
  try {
    return (await fd.loadValue(tag)) as ArrayLike<number>;
  } catch (err) {
    // geotiff.js reads past the end of the bytes with a DataView: a RangeError
    const why = err instanceof RangeError ? `it lies past the end of the ${fileBytes}-byte file` : `it cannot be read (${(err as Error)?.message ?? String(err)})`;
    throw damagedDirectory(`${tag} table`, why);
  }
}

async function parseHeaderFields(src: ByteRangeSource): Promise<{ header: DemHeader; layout: DemLayout }> {
  if (src.byteLength < 8) throw new TerrainError('not-tiff', `The file is ${src.byteLength} bytes long, too short to be a TIFF; upload a GeoTIFF (.tif) DEM.`);
  const bytes = await src.read(0, 4);
  const bom = (bytes[0] << 8) | bytes[1];
  const le = bom === 0x4949;
  const magic = le ? bytes[2] | (bytes[3] << 8) : (bytes[2] << 8) | bytes[3];
  if ((bom !== 0x4949 && bom !== 0x4d4d) || (magic !== 42 && magic !== 43)) {
    throw new TerrainError('not-tiff', 'The file is not a TIFF (it does not start with a TIFF signature); upload a GeoTIFF (.tif) DEM.');
  }
  let image, tiff;
  try {
    tiff = await GeoTIFF.fromSource(geotiffSource(src) as never);
    image = await tiff.getImage(0);
  } catch (err) {
    throw new TerrainError('truncated', `The TIFF's directory cannot be read (${(err as Error).message}); the file is probably cut short, so upload it again.`);
  }
  const fd = image.fileDirectory;
  const width = image.getWidth();
  const height = image.getHeight();
  const bands = image.getSamplesPerPixel();
  const contentSampleType = sampleTypeOf(image.getSampleFormat(0) as number, image.getBitsPerSample(0));
  checkElevationContent({
    photometric: (await fd.loadValue('PhotometricInterpretation')) as number | undefined,
    hasColorMap: (await fd.loadValue('ColorMap')) !== undefined,
    sampleType: contentSampleType ?? 'float32',
    predictor: ((await fd.loadValue('Predictor')) as number | undefined) ?? 1,
  });
  const planar = ((await fd.loadValue('PlanarConfiguration')) as number | undefined) ?? 1;
  const photometric = (await fd.loadValue('PhotometricInterpretation')) as number | undefined;
  if (bands > 1 && planar !== 2 && (photometric === 2 || photometric === 6)) {
    throw new TerrainError('unsupported', `The GeoTIFF is a ${bands}-band colour image (RGB/YCbCr), not elevation; upload a single-band DEM.`);
  }
  const sampleType = sampleTypeOf(image.getSampleFormat(0) as number, image.getBitsPerSample(0));
  if (!sampleType) {
    throw new TerrainError('unsupported', `The GeoTIFF stores ${image.getBitsPerSample(0)}-bit samples of format ${image.getSampleFormat(0)}; Loftline reads 8/16/32-bit integers and 16/32/64-bit floats (gdal_translate -ot Float32).`);
  }
  const compressionCode = ((await fd.loadValue('Compression')) as number | undefined) ?? 1;
  const refused = refusedCompression(compressionCode);
  if (refused) throw new TerrainError('unsupported', refused);
  if (!(compressionCode in COMPRESSION_NAMES)) {
    throw new TerrainError('unsupported', `The GeoTIFF uses compression ${compressionCode}, which Loftline does not read; re-save it with DEFLATE, ZSTD, LERC, LZW or no compression (gdal_translate -co COMPRESS=DEFLATE).`);
  }
  const lercExtra = compressionCode === LERC ? lercExtraOf((await fd.loadValue('LercParameters')) as ArrayLike<number> | undefined) : 'none';
  const jpegTables = compressionCode === JPEG ? (((await fd.loadValue('JPEGTables')) as Uint8Array | undefined) ?? null) : null;
  if (compressionCode === JPEG && sampleType !== 'uint8') {
    throw new TerrainError('unsupported', `The GeoTIFF uses JPEG compression on ${image.getBitsPerSample(0)}-bit samples; Loftline reads 8-bit JPEG only. Re-save it with DEFLATE (gdal_translate -co COMPRESS=DEFLATE in.tif out.tif).`);
  }
  const predictor = ((await fd.loadValue('Predictor')) as number | undefined) ?? 1;
  if (predictor !== 1 && predictor !== 2 && predictor !== 3) throw new TerrainError('unsupported', `Unknown TIFF predictor ${predictor}; re-save the grid without a predictor.`);
  const geoKeys = image.getGeoKeys() as GeoKeys | null;
  const pixelIsPoint = geoKeys?.GTRasterTypeGeoKey === 2;
  const transform = await geoTransformOf(fd as never, pixelIsPoint);
  const crs = crsFromGeoKeys(geoKeys);
  checkPlacement(transform, width, height, crs);
  const tiled = image.isTiled as boolean;
  const blockWidth = image.getTileWidth();
  const blockHeight = image.getTileHeight();
  const blocksAcross = Math.ceil(width / blockWidth);
  const blocksDown = Math.ceil(height / blockHeight);
  const nBlocks = blocksAcross * blocksDown;
  checkDeclaredShape(width, height, nBlocks, src.byteLength);
  const offsets = await blockTable(fd as never, tiled ? 'TileOffsets' : 'StripOffsets', src.byteLength);
  const byteCounts = await blockTable(fd as never, tiled ? 'TileByteCounts' : 'StripByteCounts', src.byteLength);
  if (!offsets || !byteCounts || offsets.length < nBlocks || byteCounts.length < nBlocks) {
    throw new TerrainError('damaged', `The file is damaged: the TIFF lists ${Math.min(offsets?.length ?? 0, byteCounts?.length ?? 0)} data ${tiled ? 'tiles' : 'strips'} where ${nBlocks} are needed; re-export it from your GIS.`);
  }
  checkBlocksInFile(offsets, byteCounts, { tiled, blockHeight, blocksAcross, blocksDown }, height, src.byteLength);
  checkDeclaredSize({ width, height, blockWidth, blockHeight, bytesPerSample: sampleBytes(sampleType) * (planar === 1 ? bands : 1), compressionCode }, byteCounts, nBlocks, src.byteLength);
  const mask = await findInternalMask(tiff as never, { width, height, tiled, blockWidth, blockHeight, blocks: nBlocks });
  if (mask) checkBlocksInFile(mask.offsets, mask.byteCounts, { tiled, blockHeight, blocksAcross, blocksDown }, height, src.byteLength);
  const gdalMeta = ((await image.getGDALMetadata(0)) ?? {}) as Record<string, unknown>;
  const keysSayVertical = geoKeys != null && (geoKeys.VerticalUnitsGeoKey !== undefined || geoKeys.VerticalCSTypeGeoKey !== undefined);
  const vertical = keysSayVertical ? verticalUnitFromGeoKeys(geoKeys) : unitFromName(gdalMeta.UNITTYPE) ?? 'metre';
  const scale = gdalMeta.SCALE !== undefined ? Number(gdalMeta.SCALE) : 1;
  const offset = gdalMeta.OFFSET !== undefined ? Number(gdalMeta.OFFSET) : 0;
  const nodata = image.getGDALNoData();
  const header: DemHeader = {
    width,
    height,
    transform,
    crs,
    nodata,
    units: { horizontal: crs.horizontalUnit, vertical },
    verticalDatum: verticalDatumFromGeoKeys(geoKeys),
    sampleType,
    bands,
    tiling: { tiled, blockWidth, blockHeight, blocksAcross, blocksDown },
    compression: COMPRESSION_NAMES[compressionCode],
    predictor,
    rasterType: pixelIsPoint ? 'pixel-is-point' : 'pixel-is-area',
    byteOrder: le ? 'little-endian' : 'big-endian',
    mask: mask ? 'internal' : 'none',
  };
  const m = metresPerUnit(vertical);
  const layout: DemLayout = {
    compressionCode,
    samplesPerPixel: planar === 1 ? bands : 1,
    lercExtra,
    jpegTables,
    littleEndian: le,
    offsets,
    byteCounts,
    toMetres: { scale: (Number.isFinite(scale) ? scale : 1) * m, offset: (Number.isFinite(offset) ? offset : 0) * m },
    mask,
  };
  return { header, layout };
}
