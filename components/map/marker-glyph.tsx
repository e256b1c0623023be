/** Native fallback of the marker glyph: the shape as a character in its colour. */
import { Text } from '../ui';
import type { MarkerShape } from '../results/station-status';

const glyphs: Record<MarkerShape, string> = { circle: '●', square: '■', triangle: '▲', diamond: '◆', cross: '✕' };

export function MarkerGlyph({ shape, color }: { shape: MarkerShape; color: string; sizePx?: number }) {
  return (
    <Text aria-hidden style={{ color }}>
      {glyphs[shape]}
    </Text>
  );
}
