/** Label/value pairs in a grid that wraps to one column on a phone: no table ever scrolls sideways. */
import { StyleSheet, View } from 'react-native';
import { colors, layout, radii, space } from '../theme';
import { Text } from '../ui';
import type { Figure } from './report-figures';

/** Cells never narrower than this unless the container is: two columns on a phone card, up to six on a wide one. */
const defaultCellPx = layout.maxFormWidthPx / 3;

/** `testID` prefixes each cell's id with the figure key (e.g. line-1-gsd-median); `minCellPx` for tighter containers. */
export function FigureGrid({ figures, testID, minCellPx = defaultCellPx }: { figures: readonly Figure[]; testID?: string; minCellPx?: number }) {
  return (
    <View style={styles.grid} testID={testID}>
      {figures.map((f) => (
        <View key={f.key} style={[styles.cell, { flexBasis: minCellPx }]} testID={testID ? `${testID}-${f.key}` : undefined}>
          <Text variant="label" tone="muted">
            {f.label}
          </Text>
          <Text variant="bodyStrong">{f.value}</Text>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  cell: {
    flexGrow: 1,
    minWidth: 0,
    gap: space.xxs,
    padding: space.sm,
    borderRadius: radii.md,
    backgroundColor: colors.canvas,
  },
});
