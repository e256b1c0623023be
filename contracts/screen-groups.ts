/**
 * Which group of screens an address opens. The signed-in screens are fetched on first use in two groups — the
 * pilot's field screens and the office screens (components/app/field-screens.ts, office-screens.ts) — and both the
 * server (a `Link: rel=preload` header on the app shell) and the app (fetching the group while its first script is
 * still starting) need the same answer for the same address.
 */
export type ScreenGroup = 'field' | 'office';

export function screenGroupOf(urlPath: string): ScreenGroup | null {
  if (/^\/flights(\/|$)/.test(urlPath)) return 'field';
  if (/^\/(work|projects|team|teams|profile|outbox)(\/|$)/.test(urlPath)) return 'office';
  return null;
}
