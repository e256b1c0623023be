/** The phone and tablet navigation: a bar of the role's items along the bottom edge. */
import { usePathname } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';
import { useCurrentTeam } from '../team/current-team-context';
import { colors, layout } from '../theme';
import { NavLink } from './nav-link';
import { activeNavKey, navItemsFor } from './nav-items';

/** Items share the width equally; the bar clears the home indicator on phones that have one. */
export function BottomTabs() {
  const { role } = useCurrentTeam();
  const active = activeNavKey(usePathname());
  const insets = useSafeAreaInsets();
  return (
    <View role="navigation" aria-label="Main" testID="bottom-tabs" style={[styles.bar, { paddingBottom: insets.bottom }]}>
      {navItemsFor(role).map((item) => (
        <NavLink key={item.key} item={item} active={active === item.key} placement="tab" />
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  bar: {
    flexDirection: 'row',
    backgroundColor: colors.surface,
    borderTopWidth: layout.borderWidthPx,
    borderTopColor: colors.line,
  },
});
