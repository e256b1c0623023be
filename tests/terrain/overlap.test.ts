import { describe, expect, it } from 'vitest';
import { intervalOverlap, photoExtents, stationOverlaps, STRIDE, type LinePhotos, type OverlapTargets } from '../../terrain/overlap';
import type { HeightAt } from '../../terrain/footprint';
import { airBaseM, footprintM, gsdCm, lineSpacingM } from '../../terrain/gsd';
import { ONE_INCH } from './plan-fixtures';

const H = 100;
const B = airBaseM(ONE_INCH, H, 0.8); // 20 m (100 m along-track footprint)
const S = lineSpacingM(ONE_INCH, H, 0.7); // 45 m (150 m across)
const T: OverlapTargets = { forwardOverlap: 0.8, sideOverlap: 0.7, gsdMinCm: 2.4, gsdMaxCm: 3.0, maxAglM: 120, clearanceM: 30, plannedHeightM: H };

/** Two east-west lines S apart (the second flown back west), n stations each, at altitude `alt`. */
function twoLines(n: number, alt: (x: number, y: number) => number): LinePhotos[] {
  const mk = (y: number, dir: 1 | -1, row: number): LinePhotos => {
    const x = Float64Array.from({ length: n }, (_, i) => dir * (i * B - ((n - 1) * B) / 2));
    const ys = new Float64Array(n).fill(y);
    return { headingDeg: dir > 0 ? 90 : 270, row, x, y: ys, altitudeM: x.map((v) => alt(v, y)) };
  };
  return [mk(0, 1, 0), mk(-S, -1, 1)];
}

describe('station overlaps', () => {
  it('equal the flat-ground formulas over flat ground: 1 - B/G forward, 1 - S/W side, GSD = H p / f', () => {
    const flat: HeightAt = () => 250;
    const res = stationOverlaps(ONE_INCH, flat, twoLines(12, () => 250 + H), 90, T);
    for (const line of res) {
      expect(line[0].forwardOverlap).toBeNull();
      for (const s of line.slice(1)) expect(s.forwardOverlap).toBeCloseTo(0.8, 9);
      for (const s of line) {
        expect(s.sideOverlap).toBeCloseTo(0.7, 9);
        expect(s.gsdCm).toBeCloseTo(gsdCm(ONE_INCH, H), 12);
        expect(s.aglM).toBe(H);
        expect(s.flags).toEqual([]);
      }
    }
  });

  // Over ground of elevation h the photo covers G (H - h) / H (scale f / (H - h), Wolf, Dewitt & Wilkinson ch. 6),
  // so with the air base fixed the forward overlap becomes 1 - B / (G (H - h) / H) (derived by hand).
  it('shrink over a plateau closer to the camera and are flagged with the reason', () => {
    const plateau: HeightAt = () => 20; // 20 m of ground under an aircraft flown for 100 m above datum 0
    const res = stationOverlaps(ONE_INCH, plateau, twoLines(8, () => H), 90, T);
    const G = footprintM(ONE_INCH, H).alongM * 0.8;
    const W = footprintM(ONE_INCH, H).acrossM * 0.8;
    const s = res[0][3];
    expect(s.aglM).toBe(80);
    expect(s.forwardOverlap).toBeCloseTo(1 - B / G, 9); // 0.75
    expect(s.sideOverlap).toBeCloseTo(1 - S / W, 9); // 0.625
    expect(s.gsdCm).toBeCloseTo(gsdCm(ONE_INCH, 80), 12);
    const codes = s.flags.map((f) => f.code);
    expect(codes).toEqual(['forward-overlap-low', 'side-overlap-low', 'gsd-fine']);
    expect(s.flags[0].reason).toMatch(/Forward overlap 0\.75 is below the target 0\.80: the ground here is 20\.0 m closer/);
  });

  it('use the real ground under each photo edge: a ridge under the front of one photo lowers only that pair', () => {
    // stations at x = -70 .. 70 every 20 m, photo edges 50 m ahead and behind; a 30 m ridge at x = 15..25 m
    // stands under the front edge (x = 20 m) of the photo taken at x = -30 m
    const ridge: HeightAt = (x) => (x > 15 && x < 25 ? 30 : 0);
    const res = stationOverlaps(ONE_INCH, ridge, twoLines(8, () => H), 90, T);
    const fwd = res[0].map((s) => s.forwardOverlap);
    expect(fwd.filter((v) => v !== null && v < 0.8 - 1e-9).length).toBeGreaterThan(0);
    expect(fwd.filter((v) => v !== null && Math.abs(v - 0.8) < 1e-9).length).toBeGreaterThan(0);
  });

  it('flag photos above the height limit or over unknown ground, and report unknown overlaps as null', () => {
    const holey: HeightAt = (x) => (x > 20 ? NaN : 0);
    const res = stationOverlaps(ONE_INCH, holey, twoLines(8, () => 130), 90, T);
    const west = res[0][0];
    expect(west.flags.map((f) => f.code)).toContain('above-max-agl');
    const east = res[0][7];
    expect(east.groundM).toBeNull();
    expect(east.gsdCm).toBeNull();
    expect(east.forwardOverlap).toBeNull();
    expect(east.flags[0].code).toBe('ground-unknown');
    expect(res[0][3].flags.map((f) => f.code)).toContain('footprint-off-grid'); // x = -10 m, front edge at 40 m
  });

  it('see no side neighbour where the other row does not reach (area edges)', () => {
    const flat: HeightAt = () => 0;
    const lines = twoLines(6, () => H);
    lines[1].x = lines[1].x.map((v) => v + 1000); // shift the second row far east
    const res = stationOverlaps(ONE_INCH, flat, lines, 90, T);
    for (const s of res[0]) expect(s.sideOverlap).toBeNull();
  });

  it('store 15 extents per photo: column intervals along track, row intervals across', () => {
    const e = photoExtents(ONE_INCH, () => 0, { headingDeg: 0, row: 0, x: Float64Array.from([0]), y: Float64Array.from([0]), altitudeM: Float64Array.from([H]) }, 0);
    expect(STRIDE).toBe(15);
    const fp = footprintM(ONE_INCH, H);
    for (let col = 0; col < 3; col++) expect(e[col * 2 + 1] - e[col * 2]).toBeCloseTo(fp.alongM, 9);
    for (let row = 0; row < 3; row++) expect(e[7 + row * 2] - e[6 + row * 2]).toBeCloseTo(fp.acrossM, 9);
    expect(e[12]).toBeCloseTo(fp.alongM / 2, 9); // front row
    expect(e[14]).toBeCloseTo(-fp.alongM / 2, 9);
  });
});

describe('intervalOverlap', () => {
  it('is the shared length over the mean length, 0 when apart, NaN when unknown', () => {
    expect(intervalOverlap(0, 10, 2, 12)).toBeCloseTo(0.8, 15);
    expect(intervalOverlap(0, 10, 20, 30)).toBe(0);
    expect(intervalOverlap(0, 10, 0, 10)).toBe(1);
    expect(intervalOverlap(0, 12, 1, 11)).toBeCloseTo(10 / 11, 15);
    expect(intervalOverlap(NaN, 1, 0, 1)).toBeNaN();
  });
});
