/** The standard cautions every flight-facing screen and export carries. */
import { StyleSheet, View } from 'react-native';
import { generalCautions } from '../../contracts/cautions';
import { space } from '../theme';
import { Banner, Text } from '../ui';

/** The caution lines (contracts/cautions.ts), also used by reports, exports and mail so the wording stays the same. */
const flightCautions = generalCautions;

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
