/** GeoTIFF DEM reading from bytes: header only, the whole grid, or just the blocks under a window. */
import type { GeoTransform, Grid, GridCrs } from './grid';
import { createGrid, mapToPixel } from './grid';
import { TerrainError, check } from './errors';
import { createTransform } from './crs';
import { asRangeSource, type ByteRangeSource, type DemHeader, type DemLayout, parseDemHeader } from './dem-header';
import { damagedBlock } from './dem-damage';
import { applyMaskRows, maskRowBytes } from './dem-mask';
import { firstBand, undoFloatPredictorInterleaved, undoIntegerPredictorInterleaved } from './dem-bands';
import { blockDecoderFor, copyRows, float32PredictorRows, type InflateFn, sampleBytes, undoFloatPredictorBytes, undoIntegerPredictor } from './dem-decoders';

export type { ByteRangeSource, DemHeader } from './dem-header';
export type { InflateFn } from './dem-decoders';

/** A map-coordinate window: bbox [minx, miny, maxx, maxy] in `crs` (default the grid's), widened by `marginPx` pixels (default 1). */
interface DemWindow {
  bbox: readonly [number, number, number, number];
  crs?: GridCrs;
  marginPx?: number;
}

/** Options for reading: a window, a pixel limit (default 2^28 pixels = 1 GiB of Float32), and a fast inflate. */
interface ReadDemOptions {
  window?: DemWindow;
  /** A window in pixels [col0, row0, col1, row1) (end exclusive); wins over `window`. */
  pixelWindow?: readonly [number, number, number, number];
  maxPixels?: number;
  inflate?: InflateFn;
  /** Reuse this buffer for the output (its length must equal the window's pixel count), e.g. a shared one. */
  into?: Float32Array;
  /** Answer a window of nodata only instead of refusing it (a band of a grid read band by band may be all nodata). */
  allowAllNodata?: boolean;
}

/** An opened DEM: its header, and reads of windows that share a cache of decoded blocks. */
export interface DemSource {
  header: DemHeader;
  read(opts?: Omit<ReadDemOptions, 'inflate'>): Promise<Grid>;
  /** Decoded pixels so far (each block counted once per decode), for memory and cache accounting. */
  stats: { blocksDecoded: number; pixelsDecoded: number };
}

const DEFAULT_MAX_PIXELS = 2 ** 28;

/** Read what a GeoTIFF DEM says about itself (size, georeference, CRS, nodata, units, layout) without decoding pixels. */
export async function readDemHeader(bytes: ArrayBuffer | Uint8Array | ByteRangeSource): Promise<DemHeader> {
  return (await parseDemHeader(asRangeSource(bytes))).header;
}

/** Pixel range [c0, r0, c1, r1) that covers a map window, widened by its margin and clipped to the grid. */
export function windowToPixels(header: Pick<DemHeader, 'width' | 'height' | 'transform' | 'crs'>, window: DemWindow): [number, number, number, number] {
  const b = window.bbox;
  check(Array.isArray(b) && b.length === 4 && b.every(Number.isFinite) && b[0] <= b[2] && b[1] <= b[3], `window.bbox must be [minx, miny, maxx, maxy] with min <= max, got ${JSON.stringify(b)}.`);
  const margin = window.marginPx ?? 1;
  check(Number.isInteger(margin) && margin >= 0, `window.marginPx must be a whole number >= 0, got ${margin}.`);
  const tr = createTransform(window.crs ?? header.crs, header.crs);
  let cMin = Infinity, rMin = Infinity, cMax = -Infinity, rMax = -Infinity;
  const N = tr.identity ? 1 : 16; // a reprojected box has curved edges: follow them
  for (let k = 0; k <= N; k++) {
    const f = k / N;
    for (const [x, y] of [[b[0] + f * (b[2] - b[0]), b[1]], [b[0] + f * (b[2] - b[0]), b[3]], [b[0], b[1] + f * (b[3] - b[1])], [b[2], b[1] + f * (b[3] - b[1])]]) {
      const [gx, gy] = tr.forward(x, y);
      const [c, r] = mapToPixel(header.transform, gx, gy);
      if (!Number.isFinite(c) || !Number.isFinite(r)) continue;
      cMin = Math.min(cMin, c); cMax = Math.max(cMax, c); rMin = Math.min(rMin, r); rMax = Math.max(rMax, r);
    }
  }
  const c0 = Math.max(0, Math.floor(cMin) - margin), r0 = Math.max(0, Math.floor(rMin) - margin);
  const c1 = Math.min(header.width, Math.ceil(cMax) + margin), r1 = Math.min(header.height, Math.ceil(rMax) + margin);
  if (!(c1 > c0 && r1 > r0)) {
    throw new TerrainError('outside-grid', `The requested area ${JSON.stringify(b)} does not overlap the grid (${header.width} x ${header.height} pixels); check the area and its CRS.`);
  }
  return [c0, r0, c1, r1];
}

function windowTransform(t: GeoTransform, c0: number, r0: number): GeoTransform {
  return [t[0] + c0 * t[1] + r0 * t[2], t[1], t[2], t[3] + c0 * t[4] + r0 * t[5], t[4], t[5]];
}

/** Open a DEM for repeated window reads (decoded blocks are cached up to `cacheBytes`, default 64 MiB). */
export async function openDem(input: ArrayBuffer | Uint8Array | ByteRangeSource, opts: { inflate?: InflateFn; cacheBytes?: number } = {}): Promise<DemSource> {
  // bytes in memory or a file read by ranges: either way only the blocks a read needs are fetched
  const bytes = asRangeSource(input);
  const { header, layout } = await parseDemHeader(bytes);
  const spp = layout.samplesPerPixel;
  const maskFill = header.nodata ?? (header.sampleType.startsWith('float') ? NaN : null);
  const decode = await blockDecoderFor(layout.compressionCode, opts.inflate, { extra: layout.lercExtra, type: header.sampleType, littleEndian: layout.littleEndian, maskFill },
    { tables: layout.jpegTables, blockWidth: header.tiling.blockWidth, blockHeight: header.tiling.blockHeight });
  const maskDecode = layout.mask ? await blockDecoderFor(layout.mask.compressionCode, opts.inflate) : null;
  const { tiled, blockWidth: bw, blockHeight: bh, blocksAcross } = header.tiling;
  const size = sampleBytes(header.sampleType);
  const f32pred = header.predictor === 3 && header.sampleType === 'float32' && spp === 1;
  const nodataBits = header.nodata === null || Number.isNaN(header.nodata) ? null : new Uint32Array(new Float32Array([header.nodata]).buffer)[0];
  const stats = { blocksDecoded: 0, pixelsDecoded: 0 };
  const cacheLimit = opts.cacheBytes ?? 64 * 2 ** 20;
  const cache = new Map<number, Float32Array>(); // insertion order = least recently used first
  let cacheBytes = 0;

  /** Decode block `idx` rows [rowFrom, rowTo), cols [colFrom, colTo) (block-relative) into dest. */
  async function decodeBlockInto(idx: number, dest: Float32Array, destOffset: number, destStride: number, colFrom: number, colTo: number, rowFrom: number, rowTo: number): Promise<void> {
    const rowsInBlock = tiled ? bh : Math.min(bh, header.height - Math.floor(idx / blocksAcross) * bh);
    const off = Number(layout.offsets[idx]);
    const count = Number(layout.byteCounts[idx]);
    if (count === 0) { // sparse block: GDAL leaves such blocks unwritten, meaning nodata
      for (let r = rowFrom; r < rowTo; r++) dest.fill(NaN, destOffset + (r - rowFrom) * destStride, destOffset + (r - rowFrom) * destStride + colTo - colFrom);
      return;
    }
    const expected = bw * rowsInBlock * size * spp;
    const raw = await bytes.read(off, count);
    let data: Uint8Array;
    try {
      const d = decode(raw, expected);
      data = d instanceof Promise ? await d : d;
    } catch (err) {
      // the decoder's own words (zlib's "invalid block type", "unexpected end of file" …) after the block's name
      const why = err instanceof TerrainError ? err.message : (err as Error)?.message ?? String(err);
      throw damagedBlock(idx, header.tiling, header.height, `its ${header.compression.toUpperCase()} data does not decode (${why})`);
    }
    if (data.byteLength < bw * rowTo * size * spp) {
      throw damagedBlock(idx, header.tiling, header.height, `it decodes to ${data.byteLength} bytes where ${expected} are needed`);
    }
    stats.blocksDecoded++;
    stats.pixelsDecoded += bw * rowsInBlock;
    if (data === raw && header.predictor !== 1) data = raw.slice(); // never change the caller's bytes
    if (spp > 1) {
      // pixel-interleaved bands: predictors run over whole interleaved rows; then keep band 1 only
      if (header.predictor === 2) undoIntegerPredictorInterleaved(data, size, bw, rowsInBlock, spp, layout.littleEndian);
      else if (header.predictor === 3) undoFloatPredictorInterleaved(data, size, bw, rowsInBlock, spp, layout.littleEndian);
      data = firstBand(data, size, spp, bw * rowsInBlock);
      copyRows(data, header.sampleType, layout.littleEndian, bw, dest, destOffset, destStride, colFrom, colTo, rowFrom, rowTo, header.nodata);
    } else if (f32pred) {
      float32PredictorRows(data, bw, rowsInBlock, new Uint32Array(dest.buffer, dest.byteOffset, dest.length), destOffset, destStride, colFrom, colTo, rowFrom, rowTo, nodataBits);
    } else {
      if (header.predictor !== 1) {
        if (header.predictor === 2) undoIntegerPredictor(data, header.sampleType, bw, rowsInBlock, layout.littleEndian);
        else undoFloatPredictorBytes(data, size, bw, rowsInBlock, layout.littleEndian);
      }
      copyRows(data, header.sampleType, layout.littleEndian, bw, dest, destOffset, destStride, colFrom, colTo, rowFrom, rowTo, header.nodata);
    }
    if (layout.mask && maskDecode) await applyMask(idx, rowsInBlock, dest, destOffset, destStride, colFrom, colTo, rowFrom, rowTo);
  }

  /** Cells the internal mask marks as without data become NaN (GDAL's mask band reads them as 0 = no data). */
  async function applyMask(idx: number, rowsInBlock: number, dest: Float32Array, destOffset: number, destStride: number, colFrom: number, colTo: number, rowFrom: number, rowTo: number): Promise<void> {
    const m = layout.mask!;
    const off = Number(m.offsets[idx]), count = Number(m.byteCounts[idx]);
    let bits: Uint8Array | null = null;
    if (count > 0) {
      const expected = maskRowBytes(bw) * rowsInBlock;
      try {
        const d = maskDecode!(await bytes.read(off, count), expected);
        bits = d instanceof Promise ? await d : d;
      } catch (err) {
        throw damagedBlock(idx, header.tiling, header.height, `its internal mask does not decode (${(err as Error)?.message ?? String(err)})`);
      }
      if (bits.byteLength < maskRowBytes(bw) * rowTo) throw damagedBlock(idx, header.tiling, header.height, `its internal mask decodes to ${bits.byteLength} bytes where ${expected} are needed`);
    }
    applyMaskRows(bits, bw, dest, destOffset, destStride, colFrom, colTo, rowFrom, rowTo);
  }

  async function cachedBlock(idx: number): Promise<Float32Array> {
    const hit = cache.get(idx);
    if (hit) { cache.delete(idx); cache.set(idx, hit); return hit; }
    const rows = tiled ? bh : Math.min(bh, header.height - Math.floor(idx / blocksAcross) * bh);
    // once the cache is full, the least recently used block's buffer is reused (no new allocation)
    let tile: Float32Array | undefined;
    if (cacheBytes + bw * rows * 4 > cacheLimit && cache.size > 0) {
      const [k, v] = cache.entries().next().value as [number, Float32Array];
      cache.delete(k);
      cacheBytes -= v.byteLength;
      if (v.length === bw * rows) tile = v;
    }
    tile ??= new Float32Array(bw * rows);
    await decodeBlockInto(idx, tile, 0, bw, 0, bw, 0, rows);
    cache.set(idx, tile);
    cacheBytes += tile.byteLength;
    return tile;
  }

  async function read(ro: Omit<ReadDemOptions, 'inflate'> = {}): Promise<Grid> {
    const [c0, r0, c1, r1] = ro.pixelWindow ? clipPixelWindow(ro.pixelWindow, header) : ro.window ? windowToPixels(header, ro.window) : [0, 0, header.width, header.height];
    const outW = c1 - c0, outH = r1 - r0;
    const maxPixels = ro.maxPixels ?? DEFAULT_MAX_PIXELS;
    if (outW * outH > maxPixels) {
      throw new TerrainError('too-large', `The ${ro.window || ro.pixelWindow ? 'window' : 'grid'} is ${outW} x ${outH} = ${outW * outH} pixels, above the limit of ${maxPixels}; read a smaller area or resample the DEM (gdal_translate -tr).`);
    }
    let out = ro.into;
    if (out) check(out.length === outW * outH, `into must hold ${outW * outH} values for this window, got ${out.length}.`);
    else out = new Float32Array(outW * outH);
    const useCache = cacheLimit > 0 && (ro.window !== undefined || ro.pixelWindow !== undefined);
    for (let by = Math.floor(r0 / bh); by * bh < r1; by++) {
      for (let bx = Math.floor(c0 / bw); bx * bw < c1; bx++) {
        const idx = by * blocksAcross + bx;
        const bRow0 = by * bh, bCol0 = bx * bw;
        const rowFrom = Math.max(r0 - bRow0, 0), rowTo = Math.min(r1 - bRow0, bh);
        const colFrom = Math.max(c0 - bCol0, 0), colTo = Math.min(c1 - bCol0, bw);
        const destOffset = (bRow0 + rowFrom - r0) * outW + (bCol0 + colFrom - c0);
        if (useCache) {
          const tile = await cachedBlock(idx);
          for (let r = rowFrom; r < rowTo; r++) out.set(tile.subarray(r * bw + colFrom, r * bw + colTo), destOffset + (r - rowFrom) * outW);
        } else {
          await decodeBlockInto(idx, out, destOffset, outW, colFrom, colTo, rowFrom, rowTo);
        }
      }
    }
    const { scale, offset } = layout.toMetres;
    if (scale !== 1 || offset !== 0) for (let i = 0; i < out.length; i++) out[i] = out[i] * scale + offset;
    let any = false;
    for (let i = 0; i < out.length; i++) if (out[i] === out[i]) { any = true; break; }
    if (!any && !ro.allowAllNodata) {
      throw new TerrainError('all-nodata', `The ${ro.window || ro.pixelWindow ? 'requested part of the grid' : 'grid'} holds only nodata, so there is no terrain to plan over; check the nodata value or choose an area the DEM covers.`);
    }
    return createGrid({ width: outW, height: outH, data: out, transform: windowTransform(header.transform, c0, r0), crs: header.crs, nodata: header.nodata, sourceVerticalUnit: header.units.vertical });
  }

  return { header, read, stats };
}

function clipPixelWindow(w: readonly [number, number, number, number], h: DemHeader): [number, number, number, number] {
  check(w.length === 4 && w.every((v) => Number.isInteger(v)), `pixelWindow must be four whole numbers [col0, row0, col1, row1], got ${JSON.stringify(w)}.`);
  const c0 = Math.max(0, w[0]), r0 = Math.max(0, w[1]), c1 = Math.min(h.width, w[2]), r1 = Math.min(h.height, w[3]);
  if (!(c1 > c0 && r1 > r0)) throw new TerrainError('outside-grid', `Pixel window ${JSON.stringify(w)} does not overlap the ${h.width} x ${h.height} grid.`);
  return [c0, r0, c1, r1];
}

/** Read a GeoTIFF DEM (or only the blocks under `window`) into a Grid: heights in metres, NaN for nodata. */
export async function readDem(bytes: ArrayBuffer | Uint8Array | ByteRangeSource, opts: ReadDemOptions = {}): Promise<Grid> {
  const source = await openDem(bytes, { inflate: opts.inflate, cacheBytes: 0 });
  return source.read(opts);
}
