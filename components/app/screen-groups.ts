/**
 * Fetches a group of signed-in screens once and remembers it, so a screen whose group is already here draws in the
 * same pass as its route (no loading state, and no Suspense reveal delay: React holds a suspended screen back for
 * up to 300 ms after its fallback shows, which on the pilot's reload was a third of the time to the first altitude).
 * `preloadScreenGroupFor` starts the fetch while the app's first script is still starting, from the address alone.
 */
import { screenGroupOf, type ScreenGroup } from '../../contracts/screen-groups';

export type ScreenModules = {
  field: typeof import('./field-screens');
  office: typeof import('./office-screens');
};

// Literal import() calls, one per group: Metro makes each its own file (field-screens-<hash>.js, office-screens-…).
const importers: { [G in ScreenGroup]: () => Promise<ScreenModules[G]> } = {
  field: () => import('./field-screens'),
  office: () => import('./office-screens'),
};

const loaded: { [G in ScreenGroup]?: ScreenModules[G] } = {};
const pending: { [G in ScreenGroup]?: Promise<ScreenModules[G]> } = {};

/** The group's module if it has arrived, else null. */
export function loadedScreenGroup<G extends ScreenGroup>(group: G): ScreenModules[G] | null {
  return (loaded[group] as ScreenModules[G] | undefined) ?? null;
}

/** Fetches the group (once; a failed fetch is forgotten so the next call tries again). */
export function loadScreenGroup<G extends ScreenGroup>(group: G): Promise<ScreenModules[G]> {
  const have = loadedScreenGroup(group);
  if (have) return Promise.resolve(have);
  let p = pending[group] as Promise<ScreenModules[G]> | undefined;
  if (!p) {
    p = importers[group]().then(
      (m) => {
        (loaded as Record<G, ScreenModules[G]>)[group] = m;
        return m;
      },
      (e: unknown) => {
        delete pending[group];
        throw e;
      },
    );
    (pending as Record<G, Promise<ScreenModules[G]>>)[group] = p;
  }
  return p;
}

/** Starts fetching the group an address opens, if any; errors are left for the screen to show when it asks. */
export function preloadScreenGroupFor(urlPath: string): void {
  const group = screenGroupOf(urlPath);
  if (group) loadScreenGroup(group).catch(() => undefined);
}
