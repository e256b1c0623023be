import { describe, expect, it } from 'vitest';
import { can, permissionTable, permissions, roles, rolesWithout } from '../../contracts/roles';

// The rules under test are the role table of the product's domain notes (owner/planner/surveyor/pilot).
describe('role rules', () => {
  it('lets the owner do everything', () => {
    for (const p of permissions) expect(can('owner', p)).toBe(true);
  });

  it('lets only the owner manage members and invitations', () => {
    expect(rolesWithout('member:manage')).toEqual(['planner', 'surveyor', 'pilot']);
    expect(rolesWithout('invitation:manage')).toEqual(['planner', 'surveyor', 'pilot']);
  });

  it('lets planners create and edit but not sign off', () => {
    expect(can('planner', 'project:write')).toBe(true);
    expect(can('planner', 'site:write')).toBe(true);
    expect(can('planner', 'plan:run')).toBe(true);
    expect(can('planner', 'plan:submit')).toBe(true);
    expect(can('planner', 'plan:review')).toBe(false);
  });

  it('lets surveyors read everything and review, but not edit', () => {
    for (const p of ['project:read', 'site:read', 'plan:read', 'report:read', 'member:read'] as const) expect(can('surveyor', p)).toBe(true);
    expect(can('surveyor', 'plan:review')).toBe(true);
    for (const p of ['project:write', 'site:write', 'plan:write', 'plan:run'] as const) expect(can('surveyor', p)).toBe(false);
  });

  it('gives pilots only signed-off flights, the photos they record or check flying them, and the team name', () => {
    const pilotCan = permissions.filter((p) => can('pilot', p));
    expect(pilotCan.sort()).toEqual(['flight:check', 'flight:read', 'flight:record', 'team:read']);
    // surveyors read checks of photos as flown but do not run them (common practice: the crew that flew checks)
    expect(can('surveyor', 'flight:check')).toBe(false);
    expect(can('planner', 'flight:check')).toBe(true);
  });

  it('refuses a missing role', () => {
    expect(can(null, 'team:read')).toBe(false);
    expect(can(undefined, 'flight:read')).toBe(false);
  });

  it('names only known roles in the table', () => {
    for (const list of Object.values(permissionTable)) for (const r of list) expect(roles).toContain(r);
  });
});
