/** The site's metadata as a two-column table (label, value); stacked on phones. */
import { StyleSheet, View } from 'react-native';
import { useBreakpoint } from '../layout/use-breakpoint';
import { colors, layout, space } from '../theme';
import { Text } from '../ui';
import type { SiteFact } from './site-facts';

/** A definition list drawn as rows; long values (the checksum) wrap. */
export function SiteMetadataTable({ facts }: { facts: SiteFact[] }) {
  const stacked = useBreakpoint() === 'phone';
  return (
    <View role="table" aria-label="Elevation grid metadata" testID="site-metadata">
      {facts.map((f, i) => (
        <View key={f.key} role="row" style={[styles.row, stacked && styles.stacked, i < facts.length - 1 && styles.divider]} testID={`site-fact-${f.key}`}>
          <View role="rowheader" style={stacked ? undefined : styles.labelCell}>
            <Text variant="label" tone="muted">
              {f.label}
            </Text>
          </View>
          <View role="cell" style={styles.valueCell}>
            <Text variant={f.key === 'checksum' ? 'mono' : 'body'} selectable>
              {f.value}
            </Text>
          </View>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', gap: space.lg, paddingVertical: space.sm },
  stacked: { flexDirection: 'column', gap: space.xxs },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  labelCell: { width: layout.sideNavWidthPx * 0.8 },
  valueCell: { flex: 1, minWidth: 0 },
});
