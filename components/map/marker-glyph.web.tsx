/** One marker shape as a small inline SVG, for legends and table cells (the same drawing as on the map). */
import { colors } from '../theme';
import type { MarkerShape } from '../results/station-status';
import { markerPath } from './map-shapes';

export function MarkerGlyph({ shape, color, sizePx = 14 }: { shape: MarkerShape; color: string; sizePx?: number }) {
  const r = sizePx / 2 - 1.5;
  const c = sizePx / 2;
  const d = markerPath(shape, c, c, r);
  return (
    <svg width={sizePx} height={sizePx} viewBox={`0 0 ${sizePx} ${sizePx}`} aria-hidden style={{ flexShrink: 0 }}>
      {shape === 'cross' ? <path d={d} stroke={color} strokeWidth={2.2} strokeLinecap="round" /> : <path d={d} fill={color} stroke={colors.ink} strokeWidth={1} />}
    </svg>
  );
}
