/** A compact index of the sheet's lines at its top: number, legs, photos and first height above takeoff; a tap jumps to the line. */
import { Pressable, StyleSheet, View } from 'react-native';
import type { LegSheet } from '../../contracts/flights';
import { colors, layout, radii, space } from '../theme';
import { Card, Heading, Text } from '../ui';
import { showFocusRing } from '../ui/focus-modality';
import { lineIndexEntries, scrollToLine } from './line-index';

export function LineIndexCard({ sheet }: { sheet: Pick<LegSheet, 'lines' | 'units'> }) {
  const entries = lineIndexEntries(sheet);
  if (entries.length === 0) return null;
  return (
    <Card testID="line-index">
      <Heading level={2}>Lines at a glance</Heading>
      <Text variant="caption" tone="muted">
        In flying order. Heights are above the takeoff point. Tap a line to go to its legs.
      </Text>
      <View role="list" aria-label="Lines" style={styles.grid}>
        {entries.map((e) => (
          <View role="listitem" key={e.number} style={styles.cell}>
            <Pressable
              role="link"
              testID={e.testID}
              onPress={() => scrollToLine(e.anchorId)}
              style={(s) => [styles.entry, (s as { hovered?: boolean }).hovered || s.pressed ? styles.hover : null, showFocusRing((s as { focused?: boolean }).focused) && styles.focused]}
            >
              <Text variant="bodyStrong" tone="primary">{e.title}</Text>
              <Text variant="caption">{e.counts}</Text>
              <Text variant="caption">{e.start}</Text>
            </Pressable>
          </View>
        ))}
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  cell: { flexGrow: 1, flexBasis: 150, maxWidth: 260 },
  entry: {
    minHeight: layout.minTouchPx,
    paddingVertical: space.xs,
    paddingHorizontal: space.sm,
    borderWidth: layout.borderWidthPx,
    borderColor: colors.line,
    borderRadius: radii.md,
    gap: space.xxs,
  },
  hover: { backgroundColor: colors.surfaceSunken },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid' },
});
