/**
 * The answers a crew needs with no signal, kept on the device between page loads: who is signed in (`me`) and the
 * team's signed-off flights list. Written with TanStack Query's own dehydrate/hydrate into localStorage, read back
 * before the first render, so a reload on a hillside draws the app at once and a cold start offline still opens.
 * Leg sheets are kept separately, with their save time (components/flights/leg-sheet-storage.ts).
 */
import { dehydrate, hydrate, type Query, type QueryClient } from '@tanstack/react-query';

const storageKey = 'loftline.device-queries.v1';
/** Older than this, a kept answer is not shown (the next load asks the server as if nothing were kept). */
const maxAgeMs = 30 * 24 * 3600 * 1000;

function storage(): Storage | null {
  try {
    return typeof window !== 'undefined' && window.localStorage ? window.localStorage : null;
  } catch {
    return null; // storage switched off in the browser: nothing is kept
  }
}

/** Only settled answers of the signed-in user and their flights list; never sheets, errors or other screens. */
function keptOnDevice(q: Pick<Query, 'queryKey' | 'state'>): boolean {
  if (q.state.status !== 'success') return false;
  const [head, , kind] = q.queryKey as readonly unknown[];
  return head === 'me' || (head === 'flights' && kind === 'list');
}

/** Put the kept answers into `client` (before the first render). */
export function restoreDeviceQueries(client: QueryClient): void {
  const s = storage();
  const raw = s?.getItem(storageKey);
  if (!s || !raw) return;
  try {
    const saved = JSON.parse(raw) as { savedAt: number; state: Parameters<typeof hydrate>[1] };
    if (Date.now() - saved.savedAt > maxAgeMs) return void s.removeItem(storageKey);
    hydrate(client, saved.state);
  } catch {
    s.removeItem(storageKey); // unreadable (an older app's shape): start clean
  }
}

/** Keep the chosen answers whenever the cache changes; returns the unsubscribe. */
export function keepDeviceQueries(client: QueryClient): () => void {
  const s = storage();
  if (!s) return () => undefined;
  let pending: ReturnType<typeof setTimeout> | null = null;
  const save = () => {
    pending = null;
    try {
      s.setItem(storageKey, JSON.stringify({ savedAt: Date.now(), state: dehydrate(client, { shouldDehydrateQuery: keptOnDevice }) }));
    } catch {
      // storage full or refused: the app works as before, only without the kept copy
    }
  };
  return client.getQueryCache().subscribe(() => {
    pending ??= setTimeout(save, 250);
  });
}

/** Forget everything kept (sign-out, or the server said the session is gone). */
export function forgetDeviceQueries(): void {
  storage()?.removeItem(storageKey);
}
