import { describe, expect, it } from 'vitest';
import type { ReportLine } from '../../contracts/reports';
import { formatHeading, formatRangeCm, lineFigures } from '../../components/reports/report-figures';

const line: ReportLine = {
  number: 3,
  lengthM: 740,
  headingDeg: 270.4,
  legCount: 1,
  warnings: [],
  gsdSeries: [],
  stationCount: 33,
  knownCount: 31,
  shareMeetingGsd: 0.9394,
  gsdCm: { min: 2.98, p5: 2.985, median: 3.01, max: 3.05 },
  forwardOverlapMin: 0.798,
  sideOverlapMin: 0.698,
  aglMinM: 108.74,
  aglMaxM: 111.36,
};

describe('compliance report figures', () => {
  it('prints headings as three-digit bearings and wraps them into 0–359', () => {
    expect(formatHeading(90.4)).toBe('090° true');
    expect(formatHeading(359.6)).toBe('000° true');
    expect(formatHeading(-10)).toBe('350° true');
    expect(formatHeading(null)).toBe('–');
  });

  it('puts a line\'s GSD figures in one cell in the order min / p5 / median / max', () => {
    const gsd = lineFigures(line).find((f) => f.key === 'gsd')!;
    expect(gsd.value).toBe('2.98 / 2.99 / 3.01 / 3.05 cm');
  });

  it('shows the overlaps as percentages with one decimal and the known-ground count', () => {
    const figures = Object.fromEntries(lineFigures(line).map((f) => [f.key, f.value]));
    expect(figures.overlap).toBe('79.8 / 69.8 %');
    expect(figures.known).toBe('31 of 33');
    expect(figures.share).toBe('93.9 %');
    expect(figures.line).toBe('740 m · 270° true · 1 leg');
  });

  it('prints dashes, not zeros, for figures no station had', () => {
    const empty = { ...line, gsdCm: { min: null, p5: null, median: null, max: null }, forwardOverlapMin: null };
    const figures = Object.fromEntries(lineFigures(empty).map((f) => [f.key, f.value]));
    expect(figures.gsd).toBe('– / – / – / – cm');
    expect(figures.overlap).toBe('– / 69.8 %');
  });

  it('prints an advisory accuracy range in centimetres', () => {
    expect(formatRangeCm([3, 6])).toBe('3–6 cm');
    expect(formatRangeCm(null)).toBe('–');
  });
});

describe('report figures against their targets', () => {
  it('round toward failing: 79.96 % forward overlap is 79.9 %, never 80.0 %; a 120.04 m maximum is 120.1 m', () => {
    const figures = Object.fromEntries(lineFigures({ ...line, forwardOverlapMin: 0.7996, aglMaxM: 120.04, aglMinM: 29.96 }).map((f) => [f.key, f.value]));
    expect(figures.overlap).toBe('79.9 / 69.8 %');
    expect(figures.agl).toBe('29.9 – 120.1 m');
  });
});
