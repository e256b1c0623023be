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
  // Read with the first drawing, so a sheet kept on the device shows without waiting for a second pass; again when
  // the version or user changes. (The web app is not pre-rendered, so localStorage is there when this runs.)
  const [stored, setStored] = useState<StoredSheet | null>(() => (versionId ? readSheet(userId, versionId) : null));
  const [storedFor, setStoredFor] = useState(`${userId}/${versionId}`);
  if (storedFor !== `${userId}/${versionId}`) {
    setStoredFor(`${userId}/${versionId}`);
    setStored(versionId ? readSheet(userId, versionId) : null);
  }

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
