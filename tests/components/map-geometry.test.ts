import geodesic from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { groundScale, metresPerRadian } from '../../components/map/ground-aspect';
import { boundsGeoref, projectedGeoref } from '../../components/map/image-georef';
import { pickHandle, placeLabel } from '../../components/map/map-handles';
import { MAX_ZOOM, panView, zoomOf, zoomView, type View } from '../../components/map/map-view';
import { lengthWords, roundDownTo125, scaleBar } from '../../components/map/scale-bar';

const { Geodesic } = geodesic as unknown as typeof import('geographiclib-geodesic');

describe('scale bar', () => {
  it('picks the longest 1-2-5 step that fits the room', () => {
    expect(roundDownTo125(0.9)).toBeCloseTo(0.5, 12);
    expect(roundDownTo125(1)).toBe(1);
    expect(roundDownTo125(1.99)).toBe(1);
    expect(roundDownTo125(2)).toBe(2);
    expect(roundDownTo125(4.99)).toBe(2);
    expect(roundDownTo125(5)).toBe(5);
    expect(roundDownTo125(9.99)).toBe(5);
    expect(roundDownTo125(10)).toBe(10);
    expect(roundDownTo125(370)).toBe(200);
    expect(roundDownTo125(1234)).toBe(1000);
    expect(roundDownTo125(0.07)).toBeCloseTo(0.05, 12);
  });

  it('draws the bar as long on screen as its ground length at the map scale, never longer than the room', () => {
    const b = scaleBar(3.7, 100); // 370 m of room
    expect(b.lengthM).toBe(200);
    expect(b.lengthPx).toBeCloseTo(200 / 3.7, 9);
    expect(b.lengthPx).toBeLessThanOrEqual(100);
    expect(b.label).toBe('200 m');
    expect(scaleBar(25, 100).label).toBe('2 km');
    expect(scaleBar(0.004, 100).label).toBe('20 cm');
    expect(lengthWords(1500)).toBe('1.5 km');
  });

  it('throws on bad input, saying what it got', () => {
    expect(() => scaleBar(0, 100)).toThrow(/got 0/);
    expect(() => scaleBar(1, Number.NaN)).toThrow(/got NaN/);
    expect(() => roundDownTo125(-3)).toThrow(/got -3/);
  });
});

describe('ground aspect of a map image', () => {
  it('draws a lon/lat grid as wide against tall as the ground it covers (checked with GeographicLib geodesics)', () => {
    // the demo grid warped to lon/lat (tests/fixtures/dem/harrow-fell-wgs84.md): 293 x 166 pixels of 0.0001°
    const bounds = [4.4667563, 46.7637428, 4.4960563, 46.7803428] as const;
    const g = boundsGeoref(293, 166, bounds);
    const s = groundScale(g);
    // Reference: geodesic distances on WGS 84 from GeographicLib (npm geographiclib-geodesic 2.x, C. F. F. Karney,
    // "Algorithms for geodesics", J. Geodesy 2013): across the image along its middle parallel, and down its middle meridian.
    const midLat = (bounds[1] + bounds[3]) / 2;
    const midLon = (bounds[0] + bounds[2]) / 2;
    const acrossM = Geodesic.WGS84.Inverse(midLat, bounds[0], midLat, bounds[2]).s12 as number;
    const downM = Geodesic.WGS84.Inverse(bounds[3], midLon, bounds[1], midLon).s12 as number;
    const groundAspect = acrossM / downM;
    const drawnAspect = (293 * s.aspect) / 166;
    expect(Math.abs(drawnAspect / groundAspect - 1)).toBeLessThan(1e-4);
    // square pixels would have stretched it east–west by about 1/cos(46.77°) ≈ 1.46
    expect(293 / 166 / groundAspect).toBeGreaterThan(1.45);
    expect(s.metresPerPxX).toBeCloseTo(acrossM / 293, 2);
    expect(s.metresPerPxY).toBeCloseTo(downM / 166, 2);
    expect(s.northDeg).toBeCloseTo(0, 9);
  });

  it('gives the WGS 84 radii of curvature that GeographicLib steps confirm at several latitudes', () => {
    for (const lat of [0, 30, 46.77, 61.5, -37.8]) {
      const r = metresPerRadian(lat);
      const d = 1e-4; // degrees
      const east = Geodesic.WGS84.Inverse(lat, 10, lat, 10 + d).s12 as number;
      const north = Geodesic.WGS84.Inverse(lat - d / 2, 10, lat + d / 2, 10).s12 as number;
      expect(Math.abs((r.eastM * d * Math.PI) / 180 / east - 1)).toBeLessThan(1e-7);
      expect(Math.abs((r.northM * d * Math.PI) / 180 / north - 1)).toBeLessThan(1e-7);
    }
  });

  it('keeps a UTM grid near square and finds north turned by the grid convergence off the central meridian', () => {
    const utm31 = '+proj=utm +zone=31 +datum=WGS84 +units=m +no_defs';
    const g = projectedGeoref(1000, 800, [600000, 5, 0, 5200000, 0, -5], utm31);
    const s = groundScale(g);
    expect(s.aspect).toBeCloseTo(1, 6);
    expect(s.metresPerPxX).toBeCloseTo(5 * (1 / 0.9996), 1); // about 5 m scaled back from the UTM grid
    // east of the central meridian (3° E) grid north lies east of true north: true north points left of up
    expect(s.northDeg).toBeGreaterThan(358);
    expect(s.northDeg).toBeLessThan(360);
  });

  it('does not change the georeference it is given', () => {
    const g = boundsGeoref(10, 10, [1, 2, 3, 4]);
    const before = JSON.stringify([g.toLonLat(5, 5), g.widthPx, g.heightPx]);
    groundScale(g);
    expect(JSON.stringify([g.toLonLat(5, 5), g.widthPx, g.heightPx])).toBe(before);
  });
});

describe('map pan and zoom', () => {
  const full: View = [0, 0, 400, 200];
  it('zooms about the anchor, which stays at the same place on screen', () => {
    const v = zoomView(full, full, 2, [100, 50]);
    expect(v).toEqual([50, 25, 250, 125]);
    expect(zoomOf(v, full)).toBe(2);
  });
  it('never zooms out past the full view nor in past the closest zoom', () => {
    expect(zoomView(full, full, 0.5)).toEqual(full);
    const deep = zoomView(full, full, 1000);
    expect(zoomOf(deep, full)).toBe(MAX_ZOOM);
  });
  it('pans inside the full view only', () => {
    const v = zoomView(full, full, 2);
    expect(panView(v, full, -1000, 0)[0]).toBe(0);
    expect(panView(v, full, 1000, 1000)).toEqual([200, 100, 400, 200]);
    expect(panView(v, full, 10, -5)).toEqual([110, 45, 310, 145]);
  });
  it('throws on a zoom factor that is not a positive number', () => {
    expect(() => zoomView(full, full, 0)).toThrow(/got 0/);
  });
});

describe('what a press on the area editor grabs', () => {
  it('grabs corner 1 even with the takeoff marker on top of it', () => {
    expect(pickHandle([100, 100], [[101, 100], [200, 200]], [100, 100], 14)).toEqual({ kind: 'corner', index: 0 });
  });
  it('grabs the nearest corner, the takeoff point when no corner is in reach, and nothing far from all', () => {
    expect(pickHandle([195, 195], [[101, 100], [200, 200]], null, 14)).toEqual({ kind: 'corner', index: 1 });
    expect(pickHandle([300, 300], [[101, 100]], [305, 296], 14)).toEqual({ kind: 'takeoff' });
    expect(pickHandle([500, 500], [[101, 100]], [305, 296], 14)).toBeNull();
  });
  it('places a label where it hides no other marker', () => {
    // the takeoff at (100, 100) with corner 1 up and to the right: the label moves off the upper right
    const p = placeLabel([100, 100], 8, 48, 12, [[125, 85]], 8);
    expect(p).not.toEqual({ anchor: 'start', dx: 1.3, dy: -1.3 });
    expect(placeLabel([100, 100], 8, 48, 12, [[300, 300]], 8)).toEqual({ anchor: 'start', dx: 1.3, dy: -1.3 });
  });
  it('keeps a label on the map near its edges', () => {
    // near the left edge with a marker up and to the right: not on the left (off the map), so below right
    expect(placeLabel([6, 100], 8, 48, 12, [[25, 85]], 8, [300, 200])).toEqual({ anchor: 'start', dx: 1.3, dy: 2.4 });
    // near the top right corner: lower left
    expect(placeLabel([295, 5], 8, 48, 12, [], 8, [300, 200])).toEqual({ anchor: 'end', dx: -1.3, dy: 2.4 });
  });
});
