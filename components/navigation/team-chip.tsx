/** The current team's name and the user's role in it, linking to the team switcher. */
import { StyleSheet, View } from 'react-native';
import { roleLabels } from '../../contracts/roles';
import { useCurrentTeam } from '../team/current-team-context';
import { colors, layout, radii, space } from '../theme';
import { showFocusRing } from '../ui/focus-modality';
import { Badge, LinkPressable, Text, type WebPressState } from '../ui';

/** `compact` (phone top bar) keeps name and role on one line; the side column stacks them with a hint. */
export function TeamChip({ compact = false }: { compact?: boolean }) {
  const { team, role } = useCurrentTeam();
  const teamName = team?.name ?? 'No team yet';
  return (
    <LinkPressable
      href="/teams"
      testID="team-switcher"
      style={(state: WebPressState) => [
        compact ? styles.compact : styles.block,
        (state.hovered || state.pressed) && styles.hovered,
        showFocusRing(state.focused) && styles.focused,
      ]}
    >
      <View style={compact ? styles.compactText : styles.blockText}>
        <Text variant={compact ? 'label' : 'bodyStrong'} numberOfLines={compact ? 1 : 2} testID="current-team-name">
          {teamName}
        </Text>
        {role ? <Badge label={roleLabels[role]} tone="primary" testID="current-team-role" /> : null}
      </View>
      {compact ? null : (
        <Text variant="caption" tone="primary">
          Switch team
        </Text>
      )}
    </LinkPressable>
  );
}

const styles = StyleSheet.create({
  block: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radii.md,
    borderWidth: layout.borderWidthPx,
    borderColor: colors.line,
    backgroundColor: colors.canvas,
  },
  blockText: { gap: space.xs },
  compact: {
    flexShrink: 1,
    minHeight: layout.minTouchPx,
    justifyContent: 'center',
    paddingHorizontal: space.sm,
    borderRadius: radii.md,
  },
  compactText: { flexDirection: 'row', alignItems: 'center', gap: space.sm, flexShrink: 1 },
  hovered: { backgroundColor: colors.surfaceSunken },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid' },
});
