/** The standard cautions every flight-facing screen and export carries. */
import { StyleSheet, View } from 'react-native';
import { space } from '../theme';
import { Banner, Text } from '../ui';

/** The caution lines, also used by exports so the wording stays the same everywhere. */
export const flightCautions: readonly string[] = [
  'Elevation grids are often bare-earth models: they miss trees, masts, power lines and buildings. Check obstacles on site.',
  'Local altitude limits and visual line-of-sight rules apply, whatever the plan says.',
  'Wind moves the aircraft off the planned lines and changes its ground speed; overlap and height above ground change with it.',
  'Local regulations and licensed practice govern every flight. This plan is an aid to them, not a permission.',
];

/** A caution banner with the standard list; `compact` shows the first sentence of each line. */
export function FlightCautions({ compact = false }: { compact?: boolean }) {
  return (
    <Banner tone="caution" title="Before you fly" testID="flight-cautions">
      <View style={styles.list} role="list">
        {flightCautions.map((line) => (
          <View key={line} role="listitem" style={styles.item}>
            <Text tone="caution" aria-hidden>
              •
            </Text>
            <Text style={styles.line}>{compact ? firstSentence(line) : line}</Text>
          </View>
        ))}
      </View>
    </Banner>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.xs },
  item: { flexDirection: 'row', gap: space.sm },
  line: { flex: 1 },
});

/** The first sentence of a caution, ending in exactly one full stop. */
function firstSentence(line: string): string {
  return `${line.split('. ')[0].replace(/\.$/, '')}.`;
}
