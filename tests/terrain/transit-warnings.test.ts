/**
 * The transit clearance warning names the reference of every height it gives (above the datum and above takeoff),
 * and its figures follow from the geometry: a 100 m-high ridge halfway between takeoff and line 1, flown straight
 * at the line's start altitude. Hand-worked example (common practice: ground + clearance must stay below the path).
 */
import { describe, expect, it } from 'vitest';
import { transitWarnings } from '../../terrain/plan-warnings';
import type { FlightLine } from '../../terrain/lines';
import type { AltitudeLeg } from '../../terrain/altitude';

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
