/** The client's requirements against what the plan achieves, one row each with a worded pass mark. */
import { StyleSheet, View } from 'react-native';
import type { SpecCheck } from '../../contracts/reports';
import { colors, layout, space } from '../theme';
import { Badge, Text } from '../ui';

/** Pass/miss is said in words as well as colour, so it survives a greyscale print or colour blindness. */
export function SpecChecks({ checks }: { checks: readonly SpecCheck[] }) {
  return (
    <View role="list" aria-label="Spec against results" testID="spec-checks">
      {checks.map((c, i) => (
        <View key={c.key} role="listitem" testID={`check-${c.key}`} style={[styles.row, i < checks.length - 1 && styles.divider]}>
          <View style={styles.what}>
            <Text variant="bodyStrong">{c.label}</Text>
            <Text variant="label" tone="muted">
              Required: {c.required}
            </Text>
            <Text variant="label">Achieved: {c.achieved}</Text>
          </View>
          <Badge label={c.pass ? 'Met' : 'Not met'} tone={c.pass ? 'success' : 'danger'} testID={`check-${c.key}-result`} />
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'flex-start', justifyContent: 'space-between', gap: space.md, paddingVertical: space.sm },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  what: { flexShrink: 1, gap: space.xxs },
});
