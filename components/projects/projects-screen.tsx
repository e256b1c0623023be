/** The current team's projects. For now the list is always empty: projects arrive with their own API. */
import { can } from '../../contracts/roles';
import { RequirePermission } from '../team/require-permission';
import { useCurrentTeam } from '../team/current-team-context';
import { Button, EmptyState, Screen } from '../ui';

/** Everyone who reads projects sees the list; only roles with project:write see "New project". */
export function ProjectsScreen() {
  const { team, role } = useCurrentTeam();
  const mayWrite = can(role, 'project:write');
  return (
    <Screen title="Projects" subtitle={team ? `Survey jobs of ${team.name}` : undefined} testID="projects-screen">
      <RequirePermission permission="project:read" what="Projects">
        <EmptyState
          testID="projects-empty"
          title="No projects yet"
          message={
            mayWrite
              ? 'A project holds one job for one client: its elevation uploads, flight plans and reviews.'
              : 'When a planner creates a project for this team it will appear here.'
          }
          action={mayWrite ? <Button label="New project" disabled testID="new-project" accessibilityLabel="New project (coming soon)" /> : null}
        />
      </RequirePermission>
    </Screen>
  );
}
