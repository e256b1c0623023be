/** The current team's id remembered in localStorage, so a reload keeps the same team. */

/** localStorage key for the current team id. */
export const teamStorageKey = 'loftline.team';

type KeyValueStore = Pick<Storage, 'getItem' | 'setItem' | 'removeItem'>;

/** The browser's localStorage, or null where there is none (pre-rendering, storage blocked by privacy settings). */
function browserStore(): KeyValueStore | null {
  try {
    return typeof window !== 'undefined' && window.localStorage ? window.localStorage : null;
  } catch {
    return null;
  }
}

/** The remembered team id, or null. */
export function readRememberedTeam(store: KeyValueStore | null = browserStore()): string | null {
  try {
    return store?.getItem(teamStorageKey) ?? null;
  } catch {
    return null;
  }
}

/** Remembers `teamId` (or forgets it with null); storage failures are ignored, the choice then lasts this visit only. */
export function rememberTeam(teamId: string | null, store: KeyValueStore | null = browserStore()): void {
  try {
    if (teamId) store?.setItem(teamStorageKey, teamId);
    else store?.removeItem(teamStorageKey);
  } catch {
    // Quota or privacy mode: nothing to do.
  }
}
