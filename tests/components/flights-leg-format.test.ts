import { describe, expect, it } from 'vitest';
import {
  formatAltitudePair,
  formatDatumPair,
  formatGsdRange,
  formatLatLon,
  formatRange,
  legKindLabel,
  packHomeLabel,
  packLinesLabel,
} from '../../components/flights/leg-format';

describe('leg-sheet altitudes', () => {
  it('prints a level leg as one whole figure in metres', () => {
    expect(formatAltitudePair({ start: 62.2, end: 62.21 }, 'metric')).toBe('62 m');
  });

  it('prints a climbing leg as start → end', () => {
    expect(formatAltitudePair({ start: 62.4, end: 75.6 }, 'metric')).toBe('62 → 76 m');
  });

  it('converts to feet with the international foot (0.3048 m exactly, 1959 agreement): 120 m is 394 ft', () => {
    // 120 / 0.3048 = 393.70… (arithmetic on the defined foot), rounded to a whole foot as a pilot sets it.
    expect(formatAltitudePair({ start: 120, end: 120 }, 'imperial')).toBe('394 ft');
  });

  it('keeps one decimal for the datum altitude', () => {
    expect(formatDatumPair({ start: 312.44, end: 312.44 }, 'metric')).toBe('312.4 m');
    expect(formatDatumPair({ start: 312.44, end: 318.06 }, 'metric')).toBe('312.4 → 318.1 m');
  });

  it('does not mutate the altitude pair', () => {
    const pair = { start: 1, end: 2 };
    formatAltitudePair(pair, 'metric');
    expect(pair).toEqual({ start: 1, end: 2 });
  });
});

describe('leg-sheet ranges and words', () => {
  it('prints a height-above-ground range, a single figure when both ends round alike, a dash when unknown', () => {
    expect(formatRange({ min: 58.1, max: 66.4 }, 'metric')).toBe('58–66 m');
    expect(formatRange({ min: 60.2, max: 59.8 }, 'metric')).toBe('60 m');
    expect(formatRange({ min: null, max: 66 }, 'metric')).toBe('–');
  });

  it('prints GSD ranges in centimetres with one decimal', () => {
    expect(formatGsdRange({ min: 2.86, max: 3.12 })).toBe('2.9–3.1 cm');
    expect(formatGsdRange({ min: null, max: null })).toBe('–');
  });

  it('puts latitude before longitude with six decimals', () => {
    expect(formatLatLon({ lat: 54.2999991, lon: -2.5 })).toBe('54.299999, -2.500000');
  });

  it('names the leg kind with its gradient', () => {
    expect(legKindLabel({ kind: 'level', gradientPct: 0 })).toBe('Level');
    expect(legKindLabel({ kind: 'climb', gradientPct: 3.24 })).toBe('Climb 3.2 %');
    expect(legKindLabel({ kind: 'descent', gradientPct: -2.1 })).toBe('Descent 2.1 %');
  });

  it('names the lines of a battery pack as a range when they follow each other', () => {
    expect(packLinesLabel([1, 2, 3])).toBe('Lines 1–3');
    expect(packLinesLabel([4])).toBe('Line 4');
    expect(packLinesLabel([1, 3, 5])).toBe('Lines 1, 3, 5');
    expect(packLinesLabel([])).toBe('No lines');
  });

  it('says the altitude each pack flies home at, and the climb first where the ground on the way needs it', () => {
    const pack = { number: 2, lines: [4, 5, 6], flightTimeS: 900, overBudget: false };
    expect(packHomeLabel({ ...pack, homeAboveTakeoffM: 81.2, homeClimbM: 0 }, 'metric')).toBe('Home from line 6 at 81 m above takeoff');
    expect(packHomeLabel({ ...pack, homeAboveTakeoffM: 86.4, homeClimbM: 5.2 }, 'metric')).toBe('Home from line 6 at 86 m above takeoff: climb 5 m over its end first, the ground on the way needs it');
    // 86.4 m is 283.46 ft (0.3048 m to the international foot)
    expect(packHomeLabel({ ...pack, homeAboveTakeoffM: 86.4, homeClimbM: 5.2 }, 'imperial')).toMatch(/^Home from line 6 at 283 ft above takeoff: climb 17 ft/);
    expect(packHomeLabel(pack, 'metric')).toBe('');
  });
});
