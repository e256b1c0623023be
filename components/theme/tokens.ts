/** Design tokens: the only place colours, spacing, radii, type sizes and font families are written down. */

/**
 * Palette: light, calm and high in contrast so screens stay readable in sunlight on a field laptop or phone.
 * Contrast by the WCAG 2.2 relative-luminance formula: ink on surface 16.6:1, inkMuted on canvas 7.3:1,
 * white on primary 8.0:1, each tone on its soft fill ≥ 5.8:1 (AA asks 4.5:1 for body text).
 */
export const colors = {
  canvas: '#F2F4F1',
  surface: '#FFFFFF',
  surfaceSunken: '#E7EBE7',
  line: '#C3CBC6',
  lineStrong: '#8C9892',
  ink: '#13202A',
  inkMuted: '#44525C',
  inkInverse: '#FFFFFF',
  primary: '#0D5A55',
  primaryPressed: '#08403C',
  primarySoft: '#DAECE8',
  focus: '#1B6FD1',
  caution: '#7A4A00',
  cautionSoft: '#FFF2CF',
  cautionLine: '#C9901C',
  danger: '#A1232A',
  dangerSoft: '#FBE3E1',
  success: '#1D6638',
  successSoft: '#DFF0E4',
  info: '#1C4A75',
  infoSoft: '#E1EBF5',
  disabledInk: '#6B7680',
  disabledFill: '#DCE1DE',
} as const;
export type ColorName = keyof typeof colors;

/** Spacing scale in px (a 4-px grid). */
export const space = {
  none: 0,
  xxs: 2,
  xs: 4,
  sm: 8,
  md: 12,
  lg: 16,
  xl: 24,
  xxl: 32,
  xxxl: 48,
} as const;
export type SpaceName = keyof typeof space;

/** Corner radii in px. */
export const radii = {
  sm: 4,
  md: 8,
  lg: 12,
  pill: 999,
} as const;

/** The shipped faces, by the names their @font-face rules declare (see scripts/lib/web-fonts.ts). */
export const fontFaces = {
  regular: 'Inter_400Regular',
  medium: 'Inter_500Medium',
  semibold: 'Inter_600SemiBold',
  bold: 'Inter_700Bold',
  mono: 'JetBrainsMono_400Regular',
  monoMedium: 'JetBrainsMono_500Medium',
} as const;

// Until a face arrives (font-display: swap) text paints in the system's own font, so fonts never hold up a screen.
const sansFallback = 'system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif';
const monoFallback = 'ui-monospace, Menlo, Consolas, "DejaVu Sans Mono", monospace';

/** Font stacks for styles: the shipped face first, then the system fallbacks. */
export const fontFamilies = {
  regular: `${fontFaces.regular}, ${sansFallback}`,
  medium: `${fontFaces.medium}, ${sansFallback}`,
  semibold: `${fontFaces.semibold}, ${sansFallback}`,
  bold: `${fontFaces.bold}, ${sansFallback}`,
  mono: `${fontFaces.mono}, ${monoFallback}`,
  monoMedium: `${fontFaces.monoMedium}, ${monoFallback}`,
} as const;

/** Type scale: size and line height in px, with the family that carries the weight. */
export const typeScale = {
  caption: { fontSize: 13, lineHeight: 18, fontFamily: fontFamilies.regular },
  label: { fontSize: 14, lineHeight: 20, fontFamily: fontFamilies.medium },
  body: { fontSize: 16, lineHeight: 24, fontFamily: fontFamilies.regular },
  bodyStrong: { fontSize: 16, lineHeight: 24, fontFamily: fontFamilies.semibold },
  title: { fontSize: 19, lineHeight: 26, fontFamily: fontFamilies.semibold },
  heading: { fontSize: 24, lineHeight: 32, fontFamily: fontFamilies.bold },
  display: { fontSize: 30, lineHeight: 38, fontFamily: fontFamilies.bold },
  mono: { fontSize: 14, lineHeight: 20, fontFamily: fontFamilies.mono },
} as const;
export type TypeVariant = keyof typeof typeScale;

/** Layout sizes in px. */
export const layout = {
  /** Content never runs wider than this on wide screens: long lines are hard to read. */
  maxContentWidthPx: 960,
  /** Forms sit in a narrower column. */
  maxFormWidthPx: 440,
  sideNavWidthPx: 248,
  tabBarHeightPx: 64,
  topBarHeightPx: 56,
  /** Minimum touch target (WCAG 2.5.5 asks for 44 px). */
  minTouchPx: 44,
  /** Height of compact controls inside dense rows (still ≥ the 24 px minimum of WCAG 2.5.8). */
  compactControlPx: 36,
  /** Width of a short label column beside a value (e.g. the role beside a demo e-mail). */
  inlineLabelPx: 72,
  borderWidthPx: 1,
  focusRingPx: 2,
} as const;

/** Opacity for controls that cannot be used right now. */
export const opacity = { disabled: 0.6 } as const;
