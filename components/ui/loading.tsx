/** Loading atom: a spinner with words, for screens and sections waiting on the server. */
import { ActivityIndicator, StyleSheet, View } from 'react-native';
import { colors, space } from '../theme';
import { Text } from './text';

/** `fill` centres it in the whole screen (used before the session is known). */
export function Loading({ label = 'Loading…', fill = false }: { label?: string; fill?: boolean }) {
  return (
    <View role="status" aria-label={label} style={[styles.row, fill && styles.fill]}>
      <ActivityIndicator color={colors.primary} aria-hidden />
      <Text tone="muted">{label}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm, padding: space.lg },
  fill: { flex: 1, justifyContent: 'center', backgroundColor: colors.canvas },
});
