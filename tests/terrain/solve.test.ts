import { describe, expect, it } from 'vitest';
import { solvePlan } from '../../terrain/solve';
import { analysePlan } from '../../terrain/plan';
import { syntheticSite } from './coverage-site';

// A 1-inch-type survey camera (13.2 x 8.8 mm, 8.8 mm lens, 5472 x 3648 px), as in the demo mission.
const camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };

function mission(site: ReturnType<typeof syntheticSite>, extra: Record<string, unknown> = {}) {
  const [lon, lat] = site.frame.toLonLat(-260, -260);
  return {
    area: site.area(-230, -230, 230, 230), camera, targetGsdCm: 2.5, takeoff: { lon, lat }, headingDeg: 0, mode: 'follow',
    clearanceM: 30, maxAglM: 120, speedMps: 8, climbMps: 3, descentMps: 2, spec: { maxGsdCm: 2.75, minViews: 2 },
    envelope: { preset: 'multirotor' }, solve: { repairRounds: 2 }, ...extra,
  };
}

describe('solver choices', () => {
  it('slows the legs that climb a steep slope, and only those, within the vertical-speed limits', () => {
    // a 45 m rise over 60 m (gradient 0.75) across every north-south line: at 8 m/s the 3 m/s climb allows 0.375
    const site = syntheticSite(420, 4, (_x, y) => 300 + 45 * Math.min(1, Math.max(0, (y + 30) / 60)));
    const input = mission(site);
    const uniform = analysePlan(site.grid, input);
    const gradientMissM = (lines: typeof uniform.lines) => lines.flatMap((l) => l.unmet).filter((u) => u.reason === 'climb-limit' || u.reason === 'descent-limit').reduce((t, u) => t + u.endM - u.startM, 0) / lines.length;
    expect(gradientMissM(uniform.lines)).toBeGreaterThan(40);
    const r = solvePlan(site.grid, input);
    expect(r.choices.fallback).toBeNull();
    const legs = r.lines.flatMap((l) => l.legs);
    const slow = legs.filter((g) => (g.speedMps ?? 8) < 8 - 1e-9);
    expect(slow.length).toBeGreaterThan(0);
    expect(slow.length).toBeLessThan(legs.length);
    for (const g of legs) {
      const v = g.speedMps!;
      const grad = (g.altitudeEndM - g.altitudeStartM) / (g.end.distanceM - g.start.distanceM);
      // vertical speed = gradient x ground speed, within 3 m/s up and 2 m/s down (legs rounded to the millimetre, speeds to 0.01 m/s)
      expect(grad * v).toBeLessThanOrEqual(3 * 1.01);
      expect(-grad * v).toBeLessThanOrEqual(2 * 1.01);
      if (Math.abs(grad) < 1e-9) expect(v).toBe(8);
    }
    expect(r.choices.lines.some((c) => c.reasons.some((s) => /legs were fitted for [\d.]+ m\/s/.test(s)))).toBe(true);
    // slower legs follow the slope where the mission's speed cannot: far less of each line misses the band for a
    // gradient reason (what is left is the minimum leg length rounding the ramp's corners)
    expect(gradientMissM(r.lines)).toBeLessThan(0.5 * gradientMissM(uniform.lines));
  }, 120_000);

  it('spaces lines closer where the ground between them is higher, and says so', () => {
    // a 60 m high plateau on the east half: lines over it fly at the same height above it, but the ground between a
    // low line and a high one is the plateau's, so that pair sits closer than the pairs on the low ground
    const ground = (x: number) => 300 + 60 / (1 + Math.exp(-(x - 20) / 8));
    const site = syntheticSite(420, 4, (x) => ground(x));
    const r = solvePlan(site.grid, mission(site, { solve: { repairRounds: 0 } }));
    // heading 0: a line's offset is its east coordinate, so the ground under it is ground(offset)
    const rows = r.choices.lines.filter((c) => c.kind === 'line');
    const pairs = rows.slice(0, -1).map((c, k) => ({ s: c.spacingToNextM!, lowLine: ground(c.offsetM), highLine: ground(rows[k + 1].offsetM), groundM: Number(/^ground at ([\d.]+) m above the grid's vertical datum between lines \d+ and \d+/.exec(c.reasons[0])![1]) }));
    // both lines on the low ground, and the pair with one line below the plateau's edge and the other on top
    const low = pairs.filter((p) => p.lowLine < 302 && p.highLine < 302), edge = pairs.filter((p) => p.lowLine < 330 && p.highLine > 330);
    expect(low.length).toBeGreaterThan(0);
    expect(edge.length).toBe(1);
    // the low line flies ~100 m above its own ground, only ~50 m above the plateau: its reason names the plateau
    for (const e of edge) {
      expect(e.groundM).toBeGreaterThan(350);
      for (const l of low) expect(e.s).toBeLessThan(0.7 * l.s);
    }
  }, 120_000);

  it('keeps the round whose lines and spot photos fly fastest: more tightening rounds never give a slower plan', () => {
    // invented rolling hills: lines lowered over short ground cost more than spot photos over a few cells, up to a point
    const site = syntheticSite(420, 4, (x, y) => 300 + 40 * Math.sin(x / 60) * Math.cos(y / 90) + 30 * Math.exp(-((x + 80) ** 2 + (y - 50) ** 2) / 70 ** 2));
    const times: number[] = [];
    for (const repairRounds of [0, 1, 2, 3]) {
      const r = solvePlan(site.grid, mission(site, { solve: { repairRounds } }));
      expect(r.proof.meets).toBe(true);
      times.push(r.summary.flightTimeS);
      // the explanation names the round kept and each round tried, with its time when closed with spot photos
      const kept = /^round (\d+) of (\d+) kept, the fastest that meets the spec/.exec(r.choices.tightening);
      if (repairRounds === 0) expect(r.choices.tightening).toMatch(/no tightening round/);
      else {
        expect(Number(kept![2])).toBe(repairRounds);
        const closed = [...r.choices.tightening.matchAll(/round (\d+): lines \d+ s leaving \d+ cells? short, with \d+ spot photos?: (\d+) s/g)].map((m) => ({ round: Number(m[1]), s: Number(m[2]) }));
        expect(closed.find((c) => c.round === Number(kept![1]))!.s).toBeCloseTo(r.summary.flightTimeS, -1);
        for (const c of closed) expect(r.summary.flightTimeS).toBeLessThanOrEqual(c.s + 0.5);
      }
    }
    for (let k = 1; k < times.length; k++) expect(times[k]).toBeLessThanOrEqual(times[k - 1] + 0.05);
    // and here the rounds pay: three rounds fly at least a fifth faster than none
    expect(times[3]).toBeLessThan(0.8 * times[0]);
  }, 120_000);
});
