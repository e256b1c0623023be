/** better-auth access control built from Loftline's one permission table (contracts/roles.ts). */
import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements, ownerAc } from 'better-auth/plugins/organization/access';
import { permissionTable, permissions, roles, type Permission, type Role } from '../../contracts/roles';

const statements = { ...defaultStatements, loftline: permissions } as const;
export const ac = createAccessControl(statements);

function loftlinePermissionsOf(role: Role): Permission[] {
  return permissions.filter((p) => (permissionTable[p] as readonly Role[]).includes(role));
}

/**
 * Team roles for the organization plugin. Only owners hold the plugin's own member/invitation/organization
 * rights, so its endpoints (invite, change role, remove) refuse the other roles just as our routes do.
 */
export const acRoles = Object.fromEntries(
  roles.map((role) => [
    role,
    role === 'owner'
      ? ac.newRole({ ...ownerAc.statements, loftline: loftlinePermissionsOf(role) })
      : ac.newRole({ loftline: loftlinePermissionsOf(role) }),
  ]),
) as unknown as Record<Role, ReturnType<typeof ac.newRole>>;
