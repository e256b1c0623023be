/** The pre-flight checklist: the sheet's cautions and checks as items the pilot ticks off, with the count done. */
import { Pressable, StyleSheet, View } from 'react-native';
import type { ChecklistItem } from '../../contracts/flights';
import { colors, layout, radii, space } from '../theme';
import { showFocusRing } from '../ui/focus-modality';
import { Badge, Button, Card, Heading, List, Text, type WebPressState } from '../ui';
import { spaceActivates, webKeyProps } from '../ui/keys';
import { useKeptTicks } from './use-kept-ticks';

/** Ticks are kept on the device for the day (use-kept-ticks.ts): a reload keeps them, another day starts afresh. */
export function PreflightChecklist({ items, versionId }: { items: readonly ChecklistItem[]; versionId: string }) {
  const { done, toggle, clear } = useKeptTicks(versionId);
  const all = items.length > 0 && items.every((i) => done.has(i.id));
  return (
    <Card testID="preflight-checklist">
      <View style={styles.head}>
        <Heading level={2}>Pre-flight checklist</Heading>
        <Badge label={`${items.filter((i) => done.has(i.id)).length} of ${items.length} done`} tone={all ? 'success' : 'caution'} testID="checklist-count" />
      </View>
      <List label="Checks before take-off" style={styles.list}>
        {items.map((item) => {
          const checked = done.has(item.id);
          return (
            <Pressable
              key={item.id}
              role="checkbox"
              aria-checked={checked}
              aria-label={item.text}
              testID={`checklist-${item.id}`}
              onPress={() => toggle(item.id)}
              {...webKeyProps({ onKeyDown: spaceActivates(() => toggle(item.id)) })}
              style={(s: WebPressState) => [styles.item, checked && styles.itemDone, (s.hovered || s.pressed) && styles.hover, showFocusRing(s.focused) && styles.focused]}
            >
              <View style={[styles.box, checked && styles.boxChecked]}>
                {checked ? (
                  <Text variant="bodyStrong" tone="inverse" aria-hidden>
                    ✓
                  </Text>
                ) : null}
              </View>
              <View style={styles.texts}>
                <Text variant="label" tone={item.kind === 'caution' ? 'caution' : 'primary'}>
                  {item.kind === 'caution' ? 'Caution' : 'Check'}
                </Text>
                <Text>{item.text}</Text>
              </View>
            </Pressable>
          );
        })}
      </List>
      {done.size > 0 ? <Button label="Clear the ticks" variant="quiet" size="compact" onPress={clear} style={styles.clear} testID="checklist-clear" /> : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: space.sm },
  list: { gap: space.sm },
  item: {
    flexDirection: 'row',
    alignItems: 'flex-start',
    gap: space.md,
    minHeight: layout.minTouchPx,
    padding: space.md,
    borderRadius: radii.md,
    borderWidth: layout.borderWidthPx,
    borderColor: colors.line,
    backgroundColor: colors.surface,
  },
  itemDone: { backgroundColor: colors.successSoft, borderColor: colors.success },
  hover: { borderColor: colors.lineStrong },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid', outlineOffset: layout.focusRingPx },
  box: {
    width: layout.compactControlPx - space.sm,
    height: layout.compactControlPx - space.sm,
    borderRadius: radii.sm,
    borderWidth: layout.focusRingPx,
    borderColor: colors.lineStrong,
    alignItems: 'center',
    justifyContent: 'center',
    backgroundColor: colors.surface,
  },
  boxChecked: { backgroundColor: colors.success, borderColor: colors.success },
  texts: { flex: 1, gap: space.xxs },
  clear: { alignSelf: 'flex-start' },
});
