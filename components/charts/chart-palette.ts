/**
 * Colours and line styles of the profile chart. Hues from the Okabe–Ito palette (M. Okabe and K. Ito, "Color
 * Universal Design", 2008), which stays apart for the common colour-vision deficiencies; each series also has its
 * own line style, so the chart reads in greyscale too.
 */
import { colors } from '../theme';

type LineStyle = 'solid' | 'dashed' | 'dotted';

export interface SeriesLook {
  label: string;
  color: string;
  style: LineStyle;
  widthPx: number;
  /** Marker drawn at the series' own points, if any. */
  marker?: 'circle' | 'square';
}

export const seriesLooks = {
  ground: { label: 'Ground (grid surface)', color: '#000000', style: 'solid', widthPx: 2 },
  clearance: { label: 'Clearance floor', color: '#D55E00', style: 'dashed', widthPx: 1.5 },
  limit: { label: 'Height limit', color: '#CC79A7', style: 'dashed', widthPx: 2 },
  altitude: { label: 'Suggested altitude (legs)', color: '#0072B2', style: 'solid', widthPx: 2.5, marker: 'circle' },
  gsd: { label: 'GSD (right axis)', color: '#009E73', style: 'dotted', widthPx: 1.5, marker: 'square' },
} as const satisfies Record<string, SeriesLook>;

/** Axis text, gridlines and leg marks use the app's neutral tokens. */
export const chartInk = { axis: colors.inkMuted, grid: colors.line, legMark: colors.lineStrong, ink: colors.ink, groundFill: colors.surfaceSunken } as const;

/** Dash intervals (px) for the line styles. */
export const dashIntervals: Record<LineStyle, number[] | null> = { solid: null, dashed: [7, 4], dotted: [2, 3] };

/** The height limit's own dash (long dashes, short gaps), apart from the clearance floor's. */
export const limitDash = [14, 4];
