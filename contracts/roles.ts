/** Team roles and what each may do: one table read by the server guards, the auth access control and the client's menus. */
import { z } from 'zod';

export const roles = ['owner', 'planner', 'surveyor', 'pilot'] as const;
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

/** Every permission a route can require, with the roles that hold it (see shared domain notes). */
export const permissionTable = {
  'team:read': ['owner', 'planner', 'surveyor', 'pilot'],
  'member:read': ['owner', 'planner', 'surveyor'],
  'member:manage': ['owner'],
  'invitation:manage': ['owner'],
  'project:read': ['owner', 'planner', 'surveyor'],
  'project:write': ['owner', 'planner'],
  'site:read': ['owner', 'planner', 'surveyor'],
  'site:write': ['owner', 'planner'],
  'plan:read': ['owner', 'planner', 'surveyor'],
  'plan:write': ['owner', 'planner'],
  'plan:run': ['owner', 'planner'],
  'plan:submit': ['owner', 'planner'],
  'plan:review': ['owner', 'surveyor'],
  'report:read': ['owner', 'planner', 'surveyor'],
  /** Signed-off versions, their leg sheets and exports: the only thing a pilot sees. */
  'flight:read': ['owner', 'planner', 'surveyor', 'pilot'],
  /** Photos as flown, sent by the link from the aircraft (the crew flying it). */
  'flight:record': ['owner', 'pilot'],
  /** Checking photos as flown against the plan (a photo log from the device or a CSV); pilots on signed-off versions only. */
  'flight:check': ['owner', 'planner', 'pilot'],
  'outbox:read': ['owner'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof permissionTable;
export const permissions = Object.keys(permissionTable) as Permission[];

/** Whether `role` holds `permission`. */
export function can(role: Role | null | undefined, permission: Permission): boolean {
  if (!role) return false;
  return (permissionTable[permission] as readonly Role[]).includes(role);
}

/** The roles that do not hold `permission` (used by the route-guard tests). */
export function rolesWithout(permission: Permission): Role[] {
  return roles.filter((r) => !can(r, permission));
}

/** Display names of the roles, our own wording. */
export const roleLabels: Record<Role, string> = {
  owner: 'Owner',
  planner: 'Planner',
  surveyor: 'Surveyor',
  pilot: 'Pilot',
};

/** One line per role for the members screen. */
export const roleSummaries: Record<Role, string> = {
  owner: 'Runs the team: invites people, sets roles, and can do everything below.',
  planner: 'Prepares projects, elevation uploads and plans; runs analyses; sends plans for review.',
  surveyor: 'Reads everything; signs a plan version off or returns it with comments.',
  pilot: 'Reads signed-off plans, their leg sheets and exports.',
};
