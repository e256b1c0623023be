import { describe, expect, it } from 'vitest';
import { solvePlan } from '../../terrain/solve';
import { resolveMission } from '../../terrain/mission';
import { resolveCoverageInput, specRasterOptions } from '../../terrain/coverage-spec';
import { computeCoverage } from '../../terrain/coverage';
import { coverageFrame, planPhotos } from '../../terrain/coverage-photos';
import { syntheticSite } from './coverage-site';
import { localFrameFor } from '../../terrain/local-frame';
import { cellX, cellY } from '../../terrain/coverage-grid';
import { analysePlan } from '../../terrain/plan';
import { planFlightLines, polygonToLocal } from '../../terrain/lines';
import { pixelPitchMm } from '../../terrain/camera';

// ground further than this inside the boundary has lines on every side (the lattice's spacing and height here)
const INNER_M = 60;

// A 1-inch-type survey camera (13.2 x 8.8 mm, 8.8 mm lens, 5472 x 3648 px), as in the demo mission.
const camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };

// rolling invented ground: a hill and a long swell, no faces
const site = syntheticSite(330, 4, (x, y) => 200 + 0.05 * y + 35 * Math.exp(-((x - 60) ** 2 + (y + 40) ** 2) / 110 ** 2) + 10 * Math.sin(x / 80) * Math.cos(y / 110));
const area = site.area(-160, -160, 160, 160);
const [lon, lat] = site.frame.toLonLat(-190, -190);
const base = {
  area, camera, targetGsdCm: 2.5, takeoff: { lon, lat }, headingDeg: 20, mode: 'follow',
  clearanceM: 30, obstacleAllowanceM: 0, maxAglM: 120, speedMps: 8, climbMps: 3, descentMps: 2,
  envelope: { preset: 'multirotor' },
  // views from all round: seen at least 15° from the vertical from sides no more than 120° apart
  spec: { maxGsdCm: 2.75, minViews: 4, maxDirectionGapDeg: 120, obliqueDeg: 15 },
  solve: { headingCandidates: 1, repairRounds: 2, spotRounds: 0 },
};

const norm180 = (d: number) => ((d % 180) + 180) % 180;

/** The plan's own raster recomputed here: the share of cells whose oblique views leave no gap over the spec's. */
function directionsShare(input: Record<string, unknown>, plan: Parameters<typeof planPhotos>[0]) {
  const mission = resolveMission(input);
  const { spec, envelope } = resolveCoverageInput(input, mission);
  const frame = coverageFrame(mission.area);
  const raster = computeCoverage(site.grid, frame, mission.area, camera, planPhotos(plan, frame, envelope).photos, { cellM: 4, envelope, ...specRasterOptions(spec) });
  let n = 0, ok = 0, gsdOk = 0, innerN = 0, innerOk = 0;
  for (let i = 0; i < raster.cells.inside.length; i++) {
    if (!raster.cells.inside[i]) continue;
    n++;
    const [x, y] = [cellX(raster.cells, i), cellY(raster.cells, i)];
    const [lo, la] = frame.toLonLat(x, y);
    const [sx, sy] = site.frame.toLocal(lo, la);
    const edge = 160 - Math.max(Math.abs(sx), Math.abs(sy));
    if (edge > INNER_M) { innerN++; if (raster.directionGapDeg![i] <= 120) innerOk++; }
    if (raster.directionGapDeg![i] <= 120) ok++;
    if (raster.finestGsdCm[i] <= 2.75 && raster.views[i] >= 4) gsdOk++;
  }
  return { share: ok / n, gsdShare: gsdOk / n, inner: innerOk / innerN };
}

describe('lattice: a second set of lines across the first when the spec asks for views from all round', () => {
  const lattice = solvePlan(site.grid, base);
  const furrow = solvePlan(site.grid, { ...base, solve: { ...base.solve, pattern: 'furrow' } });
  const beyondInput = { ...base, solve: { ...base.solve, beyondEdgeM: 30 } };
  const beyond = solvePlan(site.grid, beyondInput);

  it('is chosen by the spec, and lays two sets of lines a quarter turn apart', () => {
    expect(lattice.pattern).toBe('lattice');
    expect(lattice.choices.pattern).toMatch(/^lattice: .*20° and 110°/);
    expect(furrow.pattern).toBe('furrow');
    const lines = lattice.choices.lines.filter((c) => c.kind === 'line');
    const first = lines.filter((c) => c.set === 1), second = lines.filter((c) => c.set === 2);
    expect(first.length).toBeGreaterThan(2);
    expect(second.length).toBeGreaterThan(2);
    // each plan line's own heading (either way along its set)
    for (const c of first) expect(norm180(lattice.lines[c.line - 1].headingDeg)).toBeCloseTo(20, 6);
    for (const c of second) expect(norm180(lattice.lines[c.line - 1].headingDeg)).toBeCloseTo(110, 6);
    // the second set is flown after the first, starting where it ends
    expect(Math.max(...first.map((c) => c.line))).toBeLessThan(Math.min(...second.map((c) => c.line)));
    expect(second.every((c) => c.reasons.some((r) => r.startsWith('second set of the lattice')))).toBe(true);
  });

  it('is seen from all round where one set of lines is not, by its own raster recomputed here', () => {
    const l = directionsShare(base, lattice), f = directionsShare(base, furrow);
    // the proof's share of the item agrees with the recomputation (all cells are reachable on this ground)
    expect(lattice.proof.reachableCells).toBe(lattice.proof.cellsInArea);
    const item = lattice.proof.items.find((it) => it.item === 'directions')!;
    expect(item.share).toBeCloseTo(l.share, 4);
    expect(l.share).toBeGreaterThan(0.93);
    expect(f.share).toBeLessThan(l.share - 0.3);
    // what falls short lies along the edge, seen from inside only; the proof says so and names the setting
    expect(l.inner).toBe(1);
    expect(f.inner).toBeLessThan(0.5);
    const short = lattice.proof.short.find((g) => g.item === 'directions')!;
    expect(short.message).toMatch(/solve\.beyondEdgeM/);
    // and the GSD and view count hold everywhere with each set carrying half the views
    expect(l.gsdShare).toBe(1);
  });

  it('meets it on every cell when lines may fly 30 m beyond the boundary, and says so', () => {
    expect(beyond.proof.meets).toBe(true);
    const b = directionsShare(beyondInput, beyond);
    expect(b.share).toBe(1);
    expect(b.gsdShare).toBe(1);
    expect(beyond.choices.pattern).toMatch(/up to 30 m beyond the area's boundary .*only where that is allowed/);
    // photos reach further past the boundary, by no more than the 30 m (a line flies over the area's extent within
    // its strip, so even inside-only lines take photos a little past a boundary they cross at a slant)
    const furthest = (plan: typeof beyond) => {
      let most = -Infinity;
      for (const ln of plan.lines) for (const st of ln.stations) {
        const [sx, sy] = site.frame.toLocal(st.lon, st.lat);
        most = Math.max(most, Math.hypot(Math.max(0, Math.abs(sx) - 160), Math.max(0, Math.abs(sy) - 160)));
      }
      return most;
    };
    expect(furthest(beyond)).toBeGreaterThan(furthest(lattice) + 10);
    // (and the photo spacing near a line's end, a metre or two either way)
    expect(furthest(beyond)).toBeLessThan(furthest(lattice) + 30 + 2);
    // the price: a longer flight than inside the boundary
    expect(beyond.summary.flightTimeS).toBeGreaterThan(lattice.summary.flightTimeS);
  });

  it('checks a tightening round that changes no photo no further, and says so', () => {
    // the cells short here are short of sides: more views along the lines ask for a photo spacing the slant's
    // forward overlap already sets, so both rounds give the first layout's photos again
    expect(lattice.rounds).toBe(2);
    expect(lattice.choices.tightening).toMatch(/^2 tightening rounds changed no photo .*: round 0: lines \d+ s leaving \d+ cells short\.$/);
  });

  it('gives each line its side overlap against its own set (neighbours across the other set would read near nothing)', () => {
    const sides = lattice.lines.flatMap((ln) => ln.stations.map((s) => s.sideOverlap)).filter((v): v is number => v !== null);
    expect(sides.length).toBeGreaterThan(100);
    // the lattice's 55 % floor is kept over the highest ground under the envelope's roll; planned, level, at the stations
    expect(Math.min(...sides)).toBeGreaterThan(0.45);
    // lines at the edge of each set have one neighbour only, so a null appears in both sets, never a 0
    expect(sides.some((v) => v === 0)).toBe(false);
  });
});

describe('slant: the lattice with the camera tilted, when nadir photos cannot see the slant the spec asks for', () => {
  // 30° from the vertical: the demo camera's half-angle across the track under 5° of roll is 31.9°, so lines would
  // have to be at least 2h·tan 30° = 1.15 h apart for a point between them to be seen that slanting, yet at most
  // 0.9 h·tan 31.9° = 0.56 h for a point under a line to be seen by its neighbours at all
  const spec = { ...base.spec, obliqueDeg: 30 };
  const inside = { ...base, spec };
  const beyondIn = { ...base, spec, solve: { ...base.solve, beyondEdgeM: 40 } };
  const slant = solvePlan(site.grid, inside);
  const slantBeyond = solvePlan(site.grid, beyondIn);
  const nadir = solvePlan(site.grid, { ...inside, solve: { ...base.solve, pattern: 'lattice' } });

  it('is chosen by the spec: two sets of lines, the camera tilted the spec\'s slant and 5° more on every line', () => {
    expect(slant.pattern).toBe('slant');
    expect(slant.choices.pattern).toMatch(/^slant: .*tilted 35°/);
    expect(slant.lines.every((l) => l.cameraTiltDeg === 35)).toBe(true);
    expect(new Set(slant.lines.map((l) => norm180(l.headingDeg)))).toEqual(new Set([20, 110]));
    expect(nadir.lines.some((l) => l.cameraTiltDeg !== undefined)).toBe(false);
  });

  it('is seen from all round at 30° where the nadir lattice is not, by its own raster recomputed here (tilted poses)', () => {
    const s = directionsShare(inside, slant), n = directionsShare(inside, nadir), b = directionsShare(beyondIn, slantBeyond);
    expect(n.share).toBeLessThan(0.1);
    expect(s.share).toBeGreaterThan(0.75);
    // the tilted footprint lies ahead of the aircraft: ground at the edges the lines start from is seen from one
    // side only unless the lines may start beyond the boundary
    expect(b.share).toBeGreaterThan(0.98);
    expect(slantBeyond.proof.items.find((it) => it.item === 'directions')!.share).toBeCloseTo(b.share, 4);
    // flown lower by cos² 35°, the finest view of every cell still meets the GSD
    expect(s.gsdShare).toBe(1);
    expect(b.gsdShare).toBe(1);
  });
});

describe('a tilted camera\'s station GSD', () => {
  it('is h·p / (f·cos² t) on level ground, at every station (Wolf, Dewitt & Wilkinson, Elements of Photogrammetry, ch. 10: scale of a tilted photograph at its principal point along the tilt, from memory)', () => {
    const flat = syntheticSite(300, 4, () => 150);
    const area = flat.area(-100, -100, 100, 100);
    const [lon0, lat0] = flat.frame.toLonLat(-130, -130);
    const input = { area, camera, targetGsdCm: 2.5, takeoff: { lon: lon0, lat: lat0 }, headingDeg: 0, mode: 'hold', clearanceM: 30, obstacleAllowanceM: 0, maxAglM: 120, speedMps: 8 };
    // lines in the analysis's own frame (localFrameFor the area's corner mean, as the solver lays them)
    const ring = area.coordinates[0].slice(0, -1);
    const frame = localFrameFor(ring.reduce((t, p) => t + p[0], 0) / ring.length, ring.reduce((t, p) => t + p[1], 0) / ring.length);
    const laid = planFlightLines(polygonToLocal(area as never, frame.toLocal), { headingDeg: 0, lineSpacingM: 60, triggerDistanceM: 20, runInM: 20 });
    const pOverF = pixelPitchMm(camera) / camera.focalLengthMm;
    for (const t of [0, 20, 35]) {
      const plan = analysePlan(flat.grid, input, { lines: laid.map((l) => ({ ...l, mountTiltDeg: t })) });
      expect(plan.lines.every((l) => (t === 0 ? l.cameraTiltDeg === undefined : l.cameraTiltDeg === t))).toBe(true);
      const cos2 = Math.cos((t * Math.PI) / 180) ** 2;
      let n = 0;
      for (const st of plan.lines.flatMap((l) => l.stations)) {
        expect(st.gsdCm! / ((st.aglM! * pOverF * 100) / cos2)).toBeCloseTo(1, 3);
        n++;
      }
      expect(n).toBeGreaterThan(20);
      for (const g of plan.lines.flatMap((l) => l.legs)) expect(g.gsdMaxCm / ((g.aglMaxM * pOverF * 100) / cos2)).toBeCloseTo(1, 3);
    }
  });
});
