import { describe, expect, it } from 'vitest';
import { planResultSchema } from '../../contracts/plan-result';

/** A minimal analysis result as stored before overlaps were given as guaranteed (no such fields anywhere). */
const stored = () => ({
  lines: [{
    index: 0, headingDeg: 90, lengthM: 100, start: { lon: 4.48, lat: 46.76 }, end: { lon: 4.49, lat: 46.76 }, areaStartM: 0, areaEndM: 100,
    stations: [{ lon: 4.48, lat: 46.76, distanceM: 0, groundM: 300, altitudeM: 391, altitudeAboveTakeoffM: 91, aglM: 91, gsdCm: 2.5, forwardOverlap: null, sideOverlap: 0.7, flags: [] }],
    legs: [], unmet: [], warnings: [],
  }],
  summary: {
    lineCount: 1, photoCount: 1, flightDistanceM: 100, flightTimeS: 20, batteries: 1, gsdCm: { min: 2.5, median: 2.5, max: 2.5 },
    forwardOverlapMin: null, sideOverlapMin: 0.7, aglMinM: 91, aglMaxM: 91, shareWithinGsdTarget: 1, flaggedStationCount: 0, unmetLengthM: 0,
    mode: 'follow', headingDeg: 90, plannedHeightM: 91, gsdBandCm: { min: 2.25, max: 2.75 }, lineSpacingM: 41, triggerDistanceM: 18,
    footprintAcrossM: 137, footprintAlongM: 91, maxDistanceFromTakeoffM: 50,
  },
  warnings: [], takeoff: { lon: 4.48, lat: 46.76, groundM: 300, geoidUndulationM: 48 },
  heights: { datum: 'grid', aboveTakeoff: 'takeoff', verticalDatum: null }, headingAdvice: null, frame: { crs: 'UTM 31N', epsg: 32631 },
});

describe('plan result schema: overlaps as guaranteed', () => {
  it('still reads results stored before the guaranteed overlaps existed, and reads them as absent', () => {
    const r = planResultSchema.parse(stored());
    expect(r.summary.overlapEnvelope).toBeUndefined();
    expect(r.lines[0].stations[0].sideOverlapGuaranteed).toBeUndefined();
  });

  it('reads guaranteed overlaps and the envelope, and refuses an overlap outside 0..1 or an unknown flag code', () => {
    const r = stored();
    Object.assign(r.lines[0].stations[0], { forwardOverlapGuaranteed: null, sideOverlapGuaranteed: 0.52, flags: [{ code: 'side-overlap-envelope', reason: 'under the attitude envelope' }] });
    Object.assign(r.summary, { forwardOverlapGuaranteedMin: null, sideOverlapGuaranteedMin: 0.52, overlapEnvelope: { rollDeg: 5, pitchDeg: 5, windMps: 0, windFromDeg: 0, airspeedMps: 8, crabs: false, crabDegMax: 0, stepDeg: 5, marginPx: 17.9, attitudeCount: 9, words: '±5° roll, ±5° pitch' } });
    expect(planResultSchema.parse(r).summary.sideOverlapGuaranteedMin).toBe(0.52);
    Object.assign(r.lines[0].stations[0], { sideOverlapGuaranteed: 1.2 });
    expect(planResultSchema.safeParse(r).success).toBe(false);
    Object.assign(r.lines[0].stations[0], { sideOverlapGuaranteed: 0.52, flags: [{ code: 'overlap-maybe', reason: 'x' }] });
    expect(planResultSchema.safeParse(r).success).toBe(false);
  });
});
