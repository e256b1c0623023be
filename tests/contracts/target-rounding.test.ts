import { describe, expect, it } from 'vitest';
import { roundTowardFailing } from '../../contracts/target-rounding';
import { formatGsd, formatLength, formatPercent } from '../../components/projects/units';
import { fmt } from '../../contracts/format/figures';

describe('one rounding rule for figures shown against a target', () => {
  it('never shows a figure short of a minimum as the minimum (79.8 % against 80 %)', () => {
    expect(roundTowardFailing(79.8, 0, 'min')).toBe(79);
    expect(roundTowardFailing(79.96, 1, 'min')).toBe(79.9);
    expect(formatPercent(0.798, 0, 'min')).toBe('79 %');
    expect(formatPercent(0.798, 1, 'min')).toBe('79.8 %');
    expect(formatPercent(0.7996, 1, 'min')).toBe('79.9 %');
    expect(fmt.percent(0.7996, 'min')).toBe('79.9 %');
    // the plain rounding the rule replaces would have said "80 %"
    expect(formatPercent(0.798, 0)).toBe('80 %');
  });

  it('never shows a figure over a maximum as the maximum (120.04 m against a 120 m limit)', () => {
    expect(fmt.metres(120.04, 'max')).toBe('120.1 m');
    expect(formatLength(120.04, 'metric', 0, 'max')).toBe('121 m');
    expect(formatGsd(3.3001, 2, 'max')).toBe('3.31 cm');
    expect(fmt.metres(119.96, 'min')).toBe('119.9 m');
  });

  it('shows a figure exactly on its target as the target, whatever the float noise', () => {
    expect(formatPercent(0.8, 0, 'min')).toBe('80 %'); // 0.8 * 100 = 80.00000000000001
    expect(formatPercent(0.7, 1, 'min')).toBe('70.0 %'); // 0.7 * 100 = 70.00000000000001
    expect(fmt.percent(0.29, 'min')).toBe('29.0 %'); // 0.29 * 100 = 28.999999999999996
    expect(fmt.metres(120, 'max')).toBe('120.0 m');
    expect(roundTowardFailing(2.7, 2, 'max')).toBe(2.7);
  });
});
