/** Shows its children only to roles holding a permission; others get a plain explanation instead of a broken screen. */
import type { ReactNode } from 'react';
import { can, roleLabels, type Permission } from '../../contracts/roles';
import { EmptyState } from '../ui';
import { useCurrentTeam } from './current-team-context';

/** The server refuses these requests anyway; this only keeps the screen honest about why it is empty. */
export function RequirePermission({ permission, what, children }: { permission: Permission; what: string; children: ReactNode }) {
  const { role, team } = useCurrentTeam();
  if (can(role, permission)) return <>{children}</>;
  return (
    <EmptyState
      testID="not-permitted"
      title={`${what} is not part of your role`}
      message={
        role && team
          ? `As ${roleLabels[role]} in ${team.name} you do not see ${what.toLowerCase()}. An owner of the team can change your role.`
          : 'Choose or create a team first.'
      }
    />
  );
}
