/** The leg sheet of a version with its offline copy: saved on every successful load, shown while the server is out of reach. */
import { useEffect, useMemo, useState } from 'react';
import { useCurrentTeam } from '../team/current-team-context';
import { useLegSheetQuery } from './flights.queries';
import { forgetSheet, readSheet, saveSheet, type StoredSheet } from './leg-sheet-storage';
import { isRefusal, pickSheetSource } from './sheet-source';

/** `source` says what to draw; `retry` asks the server again (e.g. once the network is back). */
export function useLegSheet(versionId: string | undefined) {
  const { team, me } = useCurrentTeam();
  const userId = me.user.id;
  const query = useLegSheetQuery(team?.id, versionId);
  // Read once per version after mount: localStorage does not exist while the page is pre-rendered.
  const [stored, setStored] = useState<StoredSheet | null>(null);
  useEffect(() => {
    setStored(versionId ? readSheet(userId, versionId) : null);
  }, [userId, versionId]);

  useEffect(() => {
    if (query.data) saveSheet(userId, query.data);
  }, [query.data, userId]);

  useEffect(() => {
    if (versionId && query.error && isRefusal(query.error)) {
      forgetSheet(userId, versionId);
      setStored(null);
    }
  }, [query.error, userId, versionId]);

  const source = useMemo(
    () => pickSheetSource({ data: query.data, error: query.error, fetchStatus: query.fetchStatus, stored }),
    [query.data, query.error, query.fetchStatus, stored],
  );
  return { source, teamId: team?.id, retry: () => void query.refetch(), retrying: query.isFetching };
}
