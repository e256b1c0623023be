/**
 * PNG encoding of 8-bit RGBA pixels, in plain TypeScript so terrain/ stays free of Node built-ins (pngjs needs
 * node:zlib and Buffer). The zlib stream inside a PNG comes from a deflate the process injects once
 * (`setPngDeflate`, as the native xz decoder is injected through dem-codecs.ts); without one the image data go
 * in stored (uncompressed) deflate blocks, still a valid PNG, only larger.
 * Layout from the PNG specification (W3C PNG 2nd edition, sections 5 (chunks and CRC), 7.3 (filtering) and
 * 10 (zlib stream)); zlib's stored blocks and Adler-32 from RFC 1950 and RFC 1951 section 3.2.4.
 */

/** Compresses bytes into a zlib stream (RFC 1950), e.g. node:zlib's deflateSync. */
type DeflateFn = (data: Uint8Array) => Uint8Array;

let deflate: DeflateFn = storedZlib;

/** Give the encoder a real deflate (once per process or thread); `null` goes back to stored blocks. */
export function setPngDeflate(fn: DeflateFn | null): void {
  deflate = fn ?? storedZlib;
}

/** PNG colour types this encoder writes: 4 grey with alpha (grey from the red byte), 6 RGBA. */
type PngColourType = 4 | 6;

/** RGBA pixels (row-major, 4 bytes each) as PNG bytes of the given colour type. */
export function encodePng(width: number, height: number, rgba: Uint8Array, colourType: PngColourType = 6): Uint8Array {
  if (!(Number.isInteger(width) && Number.isInteger(height) && width > 0 && height > 0)) throw new Error(`encodePng: width and height must be whole numbers above 0 (got ${width} × ${height})`);
  if (rgba.length < width * height * 4) throw new Error(`encodePng: ${width} × ${height} RGBA pixels need ${width * height * 4} bytes, got ${rgba.length}`);
  const bpp = colourType === 6 ? 4 : 2;
  const pixels = colourType === 6 ? rgba.subarray(0, width * height * 4) : greyAlpha(rgba, width * height);
  const ihdr = new Uint8Array(13);
  const v = new DataView(ihdr.buffer);
  v.setUint32(0, width);
  v.setUint32(4, height);
  ihdr.set([8, colourType, 0, 0, 0], 8); // bit depth 8, deflate, adaptive filtering, no interlace
  return concat([
    new Uint8Array([137, 80, 78, 71, 13, 10, 26, 10]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflate(filterRows(pixels, width, height, bpp))),
    chunk('IEND', new Uint8Array(0)),
  ]);
}

function greyAlpha(rgba: Uint8Array, count: number): Uint8Array {
  const out = new Uint8Array(count * 2);
  for (let i = 0; i < count; i++) {
    out[2 * i] = rgba[4 * i];
    out[2 * i + 1] = rgba[4 * i + 3];
  }
  return out;
}

function paeth(a: number, b: number, c: number): number {
  const p = a + b - c;
  const pa = Math.abs(p - a), pb = Math.abs(p - b), pc = Math.abs(p - c);
  return pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
}

/** Each row with the filter (none, sub, up, average, Paeth) whose output has the least sum of absolute values. */
function filterRows(px: Uint8Array, width: number, height: number, bpp: number): Uint8Array {
  const rowBytes = width * bpp;
  const out = new Uint8Array(height * (rowBytes + 1));
  const trial = new Uint8Array(rowBytes);
  const best = new Uint8Array(rowBytes);
  const zero = new Uint8Array(rowBytes);
  for (let y = 0; y < height; y++) {
    const row = px.subarray(y * rowBytes, (y + 1) * rowBytes);
    const up = y > 0 ? px.subarray((y - 1) * rowBytes, y * rowBytes) : zero;
    let bestType = 0;
    let bestSum = Infinity;
    for (let type = 0; type < 5; type++) {
      let sum = 0;
      for (let x = 0; x < rowBytes; x++) {
        const a = x >= bpp ? row[x - bpp] : 0, b = up[x], c = x >= bpp ? up[x - bpp] : 0;
        const pred = type === 0 ? 0 : type === 1 ? a : type === 2 ? b : type === 3 ? (a + b) >> 1 : paeth(a, b, c);
        const d = (row[x] - pred) & 0xff;
        trial[x] = d;
        sum += d < 128 ? d : 256 - d;
      }
      if (sum < bestSum) {
        bestSum = sum;
        bestType = type;
        best.set(trial);
      }
    }
    const o = y * (rowBytes + 1);
    out[o] = bestType;
    out.set(best, o + 1);
  }
  return out;
}

const crcTable = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

function crc32(bytes: Uint8Array, crc = 0xffffffff): number {
  for (let i = 0; i < bytes.length; i++) crc = crcTable[(crc ^ bytes[i]) & 0xff] ^ (crc >>> 8);
  return crc;
}

function chunk(type: string, data: Uint8Array): Uint8Array {
  const out = new Uint8Array(12 + data.length);
  const v = new DataView(out.buffer);
  v.setUint32(0, data.length);
  for (let i = 0; i < 4; i++) out[4 + i] = type.charCodeAt(i);
  out.set(data, 8);
  v.setUint32(8 + data.length, (crc32(out.subarray(4, 8 + data.length)) ^ 0xffffffff) >>> 0);
  return out;
}

function concat(parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

/** A zlib stream of stored (uncompressed) deflate blocks of at most 65,535 bytes each, with its Adler-32. */
function storedZlib(data: Uint8Array): Uint8Array {
  const blocks = Math.max(1, Math.ceil(data.length / 65535));
  const out = new Uint8Array(2 + blocks * 5 + data.length + 4);
  out[0] = 0x78; // deflate, 32 KiB window
  out[1] = 0x01; // no preset dictionary, fastest; (0x78 · 256 + 0x01) is a multiple of 31
  let o = 2;
  for (let b = 0; b < blocks; b++) {
    const part = data.subarray(b * 65535, Math.min(data.length, (b + 1) * 65535));
    out[o] = b === blocks - 1 ? 1 : 0;
    out[o + 1] = part.length & 0xff;
    out[o + 2] = part.length >>> 8;
    out[o + 3] = ~part.length & 0xff;
    out[o + 4] = (~part.length >>> 8) & 0xff;
    out.set(part, o + 5);
    o += 5 + part.length;
  }
  let s1 = 1, s2 = 0;
  for (let i = 0; i < data.length; i++) {
    s1 = (s1 + data[i]) % 65521;
    s2 = (s2 + s1) % 65521;
  }
  new DataView(out.buffer).setUint32(o, ((s2 << 16) | s1) >>> 0);
  return out;
}
