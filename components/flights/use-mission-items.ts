/** What the leg sheet's hand-off card shows: item count, altitude frame, trigger distance and speed per line, the download, photos recorded. */
import type { MissionItems } from '../../contracts/mission-items';
import type { FlightTrigger } from '../../contracts/flight-triggers';
import { errorMessage } from '../api/api-error';
import { missionItemsPath, useFlightTriggersQuery, useMissionItemsQuery } from './mission-items.queries';

export type MissionHandoff =
  | { kind: 'unavailable'; reason: string }
  | { kind: 'loading' }
  | { kind: 'error'; message: string }
  | {
      kind: 'ready';
      itemCount: number;
      frameName: string;
      reference: string;
      lines: MissionItems['lines'];
      cautions: string[];
      downloadHref: string;
      /** Photos the link has recorded as flown (null until known). */
      recorded: { count: number; lastAt: string | null } | null;
    };

/** Pure: the card's state from the sheet's facts and the query's. */
export function missionHandoffOf(q: { signedOff: boolean; offline: boolean; teamId: string | undefined; versionId: string; data?: MissionItems; error?: unknown; loading: boolean; triggers?: FlightTrigger[] }): MissionHandoff {
  if (!q.signedOff) return { kind: 'unavailable', reason: 'Mission items are made from signed-off versions only.' };
  if (q.data && q.teamId) {
    return {
      kind: 'ready',
      itemCount: q.data.items.length,
      frameName: q.data.altitude.frameName,
      reference: q.data.altitude.reference,
      lines: q.data.lines,
      cautions: q.data.cautions,
      downloadHref: missionItemsPath(q.teamId, q.versionId, true),
      recorded: q.triggers ? { count: q.triggers.length, lastAt: q.triggers.reduce<string | null>((a, t) => (a === null || t.capturedAt > a ? t.capturedAt : a), null) } : null,
    };
  }
  if (q.offline) return { kind: 'unavailable', reason: 'Mission items need the connection back.' };
  if (q.error) return { kind: 'error', message: errorMessage(q.error) };
  return { kind: 'loading' };
}

/** The hand-off card's state for one version of the sheet. */
export function useMissionItems(teamId: string | undefined, versionId: string, signedOff: boolean, offline: boolean): MissionHandoff {
  const q = useMissionItemsQuery(teamId, versionId, signedOff && !offline);
  const t = useFlightTriggersQuery(teamId, versionId, signedOff && !offline);
  return missionHandoffOf({ signedOff, offline, teamId, versionId, data: q.data, error: q.error, loading: q.isLoading, triggers: t.data?.triggers });
}
