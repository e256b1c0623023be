/** The flights list: signed-off plan versions ready to fly. The pilot's home screen. */
import { useEffect, useState } from 'react';
import { View } from 'react-native';
import { errorMessage, isRetryable } from '../api/api-error';
import { formatDayTime } from '../projects/format-date';
import { FlightCautions } from '../safety/flight-cautions';
import { RequirePermission } from '../team/require-permission';
import { useCurrentTeam } from '../team/current-team-context';
import { Banner, Button, Card, EmptyState, Heading, Loading, Screen, TextLink } from '../ui';
import { FlightRow } from './flight-row';
import { useFlights } from './flights.queries';
import { storedSheets, type StoredSheetEntry } from './leg-sheet-storage';

/**
 * Only signed-off versions ever appear here; drafts and plans in review stay with planners and surveyors. The list
 * comes first so a phone shows it without scrolling; the cautions follow, and every leg sheet repeats them.
 */
export function FlightsScreen() {
  const { team, me } = useCurrentTeam();
  const flights = useFlights(team?.id);
  const [copies, setCopies] = useState<StoredSheetEntry[]>([]);
  useEffect(() => setCopies(storedSheets(me.user.id)), [me.user.id]);
  const unreachable = flights.isError && isRetryable(flights.error);

  return (
    <Screen title="Flights" subtitle={team ? `Signed-off plans of ${team.name}` : undefined} testID="flights-screen">
      <RequirePermission permission="flight:read" what="Flights">
        {flights.isPending ? <Loading label="Loading the flights…" /> : null}
        {flights.isError ? (
          <Banner tone="danger" title="Could not load the flights" message={errorMessage(flights.error)} testID="flights-failure">
            <Button label="Try again" variant="secondary" size="compact" onPress={() => void flights.refetch()} />
          </Banner>
        ) : null}
        {unreachable && copies.length ? (
          <Card testID="offline-copies">
            <Heading level={2}>Leg sheets kept on this device</Heading>
            {copies.map((c) => (
              <TextLink key={c.versionId} href={`/flights/${c.versionId}`} label={`${c.title} (loaded ${formatDayTime(c.savedAt)})`} />
            ))}
          </Card>
        ) : null}
        {flights.data && flights.data.length === 0 ? (
          <EmptyState
            testID="flights-empty"
            title="No signed-off plans yet"
            message="A plan shows up here once a surveyor has signed a version off. Each comes with its leg sheet and exports."
          />
        ) : null}
        {flights.data && flights.data.length > 0 ? (
          <Card padded={false}>
            <View role="list" aria-label="Signed-off flights" testID="flights-list">
              {flights.data.map((f, i) => (
                <View key={f.versionId} role="listitem">
                  <FlightRow flight={f} last={i === flights.data.length - 1} />
                </View>
              ))}
            </View>
          </Card>
        ) : null}
        <FlightCautions />
      </RequirePermission>
    </Screen>
  );
}
