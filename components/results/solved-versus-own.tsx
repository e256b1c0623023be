/**
 * The solved plan beside the plan the mission's own settings give (its overlaps and altitude mode, the same heading):
 * flight time, photos, batteries and the reachable cells that meet the spec, as the solver checked them.
 */
import { StyleSheet, View } from 'react-native';
import type { SolveReportData } from '../../contracts/solve';
import { shareWords } from '../../contracts/coverage-words';
import { formatDuration } from '../projects/units';
import { layout, space } from '../theme';
import { Heading, Text } from '../ui';

type Uniform = SolveReportData['comparison']['uniform'][number];

/** What the proof says of the own settings' plan: a share when its raster was worked out whole. */
function ownShare(u: Uniform): string {
  if (u.shareReachable !== null) return `${shareWords(u.shareReachable)}${u.meets ? ' (meets the spec)' : ''}`;
  if (u.meets === false) return 'short of the spec';
  return 'not checked (flies longer)';
}

export function SolvedVersusOwn({ solved, plan }: { solved: SolveReportData; plan: { flightTimeS: number; photoCount: number; batteries: number } }) {
  // the mission's own overlaps and mode come first among the settings compared
  const own = solved.comparison.uniform[0];
  if (!own) return null;
  const pct = (v: number) => `${Math.round(v * 100)} %`;
  const rows: Array<[string, string, string]> = [
    ['Flight time', formatDuration(plan.flightTimeS), formatDuration(own.flightTimeS)],
    ['Photos', String(plan.photoCount), own.photoCount === undefined ? '–' : String(own.photoCount)],
    ['Batteries', String(plan.batteries), own.batteries === undefined ? '–' : String(own.batteries)],
    ['Reachable cells meeting the spec', shareWords(solved.proof.shareReachableMeeting), ownShare(own)],
  ];
  return (
    <View style={styles.block} testID="solved-versus-own">
      <Heading level={3}>Solved plan beside your settings</Heading>
      <Text variant="caption" tone="muted">
        Your settings: forward {pct(own.setting.forwardOverlap)}, side {pct(own.setting.sideOverlap)}, {own.setting.mode}, {own.setting.headingDeg}°, over the same area and spec. The solver stops checking a setting at its first short cell, so a share is given only where none is short; one that flies longer than the solved plan is not checked.
      </Text>
      <View role="table" aria-label="Solved plan beside your settings" style={styles.table}>
        <View role="row" style={styles.row}>
          {['', 'Solved', 'Your settings'].map((h, k) => (
            <Text key={k} role="columnheader" variant="label" tone="muted" style={styles.cell}>{h}</Text>
          ))}
        </View>
        {rows.map(([label, a, b]) => (
          <View key={label} role="row" style={styles.row}>
            <Text role="rowheader" variant="bodyStrong" style={styles.cell}>{label}</Text>
            <Text role="cell" style={styles.cell}>{a}</Text>
            <Text role="cell" style={styles.cell}>{b}</Text>
          </View>
        ))}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  block: { gap: space.xs },
  table: { gap: space.xxs },
  row: { flexDirection: 'row', gap: space.sm },
  cell: { flex: 1, minWidth: layout.inlineLabelPx / 2, flexShrink: 1 },
});
