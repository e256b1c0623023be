/** The flights list: signed-off plan versions ready to fly. The pilot's home screen. */
import { FlightCautions } from '../safety/flight-cautions';
import { RequirePermission } from '../team/require-permission';
import { useCurrentTeam } from '../team/current-team-context';
import { EmptyState, Screen } from '../ui';

/** Only signed-off versions ever appear here; drafts and plans in review stay with planners and surveyors. */
export function FlightsScreen() {
  const { team } = useCurrentTeam();
  return (
    <Screen title="Flights" subtitle={team ? `Signed-off plans of ${team.name}` : undefined} testID="flights-screen">
      <RequirePermission permission="flight:read" what="Flights">
        <FlightCautions />
        <EmptyState
          testID="flights-empty"
          title="No signed-off plans yet"
          message="A plan shows up here once a surveyor has signed a version off. Each comes with its leg sheet and exports."
        />
      </RequirePermission>
    </Screen>
  );
}
