/** Named breakpoints for the app's layouts, from the window width alone. */

export type Breakpoint = 'phone' | 'tablet' | 'wide';

/** Lower bounds in CSS px: tablet from 768, wide (side navigation) from 1024. */
export const breakpointMinWidthPx = { tablet: 768, wide: 1024 } as const;

/** The breakpoint for a window `widthPx` wide; throws on a width that is not a finite number ≥ 0. */
export function breakpointFor(widthPx: number): Breakpoint {
  if (!Number.isFinite(widthPx) || widthPx < 0) {
    throw new RangeError(`breakpointFor: expected a finite width >= 0 px, got ${widthPx}`);
  }
  if (widthPx >= breakpointMinWidthPx.wide) return 'wide';
  if (widthPx >= breakpointMinWidthPx.tablet) return 'tablet';
  return 'phone';
}

/** Whether the layout shows the side navigation column (wide) instead of the bottom tab bar. */
export function usesSideNav(breakpoint: Breakpoint): boolean {
  return breakpoint === 'wide';
}
