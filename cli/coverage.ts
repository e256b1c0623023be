/** `terrain coverage DEM.tif --mission mission.json --out coverage.tif [--cell-m N]`: the coverage raster of the plan over every ground cell, as a GeoTIFF and a compliance document. */
import { writeFile } from 'node:fs/promises';
import { openDem } from '../terrain/dem';
import { WGS84, createTransform } from '../terrain/crs';
import { analysePlan, missionBboxWgs84 } from '../terrain/plan';
import { resolveMission } from '../terrain/mission';
import { coverageFrame, planPhotos } from '../terrain/coverage-photos';
import { computeCoverage } from '../terrain/coverage';
import { coverageLayout, gridCellM } from '../terrain/coverage-grid';
import { coverageCompliance, resolveCoverageInput } from '../terrain/coverage-spec';
import { coverageBandNames, coverageGeoTiff, COVERAGE_NODATA } from '../terrain/coverage-raster-file';
import { generalCautions } from '../contracts/cautions';
import { CliError, nodeInflate, parseCommandArgs, readFileBytes } from './io';
import { readMission } from './plan';

export const usage = 'usage: npm run -s terrain -- coverage DEM.tif --mission mission.json --out coverage.tif [--cell-m N]';

const round = (v: number, d: number) => { const f = 10 ** d; return Math.round(v * f) / f; };

/** Cells meeting a figure, for the summary: min/median/max of a band over the area's cells with a value. */
function spread(band: ArrayLike<number>, inside: Uint8Array, digits: number): { min: number | null; median: number | null; max: number | null } {
  let n = 0;
  for (let i = 0; i < band.length; i++) if (inside[i] && band[i] === band[i]) n++;
  if (n === 0) return { min: null, median: null, max: null };
  const s = new Float32Array(n);
  n = 0;
  for (let i = 0; i < band.length; i++) if (inside[i] && band[i] === band[i]) s[n++] = band[i];
  s.sort();
  return { min: round(s[0], digits), median: round(s[s.length >> 1], digits), max: round(s[s.length - 1], digits) };
}

/** The compliance document; the raster goes to --out. */
export async function run(args: string[]): Promise<unknown> {
  const { values, positionals } = parseCommandArgs(args, { mission: { type: 'string' }, out: { type: 'string' }, 'cell-m': { type: 'string' } });
  if (positionals.length !== 1) throw new CliError(`coverage takes one DEM file, got ${positionals.length} arguments. ${usage}`);
  if (!values.mission) throw new CliError(`coverage needs --mission mission.json. ${usage}`);
  if (!values.out) throw new CliError(`coverage needs --out coverage.tif for the raster. ${usage}`);
  let cellArg: number | null = null;
  if (values['cell-m'] !== undefined) {
    cellArg = Number(values['cell-m']);
    if (!(Number.isFinite(cellArg) && cellArg >= 0.1 && cellArg <= 100)) throw new CliError(`--cell-m must be a number of metres from 0.1 to 100, got "${values['cell-m']}".`);
  }
  const input = await readMission(values.mission);
  const bbox = missionBboxWgs84(input); // checks the mission before the DEM is decoded
  const mission = resolveMission(input);
  const { spec, envelope, settings } = resolveCoverageInput(input, mission);
  const dem = await openDem(await readFileBytes(positionals[0]), { inflate: nodeInflate });
  const grid = await dem.read({ window: { bbox, crs: WGS84, marginPx: 2 } });
  if (grid.crs.epsg === null) throw new CliError(`The grid's CRS (${grid.crs.name}) has no EPSG code, so the coverage raster cannot name it; reproject the grid to an EPSG CRS (gdalwarp -t_srs EPSG:…).`, 1);
  const ring = mission.area.coordinates[0];
  const meanLat = ring.slice(0, -1).reduce((t, p) => t + p[1], 0) / (ring.length - 1);
  const cellM = cellArg ?? settings.cellM ?? gridCellM(grid, meanLat);
  coverageLayout(grid, mission.area, cellM, settings.maxCells); // refuses an oversized raster before the plan is analysed
  const t0 = performance.now();
  const plan = analysePlan(grid, input, { verticalDatum: dem.header.verticalDatum });
  const t1 = performance.now();
  const frame = coverageFrame(mission.area);
  const { photos, lines: crabLines } = planPhotos(plan, frame, envelope);
  const crabs = crabLines.map((l) => ({ ...l, crabDeg: round(l.crabDeg, 3) }));
  const raster = computeCoverage(grid, frame, mission.area, mission.camera, photos, {
    cellM, maxCells: settings.maxCells, specGsdCm: spec.maxGsdCm, imageErrorPx: settings.imageErrorPx, envelope, occlusion: settings.occlusion,
  });
  const t2 = performance.now();
  const comp = coverageCompliance(raster, spec);
  const bytes = coverageGeoTiff(raster);
  try {
    await writeFile(values.out, bytes);
  } catch (err) {
    throw new CliError(`Cannot write the coverage raster to "${values.out}": ${(err as Error).message}.`, 1);
  }
  const toLonLat = createTransform(grid.crs, WGS84);
  const inside = raster.cells.inside;
  let plannedMeet = 0;
  for (let i = 0; i < inside.length; i++) if (inside[i] && raster.viewsPlanned[i] >= spec.minViews) plannedMeet++;
  const { cells } = raster;
  return {
    raster: {
      path: values.out, width: cells.width, height: cells.height, cellM: round(cells.cellM, 4), cellAreaM2: round(cells.cellAreaM2, 4),
      crs: { epsg: grid.crs.epsg, name: grid.crs.name }, geotransform: [...cells.transform], nodata: COVERAGE_NODATA,
      bands: coverageBandNames(raster), noValue: 'NaN inside the area where a measure has no value (no view, or fewer than 2 views for angles and σ)',
    },
    spec: { ...spec, basis: raster.guaranteed ? 'guaranteed: a view counts only if the point stays in the image at every attitude of the envelope' : 'as planned (no attitude envelope in the mission)' },
    envelope: envelope ? { ...envelope, marginPx: round(raster.envelopeMarginPx, 2), lines: crabs } : null,
    compliance: {
      cellsInArea: comp.cellsInArea,
      areaM2: round(comp.areaM2, 1),
      items: comp.items.map((it) => ({ ...it, share: round(it.share, 6), failingAreaM2: round(it.failingAreaM2, 1) })),
      shareAll: round(comp.shareAll, 6),
      plannedShareMinViews: comp.cellsInArea ? round(plannedMeet / comp.cellsInArea, 6) : 0,
    },
    patchCount: comp.patches.length,
    patches: comp.patches.slice(0, 100).map((p) => {
      const [lon, lat] = toLonLat.forward(p.centroidX, p.centroidY);
      return { reason: p.reason, message: p.message, cells: p.cells, areaM2: round(p.areaM2, 1), centroid: { lon: round(lon, 7), lat: round(lat, 7) }, worst: p.worst === null ? null : round(p.worst, 4) };
    }),
    summary: {
      photoCount: photos.length,
      views: spread(raster.views, inside, 0),
      viewsPlanned: spread(raster.viewsPlanned, inside, 0),
      finestGsdCm: spread(raster.finestGsdCm, inside, 4),
      maxRayAngleDeg: spread(raster.maxRayAngleDeg, inside, 3),
      sigmaVerticalM: spread(raster.sigmaVerticalM, inside, 4),
      sigmaHorizontalM: spread(raster.sigmaHorizontalM, inside, 4),
    },
    precision: `Predicted σ is advisory: a least-squares intersection of the viewing rays with an image measurement error of ${raster.imageErrorPx} px, camera poses taken as exact; real accuracy depends on ground control, calibration and matching and is proven with check points.`,
    timingMs: { plan: round(t1 - t0, 1), coverage: round(t2 - t1, 1) },
    cautions: [...generalCautions],
  };
}
