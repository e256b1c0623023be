/**
 * A finished analysis: what needs attention and where, the summary, the overview map with legend, the lines and
 * the chosen line's chart (beside the table when wide; right under the chosen line's card on phones), brought into
 * view when a line is chosen.
 */
import { useEffect, useRef } from 'react';
import { StyleSheet, View } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import type { ResultOverview } from '../../contracts/result-parts';
import { errorMessage } from '../api/api-error';
import { useVersionLine } from '../plans/plans.queries';
import { ProfileChart } from '../charts/profile-chart';
import { useBreakpoint } from '../layout/use-breakpoint';
import type { ImageGeoref } from '../map/image-georef';
import { MapCanvas } from '../map/map-canvas';
import { space } from '../theme';
import { Banner, Card, Heading, Loading, Text } from '../ui';
import { AttentionCard } from './attention-card';
import { CoverageCard } from '../coverage/coverage-card';
import { LiveCoverageMapCard } from '../coverage/live-coverage-map-card';
import type { HillshadeInfo } from '../../contracts/sites';
import { HeadingAdvice } from './heading-advice';
import { LinesTable } from './lines-table';
import { StatusLegend } from './status-legend';
import { SummaryFigures } from './summary-figures';
import { useResultsView } from './use-results-view';

type ResultsViewProps = {
  result: ResultOverview;
  /** The version the result belongs to: a chosen line's stations are fetched from it. */
  source: { teamId: string | undefined; planId: string; versionId: string };
  area: number[][][] | null;
  georef: ImageGeoref;
  hillshadeUrl: string;
  units: UnitSystem;
  clearanceTotalM: number;
  datum: string;
  /** The mission's maximum height above ground (m), drawn on the profile chart. */
  maxAglM?: number | null;
  /** The version whose coverage of every ground cell is shown (with the site's hillshade placement). */
  coverage?: { teamId: string | undefined; planId: string; versionId: string; hillshade: HillshadeInfo; signedOff?: boolean };
};

/** Scroll a React Native Web view (a DOM element on the web) into view. */
function bringIntoView(el: unknown, block: 'start' | 'nearest'): void {
  const node = el as { scrollIntoView?: (o: ScrollIntoViewOptions) => void } | null;
  node?.scrollIntoView?.({ block, behavior: 'auto' });
}

export function ResultsView({ result, source, area, georef, hillshadeUrl, units, clearanceTotalM, datum, coverage, maxAglM }: ResultsViewProps) {
  const v = useResultsView(result, area, georef);
  const line = useVersionLine(source.teamId, source.planId, source.versionId, v.selected);
  const fullLine = line.data?.line.index === v.selected ? line.data.line : null;
  const breakpoint = useBreakpoint();
  const wide = breakpoint === 'wide';
  const chartRef = useRef<View>(null);
  const chosenRef = useRef<View>(null);
  // a line chosen by a tap (card, row or map) brings its chart into view, once it is drawn in its new place
  useEffect(() => {
    if (v.chooseCount === 0) return;
    const id = requestAnimationFrame(() => (wide ? bringIntoView(chartRef.current, 'nearest') : bringIntoView(chosenRef.current, 'start')));
    return () => cancelAnimationFrame(id);
  }, [v.chooseCount, wide]);
  const notes = v.rows.find((r) => r.index === v.selected)?.warnings ?? [];

  const overview = (
    <Card testID="results-overview">
      <Heading level={2}>Overview</Heading>
      <Text variant="caption" tone="muted">
        Every photo position, by whether it meets the targets over the real terrain. Tap a line to see its profile.
      </Text>
      <MapCanvas imageUrl={hillshadeUrl} widthPx={georef.widthPx} heightPx={georef.heightPx} shapes={v.shapes} view={v.view} onTap={v.onMapTap} georef={georef} label={`Overview of ${result.lines.length} flight lines and ${result.summary.photoCount} photo positions on the hillshade.`} testID="results-map" />
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
    <View ref={chartRef}>
      <Card testID="results-chart">
        {fullLine ? (
          <ProfileChart line={fullLine} clearanceTotalM={clearanceTotalM} units={units} datum={datum} heightPx={wide ? 300 : 240} maxAglM={maxAglM} />
        ) : line.isError ? (
          <Banner tone="danger" title={`Could not load line ${v.selectedLine.index + 1}`} message={errorMessage(line.error)} />
        ) : (
          <Loading label={`Loading line ${v.selectedLine.index + 1}…`} />
        )}
        {notes.length ? (
          <View role="list" aria-label={`Notes on line ${v.selectedLine.index + 1}`} style={styles.notes} testID="results-chart-notes">
            <Heading level={3}>Notes on line {v.selectedLine.index + 1}</Heading>
            {notes.map((n, i) => (
              <Text key={i} role="listitem" variant="caption">
                ⚠ {n}
              </Text>
            ))}
          </View>
        ) : null}
      </Card>
    </View>
  ) : null;
  const table = (
    <Card testID="results-lines">
      <Heading level={2}>Flight lines</Heading>
      <Text variant="caption" tone="muted">
        In flying order; the mark by each line is the worst status among its photos (see the legend). Choose a line to see its profile.
      </Text>
      <LinesTable layout={wide ? 'table' : 'list'} rows={v.rows} units={units} sortKey={v.sortKey} sortDir={v.sortDir} onSort={v.onSort} selected={v.selected} onSelect={v.choose} envelope={result.summary.overlapEnvelope?.words ?? null} selectedDetail={wide ? undefined : chart} selectedRef={chosenRef} />
    </Card>
  );
  // the engine's warnings are said once, in the summary of what needs attention at the top
  const extras = result.headingAdvice ? <HeadingAdvice advice={result.headingAdvice} units={units} /> : null;
  return (
    <View style={styles.body} testID="results-view">
      <AttentionCard result={result} />
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
          {table}
          {proof}
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
  notes: { gap: space.xs },
});
