/** Sends "/" to the current role's home: projects for most roles, flights for pilots, teams without a team. */
import { Redirect } from 'expo-router';
import { useCurrentTeam } from '../team/current-team-context';
import { homeFor } from './nav-items';

/** Rendered by the (app) group's index route. */
export function HomeRedirect() {
  const { role } = useCurrentTeam();
  return <Redirect href={homeFor(role)} />;
}
