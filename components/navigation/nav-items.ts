/** The signed-in area's navigation items and which of them a role sees. */
import { can, type Permission, type Role } from '../../contracts/roles';

type NavKey = 'work' | 'projects' | 'flights' | 'team' | 'profile';

export type NavItem = {
  key: NavKey;
  label: string;
  href: `/${string}`;
  /** Permission needed to see the item; null for items everyone has. */
  permission: Permission | null;
  /** Stable id for end-to-end tests. */
  testID: `nav-${NavKey}`;
};

/** All items in display order. */
export const navItems: readonly NavItem[] = [
  // What waits for the person (reviews, returned versions, flights); a pilot's waiting work is the Flights list itself.
  { key: 'work', label: 'Work', href: '/work', permission: 'project:read', testID: 'nav-work' },
  { key: 'projects', label: 'Projects', href: '/projects', permission: 'project:read', testID: 'nav-projects' },
  { key: 'flights', label: 'Flights', href: '/flights', permission: 'flight:read', testID: 'nav-flights' },
  { key: 'team', label: 'Team', href: '/team', permission: 'member:read', testID: 'nav-team' },
  { key: 'profile', label: 'Profile', href: '/profile', permission: null, testID: 'nav-profile' },
];

/** The items `role` may see, in display order (only Profile without a role). */
export function navItemsFor(role: Role | null | undefined): NavItem[] {
  return navItems.filter((item) => item.permission === null || can(role, item.permission));
}

/**
 * Where a role lands after sign-in: the work list (what waits for them) for those who read projects, the flights
 * list (signed-off versions, ready to fly, also kept on the device for offline use) for pilots.
 */
export function homeFor(role: Role | null | undefined): '/work' | '/flights' | '/teams' {
  if (!role) return '/teams';
  return can(role, 'project:read') ? '/work' : '/flights';
}

/** The item whose section contains `pathname` (e.g. /projects/abc belongs to Projects), or null. */
export function activeNavKey(pathname: string): NavKey | null {
  const item = navItems.find((i) => pathname === i.href || pathname.startsWith(`${i.href}/`));
  return item?.key ?? null;
}
