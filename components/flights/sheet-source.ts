/** Which leg sheet to show: the server's answer, the offline copy (and why), or a loading or error state. */
import type { LegSheet } from '../../contracts/flights';
import { ApiError, isRetryable } from '../api/api-error';
import type { StoredSheet } from './leg-sheet-storage';

export type OfflineReason = 'checking' | 'no-connection' | 'unreachable';

type SheetSource =
  | { kind: 'live'; sheet: LegSheet }
  | { kind: 'offline'; sheet: LegSheet; savedAt: string; reason: OfflineReason; message: string | null }
  | { kind: 'loading'; waitingForConnection: boolean }
  | { kind: 'error'; error: unknown };

type SheetQueryState = {
  data: LegSheet | undefined;
  error: unknown;
  /** TanStack Query's fetch status: "paused" while the browser says it is offline. */
  fetchStatus: 'fetching' | 'paused' | 'idle';
  stored: StoredSheet | null;
};

/**
 * The copy on the device stands in only while the server cannot be reached (no network, a 5xx, still trying);
 * a refusal (401, 403, 404) is shown as such, so a sheet the user may no longer read never appears from the cache.
 */
export function pickSheetSource(q: SheetQueryState): SheetSource {
  if (q.data) return { kind: 'live', sheet: q.data };
  if (q.error) {
    if (q.stored && isRetryable(q.error)) {
      return { kind: 'offline', sheet: q.stored.sheet, savedAt: q.stored.savedAt, reason: 'unreachable', message: q.error instanceof Error ? q.error.message : null };
    }
    return { kind: 'error', error: q.error };
  }
  if (q.fetchStatus === 'paused') {
    return q.stored
      ? { kind: 'offline', sheet: q.stored.sheet, savedAt: q.stored.savedAt, reason: 'no-connection', message: null }
      : { kind: 'loading', waitingForConnection: true };
  }
  if (q.stored) return { kind: 'offline', sheet: q.stored.sheet, savedAt: q.stored.savedAt, reason: 'checking', message: null };
  return { kind: 'loading', waitingForConnection: false };
}

/** True when the server said the sheet is not (or no longer) the user's to read: the device copy must go. */
export function isRefusal(error: unknown): boolean {
  return error instanceof ApiError && (error.status === 401 || error.status === 403 || error.status === 404);
}
