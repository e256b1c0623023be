/**
 * The transit clearance warning names the reference of every height it gives (above the datum and above takeoff),
 * and its figures follow from the geometry: a 100 m-high ridge halfway between takeoff and line 1, flown straight
 * at the line's start altitude. Hand-worked example (common practice: ground + clearance must stay below the path).
 */
import { describe, expect, it } from 'vitest';
import { transitWarnings } from '../../terrain/plan-warnings';
import type { FlightLine } from '../../terrain/lines';
import type { AltitudeLeg } from '../../terrain/altitude';
import { analysePlan } from '../../terrain/plan';
import { syntheticSite } from './coverage-site';

const line: FlightLine = {
  index: 0, headingDeg: 0, offsetM: 0, start: [0, 200], end: [0, 400], lengthM: 200, areaStartM: 0, areaEndM: 200, stationsM: new Float64Array([0, 100, 200]),
};
const leg: AltitudeLeg = { startM: 0, endM: 200, altitudeStartM: 150, altitudeEndM: 150, gradient: 0, aglMinM: 80, aglMaxM: 80 };
// Ground 50 m above the datum everywhere, with a ridge reaching 100 m between y = 90 and 110 on the way out.
const heightAt = (_x: number, y: number) => (y >= 90 && y <= 110 ? 100 : 50);

describe('transit clearance warnings', () => {
  it('gives each height with its reference: above the datum and above takeoff', () => {
    // Takeoff ground 50 m; clearance 60 m: the ridge needs 160 m above the datum, the transit flies at 150 m.
    const w = transitWarnings([line], [[leg]], [0, 0], 50, heightAt, 60);
    const out = w.find((x) => x.message.startsWith('Takeoff to line 1'))!;
    expect(out.code).toBe('transit-clearance');
    expect(out.message).toBe(
      'Takeoff to line 1: flown straight at 150 m above the datum (100 m above takeoff) the transit comes 10.0 m inside the clearance; fly it at 160 m above the datum (110 m above takeoff) or route around.',
    );
    // The way back from line 1's end (y = 400) to takeoff also crosses the ridge.
    expect(w.some((x) => x.message.startsWith('Line 1 to takeoff'))).toBe(true);
  });

  it('says nothing when the transit clears the ground by the clearance', () => {
    expect(transitWarnings([line], [[leg]], [0, 0], 50, heightAt, 50)).toEqual([]);
  });
});

describe('the return altitude', () => {
  // invented ground: level at 300 m, with a broad ridge (Gaussian, 60 m high, 40 m wide) across the way from the
  // area (north) back to the takeoff point (south)
  const camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };
  const ridge = (_x: number, y: number) => 300 + 60 * Math.exp(-(((y + 150) / 40) ** 2));
  const plan = (h: (x: number, y: number) => number) => {
    const site = syntheticSite(420, 2, h);
    const [lon, lat] = site.frame.toLonLat(0, -300);
    const input = { area: site.area(-100, -50, 100, 150), camera, targetGsdCm: 2.5, takeoff: { lon, lat }, headingDeg: 0, mode: 'hold', clearanceM: 40, maxAglM: 120, speedMps: 8, climbMps: 3, descentMps: 2 };
    return { site, p: analysePlan(site.grid, input) };
  };

  it('is the altitude at which the straight way home from the last line keeps the clearance over the ridge, and the warning says the export climbs to it', () => {
    const { site, p } = plan(ridge);
    const last = p.lines[p.lines.length - 1];
    const endAlt = last.legs[last.legs.length - 1].altitudeEndM;
    const back = p.takeoff.returnAltitudeM!;
    // the line flies ~90 m above the 300 m plain; the ridge top (360 m) + 40 m clearance needs 400 m
    expect(back).toBeGreaterThan(endAlt + 5);
    expect(p.takeoff.returnAltitudeAboveTakeoffM).toBeCloseTo(back - p.takeoff.groundM, 6);
    // independently of the plan's own 5 m sampling: the invented ground every 0.5 m along the straight way home
    const [ex, ey] = site.frame.toLocal(last.end.lon, last.end.lat), [tx, ty] = site.frame.toLocal(p.takeoff.lon, p.takeoff.lat);
    let worst = -Infinity;
    for (let k = 0; k <= 2000; k++) worst = Math.max(worst, ridge(ex + ((tx - ex) * k) / 2000, ey + ((ty - ey) * k) / 2000) + 40 - back);
    // clear by the clearance to the grid's own interpolation of the 2 m pixels (a few centimetres on this ridge)
    expect(worst).toBeLessThanOrEqual(0.1);
    expect(worst).toBeGreaterThan(-0.5);
    // every line's own way home (where a battery change after it flies from): the same check, each at least its end's altitude
    for (const l of p.lines) {
      const home = l.returnAltitudeAboveTakeoffM! + p.takeoff.groundM;
      expect(home).toBeGreaterThanOrEqual(l.legs[l.legs.length - 1].altitudeEndM - 1e-6);
      const [lx, ly] = site.frame.toLocal(l.end.lon, l.end.lat);
      let w = -Infinity;
      for (let k = 0; k <= 2000; k++) w = Math.max(w, ridge(lx + ((tx - lx) * k) / 2000, ly + ((ty - ly) * k) / 2000) + 40 - home);
      expect(w).toBeLessThanOrEqual(0.1);
    }
    expect(p.lines[p.lines.length - 1].returnAltitudeAboveTakeoffM).toBe(p.takeoff.returnAltitudeAboveTakeoffM);
    const w = p.warnings.find((x) => x.message.startsWith(`Line ${p.lines.length} to takeoff`));
    expect(w?.message).toMatch(/the MAVLink export climbs to it over the end of the line before the return/);
  }, 60_000);

  it('is the last line\'s own end altitude when the way home is clear', () => {
    const { p } = plan(() => 300);
    const last = p.lines[p.lines.length - 1];
    expect(p.takeoff.returnAltitudeM).toBe(last.legs[last.legs.length - 1].altitudeEndM);
    expect(p.warnings.some((x) => x.code === 'transit-clearance')).toBe(false);
  }, 60_000);
});
