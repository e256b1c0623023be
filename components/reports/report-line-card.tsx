/** One flight line of the compliance report: its figures, warnings and the GSD-along-the-line chart. */
import type { ReportLine } from '../../contracts/reports';
import { Banner, Card, Heading } from '../ui';
import { BulletList } from './bullet-list';
import { FigureGrid } from './figure-grid';
import { GsdChart } from './gsd-chart';
import { lineFigures } from './report-figures';

/** A card per line; the chart shows where the GSD leaves the accepted band. */
export function ReportLineCard({ line, bandCm, targetCm }: { line: ReportLine; bandCm: readonly [number, number]; targetCm: number }) {
  return (
    <Card testID={`report-line-${line.number}`}>
      <Heading level={3}>Line {line.number}</Heading>
      <FigureGrid figures={lineFigures(line)} testID={`line-${line.number}`} />
      {line.warnings.length ? (
        <Banner tone="caution" title="On this line">
          <BulletList items={line.warnings} tone="caution" />
        </Banner>
      ) : null}
      <GsdChart series={line.gsdSeries} bandCm={bandCm} targetCm={targetCm} lineNumber={line.number} testID={`gsd-chart-${line.number}`} />
    </Card>
  );
}
