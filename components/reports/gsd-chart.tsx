/** GSD along one flight line where no SVG is available (native): the figures in words; the web build draws the chart. */
import { Text } from '../ui';
import type { GsdChartProps } from './gsd-chart-props';

/** A one-line summary so the screen never shows an empty box. */
export function GsdChart({ series, bandCm, lineNumber, testID }: GsdChartProps) {
  const known = series.filter((p) => p.gsdCm !== null).length;
  return (
    <Text tone="muted" testID={testID}>
      Line {lineNumber}: {known} of {series.length} stations with a GSD; target band {bandCm[0].toFixed(2)}–{bandCm[1].toFixed(2)} cm.
    </Text>
  );
}
