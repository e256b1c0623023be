/**
 * The coverage figures of `npm run bench` (also runnable alone: `tsx bench/coverage-bench.ts`): the demo plan's
 * coverage raster at 1 m cells against GDAL's `gdal_rasterize -add` of the same ray-cast footprints, rounds
 * interleaved after one untimed warm-up round of each, medians reported. Both sides write their raster to a file
 * (Loftline in parts, as the command line does); GDAL's time includes its process start and reading the
 * footprints' GeoJSON.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { openDem } from '../terrain/dem';
import { WGS84 } from '../terrain/crs';
import { analysePlan, missionBboxWgs84 } from '../terrain/plan';
import { resolveMission } from '../terrain/mission';
import { computeCoverage, type CoverageRaster } from '../terrain/coverage';
import { coverageFrame, planPhotos } from '../terrain/coverage-photos';
import { coverageGeoTiffParts } from '../terrain/coverage-raster-file';
import { cameraToLocal, castPixel } from '../terrain/footprint';
import { localHeights } from '../terrain/local-frame';
import { nodeInflate, writeFilePartsSync } from '../cli/io';
import { runAsMain } from './run-as-main';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Coverage timings and ratios; prints its table rows and returns the `ratio` lines. */
export async function benchCoverage(rounds = 5): Promise<string[]> {
  const out = here('./out/');
  mkdirSync(out, { recursive: true });
  const input = JSON.parse(readFileSync(here('../datasets/example-mission.json'), 'utf8'));
  const mission = resolveMission(input);
  const dem = await openDem(new Uint8Array(readFileSync(here('../datasets/harrow-fell-dem.tif'))), { inflate: nodeInflate });
  const grid = await dem.read({ window: { bbox: missionBboxWgs84(input), crs: WGS84, marginPx: 2 } });
  const plan = analysePlan(grid, input);
  const frame = coverageFrame(mission.area);
  const { photos } = planPhotos(plan, frame, null);
  const cellM = 1;
  const opts = { cellM, specGsdCm: mission.targetGsdCm * (1 + mission.gsdTolerance) };
  // the footprints GDAL burns: 32 rays per image edge cast onto the same grid, in the grid's CRS
  const { heightAt } = localHeights(grid, frame);
  const W = mission.camera.imageWidthPx, H = mission.camera.imageHeightPx, N = 32;
  const features = photos.map((p, i) => {
    const rot = cameraToLocal(mission.camera, p);
    const ring: number[][] = [];
    const border: number[][] = [];
    for (let k = 0; k < N; k++) border.push([(W * k) / N, 0]);
    for (let k = 0; k < N; k++) border.push([W, (H * k) / N]);
    for (let k = 0; k < N; k++) border.push([W - (W * k) / N, H]);
    for (let k = 0; k < N; k++) border.push([0, H - (H * k) / N]);
    for (const [u, v] of border) {
      const g = castPixel(mission.camera, p, rot, u, v, heightAt);
      if (g) ring.push([frame.originE + g[0] * frame.scale, frame.originN + g[1] * frame.scale]);
    }
    ring.push(ring[0]);
    return { type: 'Feature', properties: { photo: i + 1 }, geometry: { type: 'Polygon', coordinates: [ring] } };
  });
  const geojson = `${out}coverage-footprints.geojson`;
  writeFileSync(geojson, JSON.stringify({ type: 'FeatureCollection', crs: { type: 'name', properties: { name: `EPSG:${grid.crs.epsg}` } }, features }));
  const views: number[] = [], full: number[] = [], gdal: number[] = [];
  let held = 0, rasterBytes = 0, last: CoverageRaster | null = null;
  // round 0 is a warm-up, not timed: the engine compiles its hot loops on first use and the process touches its
  // memory pages for the first time, which a long-lived analysis worker has done long before; GDAL runs once too
  // (its files then in the page cache, as ours are)
  for (let r = -1; r < rounds; r++) {
    const timed = r >= 0;
    let t = performance.now();
    const v = computeCoverage(grid, frame, mission.area, mission.camera, photos, { ...opts, viewsOnly: true });
    writeFilePartsSync(`${out}coverage-views.tif`, coverageGeoTiffParts(v));
    if (timed) views.push(performance.now() - t);
    t = performance.now();
    const c = computeCoverage(grid, frame, mission.area, mission.camera, photos, opts);
    writeFilePartsSync(`${out}coverage-full.tif`, coverageGeoTiffParts(c));
    if (timed) full.push(performance.now() - t);
    const tt = c.cells.transform;
    const te = [tt[0], tt[3] + c.cells.height * tt[5], tt[0] + c.cells.width * tt[1], tt[3]].map(String);
    t = performance.now();
    execFileSync('gdal_rasterize', ['-q', '-burn', '1', '-add', '-init', '0', '-ot', 'Float32', '-te', ...te, '-tr', String(tt[1]), String(-tt[5]), geojson, `${out}coverage-gdal.tif`]);
    if (timed) gdal.push(performance.now() - t);
    last = c;
  }
  if (last) {
    const c = last;
    // what the finished raster holds (cell positions, heights, mask, counts and figures) against the five Float32 bands it writes
    held = c.cells.nodes.x.byteLength + c.cells.nodes.y.byteLength + c.cells.z.byteLength + c.cells.inside.byteLength
      + [c.views, c.viewsPlanned, c.finestGsdCm, c.viewsAtSpecGsd, c.maxRayAngleDeg, c.sigmaVerticalM, c.sigmaHorizontalM].reduce((s, b) => s + b.byteLength, 0);
    rasterBytes = 5 * 4 * c.cells.width * c.cells.height;
  }
  const cells = last ? `${last.cells.width} x ${last.cells.height} cells, ${last.cells.insideCount} in the area` : '';
  const f = (ms: number) => `${(ms / 1000).toFixed(2)} s`;
  console.log(`| coverage view counts, demo plan (${photos.length} photos) at 1 m (${cells}) | ${f(median(views))} | ${f(median(gdal))} (gdal_rasterize -add) | ${(median(views) / median(gdal)).toFixed(2)} |`);
  console.log(`| coverage with occlusion, GSD, ray angles and σ | ${f(median(full))} | ${f(median(gdal))} | ${(median(full) / median(gdal)).toFixed(2)} |`);
  console.log(`| coverage memory held (positions, mask, three count and four figure bands) | ${(held / 2 ** 20).toFixed(0)} MiB | ${(rasterBytes / 2 ** 20).toFixed(0)} MiB (five Float32 bands) | ${(held / rasterBytes).toFixed(2)} |`);
  return [
    `ratio coverage-views-vs-gdal-rasterize = ${(median(views) / median(gdal)).toFixed(2)} (target 1.0)`,
    `ratio coverage-full-vs-gdal-rasterize = ${(median(full) / median(gdal)).toFixed(2)} (target 3.0)`,
    `ratio coverage-memory-vs-raster = ${(held / rasterBytes).toFixed(2)} (target 1.5)`,
  ];
}

if (runAsMain('coverage-bench')) {
  benchCoverage(Number(process.env.BENCH_ROUNDS ?? 5)).then((lines) => { for (const l of lines) console.log(l); }).catch((err) => {
    console.error(`coverage bench failed: ${err instanceof Error ? err.stack : err}`);
    process.exitCode = 1;
  });
}
