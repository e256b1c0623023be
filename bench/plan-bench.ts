/** The `plan` figure of the benchmark: a 2 km2 survey at 2 cm GSD over a small part of the big grid, window decode included. */
import { openDem, type DemHeader } from '../terrain/dem';
import { WGS84, createTransform } from '../terrain/crs';
import type { InflateFn } from '../terrain/dem';

/** Seconds for one plan (median of `rounds`), with the share of grid tiles the plan decoded. */
export async function benchPlan(bytes: Uint8Array, header: DemHeader, inflate: InflateFn, rounds = 3): Promise<{ seconds: number | null; note: string }> {
  let plan: typeof import('../terrain/plan');
  try {
    plan = await import('../terrain/plan');
  } catch (err) {
    return { seconds: null, note: `TODO: terrain/plan.ts not usable yet (${(err as Error).message.split('\n')[0]})` };
  }
  // a 1414 m square (2 km2) centred in the grid, in WGS 84
  const t = header.transform;
  const cx = t[0] + (header.width / 2) * t[1], cy = t[3] + (header.height / 2) * t[5];
  const toLonLat = createTransform(header.crs, WGS84);
  const h = 707.1;
  const ring = [[cx - h, cy - h], [cx + h, cy - h], [cx + h, cy + h], [cx - h, cy + h], [cx - h, cy - h]].map(([x, y]) => toLonLat.forward(x, y));
  const [tLon, tLat] = toLonLat.forward(cx, cy);
  const mission = {
    area: { type: 'Polygon', coordinates: [ring] },
    camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
    targetGsdCm: 2.0, gsdTolerance: 0.1, forwardOverlap: 0.8, sideOverlap: 0.7, headingDeg: 90, mode: 'follow',
    clearanceM: 30, obstacleAllowanceM: 0, maxAglM: 120, speedMps: 10, climbMps: 3, descentMps: 2,
    takeoff: { lon: tLon, lat: tLat },
  };
  const times: number[] = [];
  let note = '';
  for (let r = 0; r < rounds; r++) {
    const t0 = performance.now();
    const dem = await openDem(bytes, { inflate, cacheBytes: 0 });
    const grid = await dem.read({ window: { bbox: plan.missionBboxWgs84(mission), crs: WGS84, marginPx: 2 } });
    const result = plan.analysePlan(grid, mission);
    times.push((performance.now() - t0) / 1000);
    const tiles = header.tiling.blocksAcross * header.tiling.blocksDown;
    const stations = result.lines.reduce((n, l) => n + l.stations.length, 0);
    note = `${result.lines.length} lines, ${stations} stations; decoded ${dem.stats.blocksDecoded} of ${tiles} tiles`;
  }
  return { seconds: [...times].sort((a, b) => a - b)[Math.floor(times.length / 2)], note };
}
