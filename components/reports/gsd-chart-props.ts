/** Props shared by the web and native GSD charts. */
import type { GsdPoint } from './gsd-chart-geometry';

export type GsdChartProps = {
  series: readonly GsdPoint[];
  bandCm: readonly [number, number];
  targetCm: number;
  lineNumber: number;
  testID?: string;
};
