import { describe, expect, it } from 'vitest';
import { MAX_AREA_CORNERS, areaOffGridProblem, drawnAreaProblem, ringAreaM2, surveyAreaProblem, type LonLat } from '../../terrain/survey-area';
import { wavyRing } from '../support/area-rings';

/** A closed square ring of side `d` degrees from (lon, lat). */
const square = (lon: number, lat: number, d: number): number[][] => [[lon, lat], [lon + d, lat], [lon + d, lat + d], [lon, lat + d], [lon, lat]];
const open = (ring: number[][]) => ring.slice(0, -1).map((p) => [p[0], p[1]] as LonLat);
/** A grid outline far larger than every area below (lon 0-20, lat 40-50). */
const bigGrid = square(0, 40, 10).map((p, i) => (i === 1 || i === 2 ? [p[0] + 10, p[1]] : p)) as LonLat[];

describe('one set of survey-area rules for a drawing and a GeoJSON polygon', () => {
  const cases: Array<[string, number[][], string]> = [
    ['a bow tie', [[10, 45], [10.01, 45.01], [10.01, 45], [10, 45.01], [10, 45]], 'crosses-itself'],
    ['three corners on one line', [[10.002, 45.002], [10.004, 45.004], [10.006, 45.006], [10.002, 45.002]], 'no-area'],
    ['a 0.2° square (about 345 km²)', square(10, 45, 0.2), 'too-large'],
    [`${MAX_AREA_CORNERS + 1} corners`, wavyRing(MAX_AREA_CORNERS + 1), 'too-many-corners'],
    ['a 0.01° square', square(10, 45, 0.01), 'none'],
  ];
  for (const [what, ring, code] of cases) {
    it(`${what}: ${code} both ways`, () => {
      expect(surveyAreaProblem({ type: 'Polygon', coordinates: [ring] })?.code ?? 'none').toBe(code);
      expect(drawnAreaProblem(open(ring), bigGrid)?.code ?? 'none').toBe(code);
    });
  }

  it('refuses corners on one straight 1 km line that the spherical area formula would have let through', () => {
    // lon/lat straight from (10, 45) to (10.01, 45.01) and back through its middle: no ground enclosed
    const line = [[10, 45], [10.005, 45.005], [10.01, 45.01], [10, 45]];
    // the spherical formula (Chamberlain & Duquette) leaves a spurious area above the 1 m² floor here
    expect(ringAreaM2(line)).toBeGreaterThan(1);
    expect(surveyAreaProblem({ type: 'Polygon', coordinates: [line] })?.code).toBe('no-area');
  });

  it('words a drawing by corner number and a GeoJSON polygon by ring and edge', () => {
    const bow = [[10, 45], [10.01, 45.01], [10.01, 45], [10, 45.01], [10, 45]];
    expect(drawnAreaProblem(open(bow), bigGrid)?.message).toMatch(/^The area's outline crosses itself near 45\.00500° N, 10\.00500° E\. Move or remove corners/);
    expect(surveyAreaProblem({ type: 'Polygon', coordinates: [bow] })?.message).toMatch(/^area ring 0 crosses itself \(edges 0 and 2, near lon 10\.00500, lat 45\.00500\)/);
  });
});

describe('the grid outline rule', () => {
  // An L-shaped outline: the square lon 10-10.02, lat 45-45.02 without its top-right quarter.
  const ell: LonLat[] = [[10, 45], [10.02, 45], [10.02, 45.01], [10.01, 45.01], [10.01, 45.02], [10, 45.02], [10, 45]];

  it('refuses an edge that cuts across the missing quarter though every corner is on the grid', () => {
    const area: LonLat[] = [[10.015, 45.002], [10.015, 45.008], [10.008, 45.008], [10.008, 45.018], [10.002, 45.018], [10.002, 45.002]];
    expect(drawnAreaProblem(area, ell)?.code).toBeUndefined();
    const cutting: LonLat[] = [[10.018, 45.002], [10.018, 45.008], [10.008, 45.018], [10.002, 45.018], [10.002, 45.002]];
    // (10.018, 45.008) -> (10.008, 45.018) passes through (10.013, 45.013), inside the missing quarter
    expect(drawnAreaProblem(cutting, ell)).toMatchObject({ code: 'outside-grid', message: expect.stringMatching(/^The edge from corner 2 to corner 3 leaves the elevation grid/) });
    const poly = { type: 'Polygon' as const, coordinates: [[...cutting, cutting[0]]] };
    expect(areaOffGridProblem(poly, ell, 'Ell', 'here')?.message).toBe('The survey area leaves the elevation grid "Ell"; keep it inside the grid (here).');
  });

  it('names the corners off the grid, the first one for a drawing and up to five for the server', () => {
    const off: LonLat[] = [[10.002, 45.002], [10.015, 45.002], [10.015, 45.015], [10.002, 45.015]];
    expect(drawnAreaProblem(off, ell)?.message).toMatch(/^Corner 3 \(45\.01500° N, 10\.01500° E\) is off the elevation grid/);
    const poly = { type: 'Polygon' as const, coordinates: [[...off, off[0]]] };
    expect(areaOffGridProblem(poly, ell, 'Ell', 'here')?.message).toMatch(/leaves the elevation grid "Ell" \(corner 3\)/);
  });
});
