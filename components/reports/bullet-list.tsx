/** A plain bulleted list of sentences (assumptions, cautions, warnings), read as a list by screen readers. */
import { StyleSheet, View } from 'react-native';
import { space } from '../theme';
import { Text, type TextTone } from '../ui';

/** `tone` colours the bullets only; the sentences stay in body ink for contrast. */
export function BulletList({ items, tone = 'default', testID }: { items: readonly string[]; tone?: TextTone; testID?: string }) {
  return (
    <View role="list" style={styles.list} testID={testID}>
      {items.map((line, i) => (
        <View key={`${i}-${line}`} role="listitem" style={styles.item}>
          <Text tone={tone} aria-hidden>
            •
          </Text>
          <Text style={styles.line}>{line}</Text>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.xs },
  item: { flexDirection: 'row', gap: space.sm },
  // minWidth 0: the line may be narrower than its longest word (a MAVLink frame name), which then breaks
  // (react-native-web's text wraps long words) instead of pushing the list out of its card on a phone
  line: { flex: 1, minWidth: 0 },
});
