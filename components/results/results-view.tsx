/** A finished analysis: summary, overview map with legend, lines table and the chosen line's chart (side by side when wide). */
import { StyleSheet, View } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import type { PlanResult } from '../../terrain/plan';
import { ProfileChart } from '../charts/profile-chart';
import { useBreakpoint } from '../layout/use-breakpoint';
import type { ImageGeoref } from '../map/image-georef';
import { MapCanvas } from '../map/map-canvas';
import { space } from '../theme';
import { Banner, Card, Heading, Text } from '../ui';
import { CoverageCard } from '../coverage/coverage-card';
import { LiveCoverageMapCard } from '../coverage/live-coverage-map-card';
import type { HillshadeInfo } from '../../contracts/sites';
import { HeadingAdvice } from './heading-advice';
import { LinesTable } from './lines-table';
import { StatusLegend } from './status-legend';
import { SummaryFigures } from './summary-figures';
import { useResultsView } from './use-results-view';

export type ResultsViewProps = {
  result: PlanResult;
  area: number[][][] | null;
  georef: ImageGeoref;
  hillshadeUrl: string;
  units: UnitSystem;
  clearanceTotalM: number;
  datum: string;
  /** The version whose coverage of every ground cell is shown (with the site's hillshade placement). */
  coverage?: { teamId: string | undefined; planId: string; versionId: string; hillshade: HillshadeInfo; signedOff?: boolean };
};

/** Standing cautions are shown once by FlightCautions; the rest of the engine's warnings are listed in its words. */
const standingCodes = new Set(['bare-earth', 'local-rules', 'wind']);

export function ResultsView({ result, area, georef, hillshadeUrl, units, clearanceTotalM, datum, coverage }: ResultsViewProps) {
  const v = useResultsView(result, area, georef);
  const breakpoint = useBreakpoint();
  const wide = breakpoint === 'wide';
  const warnings = result.warnings.filter((w) => !standingCodes.has(w.code));

  const overview = (
    <Card testID="results-overview">
      <Heading level={2}>Overview</Heading>
      <Text variant="caption" tone="muted">
        Every photo position, by whether it meets the targets over the real terrain. Tap a line to see its profile.
      </Text>
      <MapCanvas imageUrl={hillshadeUrl} widthPx={georef.widthPx} heightPx={georef.heightPx} shapes={v.shapes} view={v.view} onTap={v.onMapTap} label={`Overview of ${result.lines.length} flight lines and ${result.summary.photoCount} photo positions on the hillshade.`} testID="results-map" />
      <StatusLegend counts={v.counts} compact={!wide} />
    </Card>
  );
  const proof = coverage ? (
    <>
      <CoverageCard {...coverage} georef={georef} hillshadeUrl={hillshadeUrl} baseShapes={v.shapes} view={v.view} />
      {coverage.signedOff ? (
        <LiveCoverageMapCard teamId={coverage.teamId} versionId={coverage.versionId} hillshade={coverage.hillshade} hillshadeUrl={hillshadeUrl} georef={georef} baseShapes={v.shapes} view={v.view} units={units} />
      ) : null}
    </>
  ) : null;
  const chart = v.selectedLine ? (
    <Card testID="results-chart">
      <ProfileChart line={v.selectedLine} clearanceTotalM={clearanceTotalM} units={units} datum={datum} heightPx={wide ? 300 : 240} />
    </Card>
  ) : null;
  const table = (
    <Card testID="results-lines">
      <Heading level={2}>Flight lines</Heading>
      <Text variant="caption" tone="muted">
        In flying order; the mark by each line is the worst status among its photos (see the legend). Choose a line to see its profile.
      </Text>
      <LinesTable layout={wide ? 'table' : 'list'} rows={v.rows} units={units} sortKey={v.sortKey} sortDir={v.sortDir} onSort={v.onSort} selected={v.selected} onSelect={v.setSelected} envelope={result.summary.overlapEnvelope?.words ?? null} />
    </Card>
  );
  const extras = (
    <>
      {result.headingAdvice ? <HeadingAdvice advice={result.headingAdvice} units={units} /> : null}
      {warnings.length > 0 ? (
        <Banner tone="caution" title="Warnings for this plan" testID="plan-warnings">
          {warnings.map((w) => (
            <Text key={`${w.code}-${w.message}`}>• {w.message}</Text>
          ))}
        </Banner>
      ) : null}
    </>
  );
  return (
    <View style={styles.body} testID="results-view">
      <SummaryFigures summary={result.summary} units={units} />
      {wide ? (
        <View style={styles.row}>
          <View style={styles.left}>
            {overview}
            {proof}
            {extras}
          </View>
          <View style={styles.right}>
            {chart}
            {table}
          </View>
        </View>
      ) : (
        <>
          {overview}
          {proof}
          {chart}
          {table}
          {extras}
        </>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  body: { gap: space.xl },
  row: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  left: { flex: 4, minWidth: 0, gap: space.xl },
  right: { flex: 6, minWidth: 0, gap: space.xl },
});
