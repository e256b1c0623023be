/** Native builds draw no sketch yet (Loftline ships for the web; see lines-sketch-card.web.tsx). */
import type { LegSheet } from '../../contracts/flights';

export function LinesSketchCard(_props: { sheet: Pick<LegSheet, 'lines' | 'datum'> }) {
  return null;
}
