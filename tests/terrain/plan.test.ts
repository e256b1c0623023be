import { describe, expect, it } from 'vitest';
import { analysePlan, missionBboxWgs84 } from '../../terrain/plan';
import { planResultSchema, unmetReasons } from '../../contracts/plan-result';
import { unmetReasonWords } from '../../terrain/unmet-words';
import { airBaseM, footprintM, heightForGsdM, lineSpacingM } from '../../terrain/gsd';
import { createGrid } from '../../terrain/grid';
import { WGS84, createTransform } from '../../terrain/crs';
import { TerrainError } from '../../terrain/errors';
import { ONE_INCH, lonLatOf, missionOver, utmGrid } from './plan-fixtures';

const flat = utmGrid({ width: 700, height: 700, f: () => 412 });
// heights on a 1/64 m lattice, so that raising the float32 grid by a whole number of metres is exact
const hillF = (x: number, y: number) => Math.round(64 * (300 + 60 * Math.exp(-(((x - 450) / 120) ** 2 + ((y - 450) / 200) ** 2)) + 0.03 * x)) / 64;
const hills = utmGrid({ width: 900, height: 900, f: hillF });

describe('analysePlan', () => {
  it('gives the flat-ground formulas over a flat grid: height, GSD, overlaps, spacing, one level leg a line', () => {
    const r = analysePlan(flat, missionOver(flat, 150, 150, 550, 500, { altitudeRoundingM: 0 }));
    const H = heightForGsdM(ONE_INCH, 2);
    expect(r.summary.plannedHeightM).toBeCloseTo(H, 3);
    expect(r.summary.lineSpacingM).toBeCloseTo(lineSpacingM(ONE_INCH, H, 0.7), 3);
    expect(r.summary.triggerDistanceM).toBeCloseTo(airBaseM(ONE_INCH, H, 0.8), 3);
    expect(r.summary.footprintAcrossM).toBeCloseTo(footprintM(ONE_INCH, H).acrossM, 3);
    expect(r.lines.length).toBe(Math.ceil(350 / lineSpacingM(ONE_INCH, H, 0.7)));
    for (const line of r.lines) {
      expect(line.legs).toHaveLength(1);
      expect(line.legs[0].gradient).toBe(0);
      expect(line.legs[0].altitudeStartM).toBeCloseTo(412 + H, 2);
      expect(line.legs[0].altitudeStartAboveTakeoffM).toBeCloseTo(H, 2);
      expect(line.unmet).toEqual([]);
      line.stations.forEach((s, i) => {
        expect(s.aglM).toBeCloseTo(H, 2);
        expect(s.gsdCm).toBeCloseTo(2, 3);
        if (i > 0) expect(s.forwardOverlap).toBeCloseTo(0.8, 3);
        else expect(s.forwardOverlap).toBeNull();
        expect(s.sideOverlap).toBeCloseTo(0.7, 3);
        expect(s.flags).toEqual([]);
      });
    }
    expect(r.summary.shareWithinGsdTarget).toBe(1);
    expect(r.summary.flaggedStationCount).toBe(0);
    expect(r.takeoff.groundM).toBeCloseTo(412, 3);
  });

  it('matches the plan-result contract and survives a JSON round trip (no NaN, no undefined)', () => {
    const r = analysePlan(hills, missionOver(hills, 200, 200, 700, 650, { mode: 'follow' }));
    expect(() => planResultSchema.parse(r)).not.toThrow();
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
    const keys = Object.keys(r.lines[0].stations[0]).sort();
    expect(keys).toEqual(['altitudeAboveTakeoffM', 'altitudeM', 'aglM', 'distanceM', 'flags', 'forwardOverlap', 'forwardOverlapGuaranteed', 'gsdCm', 'groundM', 'lat', 'lon', 'sideOverlap', 'sideOverlapGuaranteed'].sort());
    for (const k of ['lineCount', 'photoCount', 'flightDistanceM', 'flightTimeS', 'gsdCm', 'forwardOverlapMin', 'sideOverlapMin', 'aglMinM', 'shareWithinGsdTarget']) expect(r.summary).toHaveProperty(k);
  });

  it('keeps clearance at every station and the climb and descent gradients on every leg, in every mode', () => {
    for (const mode of ['hold', 'steps', 'follow'] as const) {
      const m = missionOver(hills, 200, 200, 700, 650, { mode, clearanceM: 40, obstacleAllowanceM: 5, climbMps: 2, descentMps: 1.5, speedMps: 8 });
      const r = analysePlan(hills, m);
      for (const line of r.lines) {
        for (const s of line.stations) expect(s.aglM!).toBeGreaterThanOrEqual(45 - 1e-3);
        for (const leg of line.legs) {
          expect(leg.gradient).toBeLessThanOrEqual(2 / 8 + 1e-6);
          expect(leg.gradient).toBeGreaterThanOrEqual(-1.5 / 8 - 1e-6);
          expect(leg.aglMinM).toBeGreaterThanOrEqual(45 - 1e-3);
        }
      }
    }
  });

  it('raises every altitude with the grid and changes no GSD, overlap or height above takeoff', () => {
    const up = createGrid({ ...hills, data: hills.data.map((v) => v + 250) });
    const m = missionOver(hills, 200, 200, 700, 650, { mode: 'follow' });
    const a = analysePlan(hills, m), b = analysePlan(up, m);
    a.lines.forEach((line, li) => {
      line.legs.forEach((leg, k) => {
        expect(b.lines[li].legs[k].altitudeStartM - leg.altitudeStartM).toBeCloseTo(250, 2);
        expect(b.lines[li].legs[k].altitudeEndAboveTakeoffM).toBeCloseTo(leg.altitudeEndAboveTakeoffM, 2);
      });
      line.stations.forEach((s, i) => {
        const t = b.lines[li].stations[i];
        expect(t.altitudeM - s.altitudeM).toBeCloseTo(250, 2);
        expect(t.gsdCm!).toBeCloseTo(s.gsdCm!, 3);
        expect(t.forwardOverlap ?? -1).toBeCloseTo(s.forwardOverlap ?? -1, 3);
        expect(t.sideOverlap ?? -1).toBeCloseTo(s.sideOverlap ?? -1, 3);
      });
    });
  });

  it('carries the safety cautions and explains what it could not do', () => {
    const r = analysePlan(hills, missionOver(hills, 200, 200, 700, 650, { mode: 'hold' }));
    const codes = r.warnings.map((w) => w.code);
    expect(codes).toEqual(expect.arrayContaining(['bare-earth', 'local-rules', 'wind', 'band-not-held']));
    expect(r.lines.some((l) => l.unmet.some((u) => u.reason === 'hold'))).toBe(true);
    expect(r.summary.flaggedStationCount).toBeGreaterThan(0);
    // the plan-wide sentence says each reason in words, with its length, and no reason code reaches the reader
    const said = r.warnings.find((w) => w.code === 'band-not-held')!.message;
    const reasons = new Set(r.lines.flatMap((l) => l.unmet.map((u) => u.reason)));
    for (const reason of reasons) expect(said).toContain(unmetReasonWords[reason]);
    // (the hyphenated codes; 'hold' and 'steps' are also the modes' own names, which the words use)
    for (const code of unmetReasons.filter((c) => c.includes('-'))) expect(said).not.toContain(code);
    expect(said).toMatch(/not held over [\d,]+ m of line: /);
  });

  it('has words for every reason the result schema lets a stretch give', () => {
    expect(Object.keys(unmetReasonWords).sort()).toEqual([...unmetReasons].sort());
  });

  it('advises a heading when asked, along the contours of a tilted plane', () => {
    const tilt = utmGrid({ width: 700, height: 700, f: (x) => 100 + 0.2 * x });
    const r = analysePlan(tilt, missionOver(tilt, 150, 150, 550, 550, { headingDeg: 'advise' }));
    expect(r.headingAdvice).not.toBeNull();
    expect(r.summary.headingDeg).toBe(r.headingAdvice!.recommendedDeg);
    expect([0, 179, 1]).toContain(r.summary.headingDeg); // north-south lines are level
  });

  it('works on a geographic (EPSG:4326) grid of the same ground', () => {
    const [lon0, lat0] = lonLatOf(flat, 0, 0);
    const geo = createGrid({ width: 120, height: 120, data: new Float32Array(14400).fill(412), transform: [lon0 - 0.001, 0.0001, 0, lat0 + 0.011, 0, -0.0001], crs: WGS84 });
    const a = analysePlan(flat, missionOver(flat, 150, 150, 550, 500));
    const b = analysePlan(geo, missionOver(flat, 150, 150, 550, 500));
    expect(b.summary.lineCount).toBe(a.summary.lineCount);
    expect(b.lines[0].stations[3].aglM).toBeCloseTo(a.lines[0].stations[3].aglM!, 3);
  });

  it('refuses a takeoff point off the grid, and bad missions, with TerrainErrors', () => {
    const m = missionOver(flat, 150, 150, 550, 500);
    const off = { ...m, takeoff: { lon: m.takeoff.lon - 0.5, lat: m.takeoff.lat } };
    expect(() => analysePlan(flat, off)).toThrow(TerrainError);
    expect(() => analysePlan(flat, off)).toThrow(/takeoff point .* off the elevation grid/);
    expect(() => analysePlan(flat, { ...m, sideOverlap: 70 })).toThrow(/sideOverlap/);
  });

  it('does not mutate the mission or the grid', () => {
    const m = missionOver(hills, 200, 200, 700, 650);
    const copy = JSON.parse(JSON.stringify(m));
    const before = hills.data.slice();
    analysePlan(hills, m);
    expect(m).toEqual(copy);
    expect(Buffer.from(hills.data.buffer).equals(Buffer.from(before.buffer))).toBe(true);
  });

  it('names the WGS 84 window a reader must decode: the area, the takeoff and the photos beyond the edges', () => {
    const m = missionOver(flat, 150, 150, 550, 500);
    const [w, s, e, n] = missionBboxWgs84(m);
    const t = createTransform(flat.crs, WGS84);
    const inBox = (x: number, y: number) => { const [lo, la] = t.forward(500_000 + x, 5_000_000 + y); return lo >= w && lo <= e && la >= s && la <= n; };
    expect(inBox(150, 150) && inBox(550, 500) && inBox(130, 130)).toBe(true);
    expect(inBox(100, 100)).toBe(true); // 50 m beyond the area: photo footprints reach there
    expect(inBox(-800, 300)).toBe(false);
  });

  it('keeps the plan and gives overlaps as planned only, saying why, when the envelope\'s crosswind is too strong to hold the lines', () => {
    const m = missionOver(hills, 200, 200, 700, 650, { mode: 'follow', headingDeg: 90, envelope: { preset: 'fixed-wing', windMps: 12, windFromDeg: 0, airspeedMps: 10 } });
    const r = analysePlan(hills, m);
    expect(r.summary.overlapEnvelope).toBeNull();
    expect(r.lines[0].stations[1].forwardOverlapGuaranteed).toBeNull();
    expect(r.lines[0].stations[1].forwardOverlap).not.toBeNull();
    expect(r.warnings.find((w) => w.code === 'envelope-refused')?.message).toMatch(/as planned only: .*at least the 10 m\/s airspeed/);
    // a wind the aircraft can hold: guaranteed figures, with the crab
    const ok = analysePlan(hills, { ...m, envelope: { preset: 'fixed-wing', windMps: 4, windFromDeg: 0, airspeedMps: 10 } });
    expect(ok.summary.overlapEnvelope?.crabDegMax).toBeCloseTo(Math.asin(0.4) * 180 / Math.PI, 1);
    expect(ok.lines[0].stations[1].forwardOverlapGuaranteed!).toBeLessThan(ok.lines[0].stations[1].forwardOverlap!);
  });
});
