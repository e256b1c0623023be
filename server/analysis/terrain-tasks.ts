/**
 * The two heavy terrain jobs of the server, as plain functions of bytes: inspect an uploaded DEM, and analyse a
 * mission over the part of a DEM it needs. They run in a terrain thread (terrain-pool.ts) or inline.
 */
import fsp from 'node:fs/promises';
import { inflateSync } from 'node:zlib';
import type { DemFileInfo, HillshadeInfo } from '../../contracts/sites';
import { analysePlan, surveyDem, missionBboxWgs84, readDem, readDemHeader, TerrainError, WGS84, type GridMetadata, type InflateFn, type PlanResult } from '../../terrain/index';
import { resolveMission } from '../../terrain/mission';
import { runCoverage } from '../../terrain/coverage-document';
import { coverageCog } from '../../terrain/coverage-raster-file';
import { coverageLayers } from '../../terrain/coverage-layer';
import type { CoverageMeasure } from '../../terrain/coverage-measures';
import type { StoredCoverage } from '../../contracts/coverage';
import { SOLVE_REPORT_KEYS } from '../../contracts/solve';
import { solvePlan } from '../../terrain/solve';
import type { Grid } from '../../terrain/grid';
import type { AnalyseOptions } from '../../terrain/plan';
import { runAsFlownCheck, type AsFlownCheckDocument } from '../../terrain/as-flown-document';
import type { FlownPhoto } from '../../terrain/as-flown-match';
import type { ByteRangeSource } from '../../terrain/index';

/**
 * A stored grid for the terrain tasks: its bytes in memory, a local file read by ranges, or any range source (an
 * object store's ranged GETs; a terrain thread asks the main thread for each range).
 */
export type DemFile = Uint8Array | { path: string } | ByteRangeSource;

/** A range source, told apart from the other forms of DemFile. */
export function isRangeSource(f: unknown): f is ByteRangeSource {
  return typeof (f as ByteRangeSource | null)?.read === 'function';
}

/**
 * Run `fn` over a range source of `grid`: a local file is opened once and read block by block through its handle,
 * so an analysis holds the header and the blocks of its window, never the whole file.
 */
async function withDemSource<T>(grid: DemFile, fn: (src: Uint8Array | ByteRangeSource) => Promise<T>): Promise<T> {
  if (grid instanceof Uint8Array || isRangeSource(grid)) return fn(grid);
  const handle = await fsp.open(grid.path, 'r');
  try {
    const { size } = await handle.stat();
    const src: ByteRangeSource = {
      byteLength: size,
      async read(offset, length) {
        const n = Math.max(0, Math.min(length, size - offset));
        const buf = new Uint8Array(n);
        let got = 0;
        while (got < n) {
          const { bytesRead } = await handle.read(buf, got, n - got, offset + got);
          if (bytesRead === 0) break;
          got += bytesRead;
        }
        return got === n ? buf : buf.subarray(0, got);
      },
    };
    return await fn(src);
  } finally {
    await handle.close();
  }
}

/** Largest analysis window (2^28 pixels = 1 GiB of float32); whole uploads are bounded by DEM_MAX_PIXELS. */
const MAX_DEM_PIXELS = 2 ** 28;

/**
 * node:zlib's inflate (about 4x faster than geotiff.js's), never producing more than the block's declared size:
 * a 1 MB block that inflates to 1 GiB stops at the declared size instead of filling memory. A block that will not
 * inflate, or inflates past its size, throws; the reader names the block (TerrainError `damaged`).
 */
export const nodeInflate: InflateFn = (data, expectedBytes) => {
  // twice the declared size leaves room for writers that pad the last strip to a full block
  const limit = expectedBytes > 0 ? 2 * expectedBytes + 1024 : undefined;
  try {
    return inflateSync(data, { chunkSize: Math.max(1024, Math.min(expectedBytes ?? 0, 64 * 2 ** 20)), ...(limit ? { maxOutputLength: limit } : {}) });
  } catch (err) {
    if ((err as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE') throw new TerrainError('damaged', `it inflates far past its declared ${expectedBytes} bytes`);
    throw err;
  }
};

/** What an upload yields: header facts, grid metadata and the hillshade preview. */
export interface DemInspection {
  file: DemFileInfo;
  metadata: GridMetadata;
  hillshade: HillshadeInfo & { png: Uint8Array };
}

/**
 * An error of the TIFF library while reading an uploaded file, as the refusal it is: the file's structure is
 * damaged in a way the engine's own checks did not name (found by fuzzing: a GeoKey directory pointing at a
 * missing value). The engine's own TerrainErrors pass through unchanged.
 */
function asDamaged(err: unknown): never {
  if (err instanceof TerrainError) throw err;
  throw new TerrainError('truncated', `The GeoTIFF cannot be read (${(err as Error)?.message ?? String(err)}); its structure is damaged, so export it again.`);
}

/** Read the header only (a quick refusal of files that are not usable DEMs, before any pixel is decoded). */
export async function inspectDemHeader(file: DemFile, opts: { maxPixels?: number } = {}): Promise<DemFileInfo> {
  const h = await withDemSource(file, (src) => readDemHeader(src)).catch(asDamaged);
  const maxPixels = opts.maxPixels ?? MAX_DEM_PIXELS;
  if (h.width * h.height > maxPixels) {
    throw new TerrainError('too-large', `The grid is ${h.width} x ${h.height} = ${h.width * h.height} pixels, above this server's limit of ${maxPixels} (DEM_MAX_PIXELS); crop or resample it (gdal_translate -projwin / -tr) and upload it again.`);
  }
  return { compression: h.compression, sampleType: h.sampleType, tiled: h.tiling.tiled, nodata: h.nodata, declaredVerticalDatum: h.verticalDatum };
}

/**
 * Survey the whole grid: metadata and a hillshade preview (longest side `maxSizePx`, default 1024). The file is read
 * by ranges (a local file through its handle, an object store by ranged GETs) one band of rows at a time, so a
 * 512 MB grid costs one band and the preview in memory, never the whole file or the whole grid.
 */
export async function inspectDem(file: DemFile, opts: { maxSizePx?: number; maxPixels?: number } = {}): Promise<DemInspection> {
  return withDemSource(file, async (src) => {
    const info = await inspectDemHeader(src, opts);
    const { metadata, hillshade: hs } = await surveyDem(src, { inflate: nodeInflate, maxSizePx: opts.maxSizePx ?? 1024 }).catch(asDamaged);
    return {
      file: info,
      metadata,
      hillshade: { png: hs.png, width: hs.width, height: hs.height, boundsWgs84: hs.boundsWgs84, transform: [...hs.transform] as HillshadeInfo['transform'] },
    };
  });
}

/** What the analysis needs to know beyond the file: the vertical datum the site states for its heights. */
export interface AnalyseMissionOptions {
  /** The site's vertical datum as stated at upload (the planner's words, or the file's own datum). */
  siteVerticalDatum?: string | null;
}

/**
 * The site's datum as the result states it: the file's own datum (with its EPSG code) when the site names the
 * same one, else the site's words with an EPSG code only where they give one ("EGM96 (EPSG:5773)").
 */
export function analysisDatum(siteVerticalDatum: string | null | undefined, declared: { epsg: number | null; name: string } | null): { epsg: number | null; name: string } | null {
  const name = siteVerticalDatum?.trim();
  if (!name) return declared;
  if (declared && declared.name === name) return declared;
  const code = /\bEPSG\s*:\s*(\d{4,6})\b/i.exec(name);
  return { epsg: code ? Number(code[1]) : null, name };
}

/** The coverage run's files: the raster (COG), one colour image per measure and the failing mask. */
export interface CoverageFiles {
  raster: Uint8Array;
  layers: Record<CoverageMeasure, Uint8Array>;
  failing: Uint8Array;
  /** The GSD map with the shortfall hatched in, for the printed report. */
  print: Uint8Array;
}

/** What an analysis gives: the plan's result and its coverage run (refused with a reason when it cannot be made). */
export interface MissionAnalysis {
  result: PlanResult;
  coverage: StoredCoverage;
  files: CoverageFiles | null;
}

/** The byte buffers of an analysis, to move (not copy) them from a terrain thread. */
export function analysisTransfer(a: MissionAnalysis): ArrayBuffer[] {
  if (!a.files) return [];
  return [a.files.raster, a.files.failing, a.files.print, ...Object.values(a.files.layers)].map((b) => b.buffer as ArrayBuffer);
}

/**
 * The solver's plan as a stored result: the plan itself, with the solver's report (choices, proof, comparison)
 * under `solved`, so every screen that reads a result reads a solved one the same way.
 */
function solvedResult(grid: Grid, mission: unknown, verticalDatum: AnalyseOptions['verticalDatum']): PlanResult {
  const solved = solvePlan(grid, mission, { verticalDatum });
  const plan: Record<string, unknown> = { ...solved };
  const report: Record<string, unknown> = {};
  for (const k of SOLVE_REPORT_KEYS) {
    report[k] = plan[k];
    delete plan[k];
  }
  return { ...(plan as unknown as PlanResult), solved: report } as PlanResult;
}

/**
 * Analyse `mission` over the window of the DEM that it needs (its area and takeoff, with margin), heights named by
 * the site's datum; then the coverage of every ground cell under the mission's spec and attitude envelope. A
 * coverage run the engine refuses (too many cells, a CRS without an EPSG code) leaves the plan's analysis standing
 * and says why.
 */
export async function analyseMission(file: DemFile, mission: unknown, onProgress: (pct: number) => void = () => {}, opts: AnalyseMissionOptions = {}): Promise<MissionAnalysis> {
  const bbox = missionBboxWgs84(mission);
  const { header, grid } = await withDemSource(file, async (src) => ({
    header: await readDemHeader(src),
    grid: await readDem(src, { window: { bbox, crs: WGS84, marginPx: 2 }, inflate: nodeInflate, maxPixels: MAX_DEM_PIXELS }),
  }));
  onProgress(40);
  const verticalDatum = analysisDatum(opts.siteVerticalDatum, header.verticalDatum);
  // resolved once for the analysis and the coverage run (the solver resolves each candidate it tries itself)
  const resolved = resolveMission(mission);
  const result = (mission as { layoutBy?: string }).layoutBy === 'solver' ? solvedResult(grid, mission, verticalDatum) : analysePlan(grid, mission, { verticalDatum, mission: resolved });
  onProgress(60);
  try {
    const run = runCoverage(grid, mission, resolved, result);
    const { layers, failingPng, printPng } = coverageLayers(run.raster, run.spec);
    const files: CoverageFiles = {
      raster: coverageCog(run.raster),
      layers: Object.fromEntries(layers.map((l) => [l.measure, l.png])) as Record<CoverageMeasure, Uint8Array>,
      failing: failingPng,
      print: printPng,
    };
    onProgress(95);
    return { result, coverage: { state: 'ready', document: run.document, layers: layers.map(({ png: _png, ...info }) => info) }, files };
  } catch (err) {
    if (!(err instanceof TerrainError)) throw err;
    onProgress(95);
    return { result, coverage: { state: 'refused', reason: err.message }, files: null };
  }
}

/**
 * Check a photo log against the plan of `mission` over the window of the DEM the mission needs (the same window the
 * analysis reads, so the plan the photos are matched to is the version's): matching, as-flown coverage, re-flight.
 */
export async function checkAsFlown(bytes: Uint8Array, mission: unknown, photos: readonly FlownPhoto[], opts: AnalyseMissionOptions = {}): Promise<AsFlownCheckDocument> {
  const bbox = missionBboxWgs84(mission);
  const header = await readDemHeader(bytes);
  const grid = await readDem(bytes, { window: { bbox, crs: WGS84, marginPx: 2 }, inflate: nodeInflate, maxPixels: MAX_DEM_PIXELS });
  const verticalDatum = analysisDatum(opts.siteVerticalDatum, header.verticalDatum);
  // a solved version flies the solver's lines, not the mission's own layout: match the photos to those (solving is deterministic)
  const plan = (mission as { layoutBy?: string }).layoutBy === 'solver' ? solvedResult(grid, mission, verticalDatum) : undefined;
  return runAsFlownCheck(grid, mission as Record<string, unknown>, photos, { verticalDatum, plan, base64: (b) => Buffer.from(b.buffer, b.byteOffset, b.byteLength).toString('base64') });
}
