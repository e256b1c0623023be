/**
 * How Loftline laid the lines out (versions whose mission asks the solver): the proof over the reachable cells, the
 * flight time against the best uniform setting tried, ground no plan can meet and why, and each line's reasons.
 */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { SolveReportData } from '../../contracts/solve';
import { areaWords, shareWords } from '../../contracts/coverage-words';
import { formatDuration } from '../projects/units';
import { BulletList } from '../reports/bullet-list';
import { FigureGrid } from '../reports/figure-grid';
import { space } from '../theme';
import { Badge, Button, Card, Heading, Text } from '../ui';
import { SolvedVersusOwn } from './solved-versus-own';

/** Lines shown before "Show all lines". */
const FIRST_LINES = 4;

export function SolvedCard({ solved: s, plan }: { solved: SolveReportData; plan: { flightTimeS: number; photoCount: number; batteries: number } }) {
  const [all, setAll] = useState(false);
  const c = s.comparison;
  const lines = all ? s.choices.lines : s.choices.lines.slice(0, FIRST_LINES);
  const spots = s.choices.lines.filter((l) => l.kind === 'spot').length;
  // a lattice's second set of lines, across the first
  const secondSet = s.choices.lines.filter((l) => l.kind === 'line' && l.set === 2).length;
  return (
    <Card testID="solved-card">
      <Heading level={2}>How Loftline laid the lines out</Heading>
      <View style={styles.headline}>
        <Badge label={s.proof.meets ? 'Meets the spec' : 'Short of the spec'} tone={s.proof.meets ? 'success' : 'danger'} testID="solved-verdict" />
        <Text variant="bodyStrong" testID="solved-proof">
          {shareWords(s.proof.shareReachableMeeting)} of the reachable cells meet every item ({s.proof.reachableCells} of {s.proof.cellsInArea} cells of {s.proof.cellM} m are reachable).
        </Text>
      </View>
      <Text tone="muted">Proof: {s.proof.basis}.</Text>
      <FigureGrid
        testID="solved-comparison"
        figures={[
          { key: 'solved', label: 'Flight time, solved', value: formatDuration(c.solvedFlightTimeS) },
          { key: 'uniform', label: 'Best uniform setting tried', value: c.bestUniformFlightTimeS === null ? 'none meets the spec' : formatDuration(c.bestUniformFlightTimeS) },
          { key: 'ratio', label: 'Solved ÷ uniform', value: c.ratio === null ? '–' : c.ratio.toFixed(2) },
          { key: 'lines', label: secondSet ? 'Lines (first set + second set across it)' : 'Lines', value: secondSet ? `${s.choices.lines.length - spots - secondSet} + ${secondSet}` : String(s.choices.lines.length - spots) },
          { key: 'spots', label: 'Spot photos (one photo straight above short ground)', value: String(spots) },
        ]}
      />
      <SolvedVersusOwn solved={s} plan={plan} />
      <Text testID="solved-heading">Heading: {s.choices.heading}</Text>
      <Text>Pattern: {s.choices.pattern}</Text>
      {s.choices.tightening ? <Text testID="solved-tightening">Tightening: {s.choices.tightening}</Text> : null}
      {s.choices.fallback ? <Text tone="caution">{s.choices.fallback}</Text> : null}
      {s.unreachable.length ? (
        <View style={styles.block} testID="solved-unreachable">
          <Heading level={3}>Ground no plan of this pattern can meet</Heading>
          <BulletList items={s.unreachable.slice(0, 5).map((u) => `${areaWords(u.areaM2)} near ${u.centroid.lat.toFixed(5)}, ${u.centroid.lon.toFixed(5)}: ${u.message}`)} />
        </View>
      ) : null}
      {s.proof.short.length ? (
        <View style={styles.block} testID="solved-short">
          <Heading level={3}>Reachable ground still short</Heading>
          <BulletList items={s.proof.short.slice(0, 5).map((g) => `${areaWords(g.areaM2)}: ${g.message}`)} tone="caution" />
        </View>
      ) : null}
      <View style={styles.block} testID="solved-lines">
        <Heading level={3}>Why each line is where it is</Heading>
        {lines.map((l) => (
          <View key={l.line} style={styles.line}>
            <Text variant="bodyStrong">Line {l.line}{l.kind === 'spot' ? ' · spot photo' : secondSet ? ` · set ${l.set}` : ''}</Text>
            <BulletList items={l.reasons} />
          </View>
        ))}
        {s.choices.lines.length > FIRST_LINES ? (
          <Button size="compact" variant="secondary" label={all ? 'Show the first lines only' : `Show all ${s.choices.lines.length} lines${spots ? ` (${spots} of them spot photos)` : ''}`} onPress={() => setAll(!all)} testID="solved-lines-toggle" />
        ) : null}
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  headline: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  block: { gap: space.xs },
  line: { gap: space.xs },
});
