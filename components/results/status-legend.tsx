/** The legend of station statuses: marker shape, colour, name, count and meaning, so colour is never the only cue. */
import { StyleSheet, View } from 'react-native';
import { MarkerGlyph } from '../map/marker-glyph';
import { space } from '../theme';
import { Text } from '../ui';
import { statusLooks } from './station-status';
import { stationStatuses, type StationStatus } from '../../contracts/station-status';

export function StatusLegend({ counts, compact }: { counts: Record<StationStatus, number>; compact?: boolean }) {
  // Worst first reads as a checklist; statuses with no station are still listed so the scheme is always complete.
  const order = [...stationStatuses].reverse();
  return (
    <View role="list" aria-label="What the station markers mean" style={styles.list} testID="status-legend">
      {order.map((s) => (
        <View key={s} role="listitem" style={styles.item} testID={`legend-${s}`}>
          <MarkerGlyph shape={statusLooks[s].shape} color={statusLooks[s].color} />
          <View style={styles.words}>
            <Text variant="label">
              {statusLooks[s].label}: {counts[s]}
            </Text>
            {compact ? null : (
              <Text variant="caption" tone="muted">
                {statusLooks[s].meaning}
              </Text>
            )}
          </View>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.xs },
  item: { flexDirection: 'row', alignItems: 'flex-start', gap: space.sm },
  words: { flex: 1, gap: space.xxs },
});
