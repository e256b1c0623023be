/** One navigation item as a link, drawn for the side column or the bottom tab bar. */
import { StyleSheet, View } from 'react-native';
import { colors, layout, radii, space } from '../theme';
import { showFocusRing } from '../ui/focus-modality';
import { LinkPressable, Text, type WebPressState } from '../ui';
import { ariaCurrentPage } from '../ui/web-a11y';
import type { NavItem } from './nav-items';

type NavLinkProps = { item: NavItem; active: boolean; placement: 'side' | 'tab' };

/** Active items carry aria-current="page" and a bar in the primary colour (left in the column, top in the tab bar). */
export function NavLink({ item, active, placement }: NavLinkProps) {
  const side = placement === 'side';
  return (
    <LinkPressable
      href={item.href}
      testID={item.testID}
      accessibilityLabel={item.label}
      aria={ariaCurrentPage(active)}
      style={(state: WebPressState) => [
        side ? styles.side : styles.tab,
        active ? (side ? styles.sideActive : styles.tabActive) : state.hovered || state.pressed ? styles.hovered : null,
        showFocusRing(state.focused) && styles.focused,
      ]}
    >
      <View aria-hidden style={[side ? styles.sideMarker : styles.tabMarker, active && styles.markerActive]} />
      <Text variant={active ? 'bodyStrong' : 'body'} tone={active ? 'primary' : 'default'} style={side ? null : styles.tabLabel}>
        {item.label}
      </Text>
    </LinkPressable>
  );
}

const styles = StyleSheet.create({
  side: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: layout.minTouchPx,
    paddingRight: space.md,
    borderRadius: radii.md,
    overflow: 'hidden',
  },
  sideActive: { backgroundColor: colors.primarySoft },
  sideMarker: { width: space.xs, alignSelf: 'stretch', backgroundColor: 'transparent' },
  tab: { flex: 1, alignItems: 'center', justifyContent: 'center', minHeight: layout.tabBarHeightPx, gap: space.xs },
  tabActive: { backgroundColor: colors.primarySoft },
  tabMarker: { position: 'absolute', top: 0, left: space.md, right: space.md, height: space.xs, backgroundColor: 'transparent' },
  tabLabel: { textAlign: 'center' },
  markerActive: { backgroundColor: colors.primary },
  hovered: { backgroundColor: colors.surfaceSunken },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid', outlineOffset: -layout.focusRingPx },
});
