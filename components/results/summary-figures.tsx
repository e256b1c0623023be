/** The plan-wide figures: photos, flight time, batteries, the share of stations within the GSD target, and more. */
import { StyleSheet, View } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import type { PlanSummary } from '../../terrain/plan';
import { formatCount, formatDuration, formatGsd, formatLength, formatPercent } from '../projects/units';
import { colors, layout, radii, space } from '../theme';
import { useBreakpoint } from '../layout/use-breakpoint';
import { Text } from '../ui';

function Figure({ label, value, note, testID }: { label: string; value: string; note?: string; testID?: string }) {
  const phone = useBreakpoint() === 'phone';
  return (
    <View style={[styles.figure, { flexBasis: phone ? '45%' : '22%' }]} testID={testID}>
      <Text variant="caption" tone="muted">{label}</Text>
      <Text variant="title">{value}</Text>
      {note ? <Text variant="caption" tone="muted" testID={testID ? `${testID}-note` : undefined}>{note}</Text> : null}
    </View>
  );
}

export function SummaryFigures({ summary, units }: { summary: PlanSummary; units: UnitSystem }) {
  const s = summary;
  return (
    <View style={styles.grid} testID="summary-figures">
      <Figure label="Photos" value={formatCount(s.photoCount)} note={`${s.lineCount} lines`} testID="summary-photos" />
      <Figure label="Flight time" value={formatDuration(s.flightTimeS)} note={`${formatLength(s.flightDistanceM, units)} flown`} testID="summary-time" />
      <Figure label="Batteries" value={formatCount(s.batteries)} note="at least, with the reserve kept; the leg sheet packs the lines" testID="summary-batteries" />
      {/* figures against a target are rounded toward failing (contracts/target-rounding.ts); overlaps with one decimal */}
      <Figure label="Within the GSD target" value={formatPercent(s.shareWithinGsdTarget, 1, 'min')} note={`band ${formatGsd(s.gsdBandCm.min)} – ${formatGsd(s.gsdBandCm.max)}`} testID="summary-share" />
      <Figure label="GSD min / median / max" value={`${formatGsd(s.gsdCm.min, 2, 'min')} / ${formatGsd(s.gsdCm.median)} / ${formatGsd(s.gsdCm.max, 2, 'max')}`} />
      <Figure label="Least overlap forward / side" value={`${formatPercent(s.forwardOverlapMin, 1, 'min')} / ${formatPercent(s.sideOverlapMin, 1, 'min')}`} note="as planned" testID="summary-overlap" />
      {/* beside it the same as guaranteed under the attitude envelope; without one, said so rather than a figure */}
      {s.overlapEnvelope ? (
        <Figure label="Least overlap, guaranteed" value={`${formatPercent(s.forwardOverlapGuaranteedMin, 1, 'min')} / ${formatPercent(s.sideOverlapGuaranteedMin, 1, 'min')}`} note={`under ${s.overlapEnvelope.words}`} testID="summary-overlap-guaranteed" />
      ) : (
        <Figure label="Least overlap, guaranteed" value="as planned only" note="no attitude envelope in the mission" testID="summary-overlap-guaranteed" />
      )}
      <Figure label="Height above ground" value={`${formatLength(s.aglMinM, units, 0, 'min')} – ${formatLength(s.aglMaxM, units, 0, 'max')}`} note={`planned ${formatLength(s.plannedHeightM, units)}`} />
      <Figure label="Photos off target" value={formatCount(s.flaggedStationCount)} note={s.unmetLengthM > 0 ? `band not held over ${formatLength(s.unmetLengthM, units)}` : 'band held on every line'} />
    </View>
  );
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  figure: {
    flexGrow: 1,
    gap: space.xxs,
    padding: space.md,
    borderRadius: radii.md,
    borderWidth: layout.borderWidthPx,
    borderColor: colors.line,
    backgroundColor: colors.surface,
  },
});
