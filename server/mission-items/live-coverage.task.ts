/**
 * The live coverage analysis of one version (runs on a terrain thread): the recorded photos as flown against the
 * stored plan (`analyseAsFlown`, as the `terrain as-flown` command runs it), and the ground already passed.
 */
import { analyseAsFlown, maskPatches } from '../../terrain/as-flown';
import { computeCoverage } from '../../terrain/coverage';
import { cellX, cellY, coverageLayout, gridCellM } from '../../terrain/coverage-grid';
import { planPhotos } from '../../terrain/coverage-photos';
import { cellMeetsSpec, resolveCoverageInput, specRasterOptions } from '../../terrain/coverage-spec';
import { coverageLayers, maskPng } from '../../terrain/coverage-layer';
import type { FlownPhoto } from '../../terrain/as-flown-match';
import { missionBboxWgs84, readDem, WGS84, type PlanResult } from '../../terrain/index';
import { resolveMission } from '../../terrain/mission';
import type { LiveCoverage } from '../../contracts/live-coverage';
import type { InflateFn } from '../../terrain/index';

const round = (v: number, d: number) => { const f = 10 ** d; return Math.round(v * f) / f; };

/** What the analysis gives (without the version id, cautions and time, which the server adds). */
export type LiveAnalysis = Omit<LiveCoverage, 'versionId' | 'cautions' | 'computedAt' | 'heights' | 'state' | 'reason'>;

/**
 * Photos as flown over the DEM window the mission needs; the raster cell as the mission's coverage settings say,
 * else the grid's own (the `as-flown` command's choice). "Passed" ground: the cells that the planned stations up to
 * the furthest station a photo matched (flying order) make meet the spec; short ones are those the photos leave short.
 */
export async function analyseLiveCoverage(bytes: Uint8Array, input: unknown, plan: PlanResult, photos: FlownPhoto[], inflate: InflateFn): Promise<LiveAnalysis> {
  const bbox = missionBboxWgs84(input);
  const mission = resolveMission(input);
  const { spec, settings } = resolveCoverageInput(input, mission);
  const grid = await readDem(bytes, { window: { bbox, crs: WGS84, marginPx: 2 }, inflate });
  const ring = mission.area.coordinates[0];
  const meanLat = ring.slice(0, -1).reduce((t, p) => t + p[1], 0) / (ring.length - 1);
  const cellM = settings.cellM ?? gridCellM(grid, meanLat);
  coverageLayout(grid, mission.area, cellM, settings.maxCells);
  const rasterSettings = { cellM, maxCells: settings.maxCells, imageErrorPx: settings.imageErrorPx, occlusion: settings.occlusion };
  const a = analyseAsFlown(grid, mission, plan, photos, spec, rasterSettings);
  const m = a.match;
  let progress: { line: number; station: number } | null = null;
  for (const p of m.matched) if (!progress || p.line > progress.line || (p.line === progress.line && p.station > progress.station)) progress = { line: p.line, station: p.station };
  const upTo = (line: number, station: number) => progress !== null && (line < progress.line || (line === progress.line && station <= progress.station));
  // the planned stations up to the progress, in flying order (plan lines are in flying order, stations along each)
  const soFarPlan: PlanResult = { ...plan, lines: plan.lines.map((l, li) => ({ ...l, stations: l.stations.filter((_, si) => upTo(li + 1, si + 1)) })) };
  const opts = { cellM, maxCells: settings.maxCells, ...specRasterOptions(spec), imageErrorPx: settings.imageErrorPx, envelope: null, occlusion: settings.occlusion };
  const soFar = computeCoverage(grid, a.frame, mission.area, mission.camera, planPhotos(soFarPlan, a.frame, null).photos, opts);
  const { cells } = a.flown;
  const total = cells.width * cells.height;
  const short = new Uint8Array(total);
  let passedCells = 0, shortCells = 0;
  for (let i = 0; i < total; i++) {
    if (!cells.inside[i] || !cellMeetsSpec(soFar, spec, i)) continue;
    passedCells++;
    if (!cellMeetsSpec(a.flown, spec, i)) { short[i] = 1; shortCells++; }
  }
  const patches = maskPatches(short, cells.width, cells.height).sort((p, q) => q.length - p.length).slice(0, 50).map((p) => {
    let sx = 0, sy = 0;
    for (const i of p) { sx += cellX(cells, i); sy += cellY(cells, i); }
    const [lon, lat] = a.frame.toLonLat(sx / p.length, sy / p.length);
    return { cells: p.length, areaM2: round(p.length * cells.cellAreaM2, 1), centroid: { lon: round(lon, 7), lat: round(lat, 7) } };
  });
  const views = coverageLayers(a.flown, spec).layers.find((l) => l.measure === 'views')!;
  const b64 = (png: Uint8Array) => Buffer.from(png.buffer, png.byteOffset, png.byteLength).toString('base64');
  return {
    photoCount: photos.length,
    matched: m.matched.length,
    extra: m.extra.length,
    missedSoFar: m.missed.filter((s) => upTo(s.line, s.station)).length,
    progress,
    raster: { width: cells.width, height: cells.height, cellM: round(cells.cellM, 4) },
    spec: { maxGsdCm: spec.maxGsdCm, minViews: spec.minViews },
    flown: { shareAll: round(a.compliance.flown.shareAll, 6), items: a.compliance.flown.items.map((it) => ({ item: it.item, asks: it.asks, share: round(it.share, 6) })) },
    map: { geotransform: [...cells.transform], width: cells.width, height: cells.height, viewsPngBase64: b64(views.png), viewsMax: views.max, shortPngBase64: b64(maskPng(cells.width, cells.height, short)) },
    passed: { cells: passedCells, areaM2: round(passedCells * cells.cellAreaM2, 1), shortCells, shortAreaM2: round(shortCells * cells.cellAreaM2, 1), patches },
  };
}
