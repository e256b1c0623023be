import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { openDem } from '../../terrain/dem';
import { WGS84 } from '../../terrain/crs';
import { missionBboxWgs84 } from '../../terrain/plan';
import { solvePlan, type SolvedPlan } from '../../terrain/solve';
import { cutLine, legsTimeS } from '../../terrain/solve-cut';
import { legSpeedMps } from '../../terrain/solve-speed';
import { nodeInflate } from '../../cli/io';

const DEM = 'datasets/harrow-fell-dem.tif';
const base = JSON.parse(readFileSync('datasets/example-mission.json', 'utf8'));

async function demoGrid(input: Record<string, unknown>) {
  const dem = await openDem(new Uint8Array(readFileSync(DEM)), { inflate: nodeInflate });
  return dem.read({ window: { bbox: missionBboxWgs84(input), crs: WGS84, marginPx: 2 } });
}

/**
 * The highest ground GDAL reads around a WGS 84 point: `gdallocationinfo -valonly -wgs84` (GDAL 3.6.2, Debian
 * gdal-bin) at the point and half a pixel (1 m) either way east and north, so the pixel the point falls in and its
 * neighbours towards each side are all counted.
 */
function gdalGroundAround(points: Array<[number, number]>): number[] {
  const d = 1 / 111_320, de = d / Math.cos((46.77 * Math.PI) / 180);
  const q: string[] = [];
  for (const [lon, lat] of points) for (const [a, b] of [[0, 0], [de, 0], [-de, 0], [0, d], [0, -d]]) q.push(`${lon + a} ${lat + b}`);
  const out = execFileSync('gdallocationinfo', ['-valonly', '-wgs84', DEM], { input: q.join('\n'), encoding: 'utf8' }).trim().split('\n').map(Number);
  return points.map((_, i) => Math.max(...out.slice(i * 5, i * 5 + 5)));
}

/** Pairs of consecutive plan lines that are two parts of one line cut at a face (by their reasons). */
function cutsOf(r: SolvedPlan) {
  const out: Array<{ a: SolvedPlan['lines'][number]; b: SolvedPlan['lines'][number]; reason: string }> = [];
  r.choices.lines.forEach((c, i) => {
    const reason = c.reasons.find((s) => s.startsWith('part ') && s.includes('; it ends'));
    if (reason) out.push({ a: r.lines[i], b: r.lines[i + 1], reason });
  });
  return out;
}

describe('cutting a line at a face', () => {
  it('cuts the demo lines at quarry faces where that is quicker, and every cut keeps the clearance by GDAL\'s own reading of the grid (never for a fixed wing)', async () => {
    const input = { ...base, envelope: { preset: 'multirotor' } };
    const grid = await demoGrid(input);
    const cut = solvePlan(grid, input);
    const whole = solvePlan(grid, { ...input, solve: { cutAtFaces: false } });
    const cuts = cutsOf(cut);
    expect(cuts.length).toBeGreaterThan(0);
    expect(cutsOf(whole).length).toBe(0);
    // an aircraft that crabs (a fixed wing) cannot stop to climb: its lines are never cut
    expect(cutsOf(solvePlan(grid, { ...input, envelope: { preset: 'fixed-wing', windMps: 0, airspeedMps: 16 } })).length).toBe(0);
    // both meet the spec on every reachable cell; the cut plan in less time
    expect(cut.proof.meets).toBe(true);
    expect(whole.proof.meets).toBe(true);
    expect(cut.summary.flightTimeS).toBeLessThan(whole.summary.flightTimeS);
    const clearance = base.clearanceM + base.obstacleAllowanceM;
    for (const { a, b, reason } of cuts) {
      // the next part is flown straight after (no spot tour between), starting a few metres on, past the face
      const m = /a face rising from ([\d.]+) to ([\d.]+) m above the grid's vertical datum over ([\d.]+) m/.exec(reason);
      expect(m, reason).not.toBeNull();
      const [foot, top, across] = [Number(m![1]), Number(m![2]), Number(m![3])];
      expect(top - foot).toBeGreaterThan(20);
      const endAlt = a.legs[a.legs.length - 1].altitudeEndM, startAlt = b.legs[0].altitudeStartM;
      expect(startAlt).toBeGreaterThan(endAlt);
      // the crossing is flown at the higher altitude (climb first): it clears the face's ground, read by GDAL at
      // 1 m steps from the end of one part to the start of the next, by the clearance; both ends clear theirs
      const steps = Math.max(2, Math.ceil(across));
      const pts: Array<[number, number]> = [];
      for (let k = 0; k <= steps; k++) pts.push([a.end.lon + ((b.start.lon - a.end.lon) * k) / steps, a.end.lat + ((b.start.lat - a.end.lat) * k) / steps]);
      const ground = gdalGroundAround(pts);
      // 0.5 m for the altitude rounding and the step between GDAL's pixel and the plan's bilinear samples on a 1:1 slope
      for (const g of ground) expect(startAlt - g).toBeGreaterThanOrEqual(clearance - 0.5);
      expect(endAlt - gdalGroundAround([[a.end.lon, a.end.lat]])[0]).toBeGreaterThanOrEqual(clearance - 0.5 - 2);
    }
    // every leg within the vertical-speed limits at its own speed
    for (const l of cut.lines) for (const g of l.legs) {
      const grad = (g.altitudeEndM - g.altitudeStartM) / (g.end.distanceM - g.start.distanceM);
      expect(grad * g.speedMps!).toBeLessThanOrEqual(base.climbMps * 1.01);
      expect(-grad * g.speedMps!).toBeLessThanOrEqual(base.descentMps * 1.01);
    }
  }, 180_000);

  it('cuts a line into the part before a stretch and the part after it, with the stations either side', () => {
    const l = { index: 0, headingDeg: 0, offsetM: 5, start: [5, -100] as [number, number], end: [5, 100] as [number, number], lengthM: 200, areaStartM: 20, areaEndM: 180, stationsM: Float64Array.of(20, 60, 100, 140, 180) };
    const [a, b] = cutLine(l, 80, 90);
    expect(a.end).toEqual([5, -20]);
    expect(b.start).toEqual([5, -10]);
    expect([a.lengthM, b.lengthM]).toEqual([80, 110]);
    expect([a.areaStartM, a.areaEndM, b.areaStartM, b.areaEndM]).toEqual([20, 80, 0, 90]);
    expect(Array.from(a.stationsM)).toEqual([20, 60]);
    expect(Array.from(b.stationsM)).toEqual([10, 50, 90]);
  });

  it('times legs at the speed their gradient allows (time = distance / speed, the vertical limit binding on steep legs)', () => {
    const m = { speedMps: 8, climbMps: 3, descentMps: 2 };
    // 100 m level at 8 m/s, 30 m rising 0.75 (3 m/s up allows 4 m/s), 40 m dropping 0.5 (2 m/s down allows 4 m/s)
    const fit = { legs: [{ startM: 0, endM: 100, gradient: 0 }, { startM: 100, endM: 130, gradient: 0.75 }, { startM: 130, endM: 170, gradient: -0.5 }] } as never;
    expect(legsTimeS(fit, m)).toBeCloseTo(100 / 8 + 30 / 4 + 40 / 4, 9);
    expect(legSpeedMps(m, 0.75)).toBe(4);
  });
});
