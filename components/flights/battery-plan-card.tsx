/** The battery plan: how many packs, which lines each flies, its flight time, and packs that cannot fly a line alone. */
import { StyleSheet, View } from 'react-native';
import type { BatteryPlan } from '../../contracts/flights';
import type { UnitSystem } from '../../contracts/projects';
import { formatDuration } from '../projects/units';
import { BulletList } from '../reports/bullet-list';
import { colors, layout, space } from '../theme';
import { Badge, Card, Heading, Text } from '../ui';
import { batterySummary, packHomeLabel, packLinesLabel } from './leg-format';

/** Each pack starts and ends at the takeoff point (the server's plan); over-budget packs are marked in words; each says the altitude it flies home at. */
export function BatteryPlanCard({ plan, units }: { plan: BatteryPlan; units: UnitSystem }) {
  return (
    <Card testID="battery-plan">
      <Heading level={2}>Battery plan</Heading>
      <Text>{batterySummary(plan)}</Text>
      <View role="list" aria-label="Battery packs">
        {plan.packs.map((p, i) => (
          <View key={p.number} role="listitem" testID={`pack-${p.number}`} style={[styles.row, i < plan.packs.length - 1 && styles.divider]}>
            <View style={styles.what}>
              <Text variant="bodyStrong">Battery {p.number}</Text>
              <Text>{packLinesLabel(p.lines)}</Text>
              {packHomeLabel(p, units) ? <Text testID={`pack-${p.number}-home`}>{packHomeLabel(p, units)}</Text> : null}
            </View>
            <View style={styles.right}>
              <Text variant="bodyStrong">{formatDuration(p.flightTimeS)}</Text>
              {p.overBudget ? <Badge label="Over one battery" tone="danger" /> : null}
            </View>
          </View>
        ))}
      </View>
      {plan.notes.length ? <BulletList items={plan.notes} /> : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'center', gap: space.md, paddingVertical: space.sm },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  what: { flexShrink: 1, gap: space.xxs },
  right: { alignItems: 'flex-end', gap: space.xxs },
});
