/** The leg sheet's grouping of spot photos: the cards and the line index read a tour of spot photos as one. */
import { describe, expect, it } from 'vitest';
import { legSheetSchema, type SheetLine } from '../../contracts/flights';
import { lineIndexEntries } from '../../components/flights/line-index';
import { lineRunWords, sheetBlocks, tourPlaceWords } from '../../components/flights/sheet-blocks';
import { formatDecimal, formatLength } from '../../components/projects/units';
import { sampleSheet } from './flights-sheet-fixture';

// lines 1-2 of the first set, spot photos 3-5, line 6 of the second set: the flying order of a slant plan
function slantSheet() {
  const base = sampleSheet();
  const line = base.lines[0]!;
  const withLeg = (n: number, aboveTakeoff: number): SheetLine => ({
    ...line,
    number: n,
    legs: [{ ...line.legs[0]!, altitudeAboveTakeoffM: { start: aboveTakeoff, end: aboveTakeoff } }],
  });
  const lines: SheetLine[] = [
    { ...withLeg(1, 62.2), set: 1, cameraTiltDeg: 35 },
    { ...withLeg(2, 64), set: 1, cameraTiltDeg: 35 },
    { ...withLeg(3, 70.4), kind: 'spot', photoCount: 1 },
    { ...withLeg(4, -0.3), kind: 'spot', photoCount: 1 },
    { ...withLeg(5, -6), kind: 'spot', photoCount: 1 },
    { ...withLeg(6, 58), set: 2, cameraTiltDeg: 35 },
  ];
  return legSheetSchema.parse({ ...base, lines });
}

describe('spot photos on the leg sheet', () => {
  it('gather the consecutive spot photos into one block between the lines flown either side', () => {
    const blocks = sheetBlocks(slantSheet().lines);
    expect(blocks.map((b) => (b.kind === 'line' ? b.line.number : b.spots.map((s) => s.number)))).toEqual([1, 2, [3, 4, 5], 6]);
    const tour = blocks[2]!;
    expect(tour).toMatchObject({ kind: 'spots', after: 2, before: 6 });
    if (tour.kind !== 'spots') throw new Error('not a tour');
    expect(lineRunWords(tour.spots)).toBe('Lines 3–5');
    expect(tourPlaceWords(tour)).toBe('after line 2, before line 6');
    // a tour at the very start or end of the flight names the takeoff point or the return
    const alone = sheetBlocks(slantSheet().lines.slice(2, 5));
    expect(alone).toHaveLength(1);
    expect(tourPlaceWords(alone[0] as Extract<(typeof alone)[number], { kind: 'spots' }>)).toBe('from the takeoff point, before the return');
  });

  it('reads a sheet stored before spot photos had a kind as lines of the layout', () => {
    const old = sampleSheet();
    expect(old.lines[0]!.kind).toBe('line');
    expect(sheetBlocks(old.lines).map((b) => b.kind)).toEqual(['line']);
  });

  it('give the line index one entry per tour, with the heights above takeoff it spans, and each line its set', () => {
    const entries = lineIndexEntries(slantSheet());
    expect(entries.map((e) => e.testID)).toEqual(['line-index-1', 'line-index-2', 'line-index-spots-3', 'line-index-6']);
    expect(entries[2]).toMatchObject({ title: '3 spot photos', counts: 'Lines 3–5', start: 'at -6 m to 70 m above takeoff', anchorId: 'sheet-line-3' });
    expect(entries[0]).toMatchObject({ title: 'Line 1 · set 1', counts: '1 leg · 30 photos' });
    expect(entries[3]!.title).toBe('Line 6 · set 2');
  });
});

describe('figures that round to zero', () => {
  it('print without a minus sign ("-0 m" is no height a pilot can set)', () => {
    expect(formatLength(-0.3, 'metric')).toBe('0 m');
    expect(formatDecimal(-0.04, 1)).toBe('0.0');
    expect(formatLength(-0.6, 'metric')).toBe('-1 m');
    expect(formatDecimal(-1234.5, 0)).toBe('-1,235');
  });
});
