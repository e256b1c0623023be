/** The wide-screen navigation column: brand, current team, the role's items, and who is signed in. */
import { usePathname } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { BrandMark } from '../layout/brand-mark';
import { useCurrentTeam } from '../team/current-team-context';
import { colors, layout, space } from '../theme';
import { Text } from '../ui';
import { NavLink } from './nav-link';
import { activeNavKey, navItemsFor } from './nav-items';
import { TeamChip } from './team-chip';

/** Drawn once by the app shell at the wide breakpoint. */
export function SideNav() {
  const { me, role } = useCurrentTeam();
  const active = activeNavKey(usePathname());
  return (
    <View role="navigation" aria-label="Main" style={styles.column} testID="side-nav">
      <BrandMark />
      <TeamChip />
      <View style={styles.items}>
        {navItemsFor(role).map((item) => (
          <NavLink key={item.key} item={item} active={active === item.key} placement="side" />
        ))}
      </View>
      <View style={styles.footer}>
        <Text variant="label">{me.user.name}</Text>
        <Text variant="caption" tone="muted" numberOfLines={1}>
          {me.user.email}
        </Text>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  column: {
    width: layout.sideNavWidthPx,
    backgroundColor: colors.surface,
    borderRightWidth: layout.borderWidthPx,
    borderRightColor: colors.line,
    paddingHorizontal: space.lg,
    paddingVertical: space.xl,
    gap: space.xl,
  },
  items: { gap: space.xs },
  footer: { marginTop: 'auto', gap: space.xxs, paddingTop: space.lg, borderTopWidth: layout.borderWidthPx, borderTopColor: colors.line },
});
