/** One line's profile chart with its legend and leg list; Skia (CanvasKit) loads in the browser only after mount. */
import { lazy, Suspense, useEffect, useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import type { PlanLine } from '../../terrain/plan';
import { formatLength, lengthUnit } from '../projects/units';
import { colors, layout, radii, space } from '../theme';
import { Heading, Loading, Text } from '../ui';
import { seriesLooks, type SeriesLook } from './chart-palette';
import type { ProfileChartCanvasProps } from './profile-chart-canvas';
import { profileSeries } from './profile-series';

// Skia, CanvasKit's loader and victory-native sit in an async chunk that only chart pages fetch.
const SkiaChartHost = lazy(() => import('./skia-chart-host'));

function LegendItem({ look, testID }: { look: SeriesLook; testID?: string }) {
  return (
    <View style={styles.legendItem} testID={testID}>
      <View style={[styles.sample, { borderTopColor: look.color, borderTopWidth: look.widthPx + 1, borderStyle: look.style }]} />
      <Text variant="caption" style={styles.legendText}>{look.label}</Text>
    </View>
  );
}

type ProfileChartProps = {
  line: PlanLine;
  clearanceTotalM: number;
  units: UnitSystem;
  /** The grid's vertical datum, named on the height axis. */
  datum: string;
  heightPx: number;
  /** The mission's maximum height above ground (m): drawn over the ground it applies to, when given. */
  maxAglM?: number | null;
};

/** The chart itself is a picture; the legs are also listed in words beneath it. */
export function ProfileChart({ line, clearanceTotalM, units, datum, heightPx, maxAglM }: ProfileChartProps) {
  const [mounted, setMounted] = useState(false);
  useEffect(() => setMounted(true), []);
  const series = useMemo(() => profileSeries(line, clearanceTotalM, units, maxAglM), [line, clearanceTotalM, units, maxAglM]);
  const u = lengthUnit(units);
  const compact = heightPx < 280;
  const hasLimit = typeof maxAglM === 'number' && maxAglM > 0;
  // the engine's height limit is a height above the ground under the aircraft, so it follows the ground
  const limitWords = hasLimit ? `Height limit: ${formatLength(maxAglM, units)} above ground` : null;
  // The datum can be a long name: the axis says "datum", the caption names it.
  const props: ProfileChartCanvasProps = { series, lengthUnit: u, heightTitle: `Height above datum (${u})`, heightPx, compact, limitLabel: limitWords ?? undefined };
  const fallback = (
    <View style={[styles.placeholder, { height: heightPx }]} testID="profile-chart-placeholder">
      <Loading label="Drawing the chart…" />
    </View>
  );
  return (
    <View style={styles.wrap} testID="profile-chart" aria-label={`Profile of line ${line.index + 1}`}>
      <Heading level={3}>Line {line.index + 1}: ground, altitude and GSD</Heading>
      {mounted ? (
        <Suspense fallback={fallback}>
          <SkiaChartHost {...props} fallback={fallback} />
        </Suspense>
      ) : (
        fallback
      )}
      <Text variant="caption" tone="muted">
        Heights above {datum}; GSD on the right-hand axis. Each photo position is a point on the GSD line.
        {limitWords ? ` The height limit is drawn ${formatLength(maxAglM as number, units)} above the ground under each photo position (the plan's maximum height above ground), not above takeoff or the datum.` : ''}
      </Text>
      <View style={styles.legend} testID="profile-legend">
        {Object.entries(seriesLooks).map(([key, look]) =>
          key === 'limit' ? (
            limitWords ? <LegendItem key={key} look={{ ...look, label: `${limitWords} (long dashes)` }} testID="profile-legend-limit" /> : null
          ) : (
            <LegendItem key={key} look={look} />
          ),
        )}
        <View style={styles.legendItem}>
          <View style={[styles.legSample]} />
          <Text variant="caption">Leg start (L1, L2 …)</Text>
        </View>
      </View>
      <View role="list" aria-label={`Legs of line ${line.index + 1}`} style={styles.legs}>
        {line.legs.map((leg, i) => (
          <Text key={i} role="listitem" variant="caption" tone="muted">
            L{i + 1}: {formatLength(leg.start.distanceM, units)} to {formatLength(leg.end.distanceM, units)} along the line, altitude {formatLength(leg.altitudeStartM, units)} → {formatLength(leg.altitudeEndM, units)} above {datum}
            {leg.altitudeStartAboveTakeoffM !== null ? ` (${formatLength(leg.altitudeStartAboveTakeoffM, units)} → ${formatLength(leg.altitudeEndAboveTakeoffM, units)} above takeoff)` : ''}, {formatLength(leg.aglMinM, units)}–{formatLength(leg.aglMaxM, units)} above ground
          </Text>
        ))}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  placeholder: { justifyContent: 'center', alignItems: 'center', backgroundColor: colors.surfaceSunken, borderRadius: radii.md },
  legend: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg, rowGap: space.xs },
  legendItem: { flexDirection: 'row', alignItems: 'center', gap: space.xs, maxWidth: '100%' },
  legendText: { flexShrink: 1 },
  sample: { width: space.xl, height: 0 },
  legSample: { width: 0, height: space.md, borderLeftWidth: layout.borderWidthPx, borderLeftColor: colors.lineStrong, borderStyle: 'dashed' },
  legs: { gap: space.xxs },
});
