import { describe, expect, it } from 'vitest';
import { breakpointFor, breakpointMinWidthPx, usesSideNav } from '../../components/layout/breakpoints';

describe('breakpointFor', () => {
  it('calls a 390 px phone window "phone"', () => {
    expect(breakpointFor(390)).toBe('phone');
  });

  it('calls 0 px "phone" (a window not laid out yet)', () => {
    expect(breakpointFor(0)).toBe('phone');
  });

  it('switches to "tablet" exactly at 768 px and not one pixel before', () => {
    expect(breakpointFor(breakpointMinWidthPx.tablet - 1)).toBe('phone');
    expect(breakpointFor(767.5)).toBe('phone');
    expect(breakpointFor(768)).toBe('tablet');
  });

  it('switches to "wide" exactly at 1024 px and not one pixel before', () => {
    expect(breakpointFor(1023)).toBe('tablet');
    expect(breakpointFor(1024)).toBe('wide');
  });

  it('calls a 1440 px desktop window "wide"', () => {
    expect(breakpointFor(1440)).toBe('wide');
  });

  it('never goes back down as the width grows', () => {
    const order = { phone: 0, tablet: 1, wide: 2 } as const;
    let previous = 0;
    for (let widthPx = 0; widthPx <= 2000; widthPx += 7) {
      const rank = order[breakpointFor(widthPx)];
      expect(rank).toBeGreaterThanOrEqual(previous);
      previous = rank;
    }
  });

  it('throws on a negative, NaN or infinite width, naming the value it got', () => {
    expect(() => breakpointFor(-1)).toThrow(/got -1/);
    expect(() => breakpointFor(Number.NaN)).toThrow(/got NaN/);
    expect(() => breakpointFor(Number.POSITIVE_INFINITY)).toThrow(/got Infinity/);
  });
});

describe('usesSideNav', () => {
  it('shows the side navigation only on wide windows', () => {
    expect(usesSideNav('wide')).toBe(true);
    expect(usesSideNav('tablet')).toBe(false);
    expect(usesSideNav('phone')).toBe(false);
  });
});
