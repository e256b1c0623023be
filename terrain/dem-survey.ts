/**
 * An uploaded grid surveyed band by band: its metadata (size, bounds, height statistics, nodata share) and its
 * hillshade preview, reading one band of rows at a time through the grid's range source. Memory holds one band and
 * the small preview's sums, never the whole grid, whatever its size; the figures are those of reading it whole
 * (the statistics and the preview's box sums are taken in the same row-major order).
 */
import type { Grid } from './grid';
import { TerrainError } from './errors';
import { openDem, type ByteRangeSource, type InflateFn } from './dem';
import { gridMetadata, HeightStats, type GridMetadata } from './metadata';
import { hillshadeOfOverview, Overview, overviewFactor, type Hillshade, type HillshadeOptions } from './hillshade';

interface SurveyDemOptions extends HillshadeOptions {
  inflate?: InflateFn;
  /** About how many pixels one band holds (default 2^22 = 16 MiB of Float32); whole blocks of rows at least. */
  bandPixels?: number;
}

interface DemSurvey {
  metadata: GridMetadata;
  hillshade: Hillshade;
}

/** Survey a whole GeoTIFF DEM band by band (bytes in memory or a range source: a file handle, ranged GETs). */
export async function surveyDem(input: ArrayBuffer | Uint8Array | ByteRangeSource, opts: SurveyDemOptions = {}): Promise<DemSurvey> {
  const src = await openDem(input, { inflate: opts.inflate, cacheBytes: 0 });
  const { width, height } = src.header;
  const k = overviewFactor(width, height, opts);
  const overview = new Overview(width, height, k);
  const stats = new HeightStats();
  // whole blocks of rows per band, so no block is decoded twice
  const bh = Math.max(1, src.header.tiling.blockHeight);
  const rowsPerBand = Math.min(height, Math.max(1, Math.floor((opts.bandPixels ?? 2 ** 22) / (width * bh))) * bh);
  const band = new Float32Array(width * rowsPerBand);
  let first: Grid | null = null;
  for (let r0 = 0; r0 < height; r0 += rowsPerBand) {
    const r1 = Math.min(height, r0 + rowsPerBand);
    const g = await src.read({ pixelWindow: [0, r0, width, r1], into: band.subarray(0, width * (r1 - r0)), allowAllNodata: true });
    first ??= g; // the band at row 0 has the grid's own transform
    stats.add(g.data);
    overview.addRows(g.data, r0);
  }
  if (!first || stats.known === 0) {
    throw new TerrainError('all-nodata', 'The grid holds only nodata, so there is no terrain to plan over; check the nodata value or choose an area the DEM covers.');
  }
  const facts = { width, height, transform: first.transform, crs: first.crs, sourceVerticalUnit: first.sourceVerticalUnit };
  return { metadata: gridMetadata(facts, stats), hillshade: hillshadeOfOverview(facts, k, overview.w, overview.h, overview.heights(), opts) };
}
