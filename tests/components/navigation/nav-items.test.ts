import { describe, expect, it } from 'vitest';
import { can, roles } from '../../../contracts/roles';
import { activeNavKey, homeFor, navItems, navItemsFor } from '../../../components/navigation/nav-items';

const keysFor = (role: Parameters<typeof navItemsFor>[0]) => navItemsFor(role).map((i) => i.key);

describe('navItemsFor', () => {
  // Expected menus per role, written out from the role table in the shared domain notes (owner, planner and
  // surveyor read projects and members; a pilot reads only signed-off plans).
  it('gives the owner, planner and surveyor Work, Projects, Flights, Team and Profile, in that order', () => {
    for (const role of ['owner', 'planner', 'surveyor'] as const) {
      expect(keysFor(role)).toEqual(['work', 'projects', 'flights', 'team', 'profile']);
    }
  });

  it('gives the pilot only Flights and Profile', () => {
    expect(keysFor('pilot')).toEqual(['flights', 'profile']);
  });

  it('gives someone without a team only Profile', () => {
    expect(keysFor(null)).toEqual(['profile']);
    expect(keysFor(undefined)).toEqual(['profile']);
  });

  it('shows an item exactly when the role holds its permission', () => {
    for (const role of roles) {
      for (const item of navItems) {
        const shown = keysFor(role).includes(item.key);
        expect(shown).toBe(item.permission === null || can(role, item.permission));
      }
    }
  });

  it('uses the test ids the end-to-end tests look for', () => {
    expect(navItems.map((i) => i.testID)).toEqual(['nav-work', 'nav-projects', 'nav-flights', 'nav-team', 'nav-profile']);
  });

  it('does not mutate the shared item list', () => {
    const before = JSON.stringify(navItems);
    navItemsFor('pilot').pop();
    expect(JSON.stringify(navItems)).toBe(before);
  });
});

describe('homeFor', () => {
  it('lands roles that read projects on their work list, /work', () => {
    expect(homeFor('owner')).toBe('/work');
    expect(homeFor('planner')).toBe('/work');
    expect(homeFor('surveyor')).toBe('/work');
  });

  it('lands a pilot on /flights', () => {
    expect(homeFor('pilot')).toBe('/flights');
  });

  it('sends someone without a team to /teams', () => {
    expect(homeFor(null)).toBe('/teams');
  });
});

describe('activeNavKey', () => {
  it('marks a section active on its own path and on the paths beneath it', () => {
    expect(activeNavKey('/projects')).toBe('projects');
    expect(activeNavKey('/projects/7f3a/sites')).toBe('projects');
    expect(activeNavKey('/flights')).toBe('flights');
    expect(activeNavKey('/work')).toBe('work');
  });

  it('keeps /team and /teams apart (the switcher is not the members list)', () => {
    expect(activeNavKey('/team')).toBe('team');
    expect(activeNavKey('/teams')).toBeNull();
  });

  it('marks nothing on paths outside the sections', () => {
    expect(activeNavKey('/')).toBeNull();
    expect(activeNavKey('/projectsx')).toBeNull();
  });
});
