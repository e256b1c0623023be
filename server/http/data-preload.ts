/**
 * `Link: rel=preload; as=fetch` headers on the app shell for the first API answers the screen will ask for, so they
 * travel beside the app's scripts instead of after them. On a weak field signal (1.6 Mbit/s, 150 ms round trips)
 * the pilot's leg sheet otherwise waits, after about 2.5 s of scripts, for the session check and then the sheet:
 * two more round trips in a row. Chromium hands a preloaded answer to the app's own fetch when the request matches
 * (same URL, `credentials: 'include'` ↔ `crossorigin=use-credentials`), so nothing is fetched twice.
 *
 * Only for a caller with a live session, and a sheet only in a team the caller belongs to: the header never names
 * a team or version the caller could not already read. The sheet's own route still applies every permission.
 */
import { eq, sql } from 'drizzle-orm';
import type { Request } from 'express';
import { screenGroupOf } from '../../contracts/screen-groups';
import type { Db } from '../../db/client';
import { planVersion } from '../../db/schema';
import type { Guards } from './guard';
import { isUuid } from './ids';

const fetchLink = (href: string) => `<${href}>; rel=preload; as=fetch; crossorigin=use-credentials`;

/** The API paths the app asks for first on `urlPath`, as Link header values (none for a signed-out caller). */
export function dataPreloader(deps: { db: Db; guards: Pick<Guards, 'sessionOf' | 'roleIn'> }) {
  const teamOfVersion = deps.db
    .select({ teamId: planVersion.teamId })
    .from(planVersion)
    .where(eq(planVersion.id, sql.placeholder('versionId')))
    .limit(1)
    .prepare('shell_version_team');

  return async (req: Request): Promise<string[]> => {
    if (!screenGroupOf(req.path)) return []; // signed-out screens (sign-in, invitations) ask for nothing first
    const auth = await deps.guards.sessionOf(req).catch(() => null);
    if (!auth) return [];
    const links = [fetchLink('/api/me')];
    const sheet = /^\/flights\/([^/]+)\/?$/.exec(req.path);
    const versionId = sheet?.[1];
    if (versionId && isUuid(versionId)) {
      const teamId = (await teamOfVersion.execute({ versionId }))[0]?.teamId;
      if (teamId && (await deps.guards.roleIn(auth.user.id, teamId))) {
        links.push(fetchLink(`/api/teams/${encodeURIComponent(teamId)}/flights/${encodeURIComponent(versionId)}/leg-sheet`));
      }
    }
    return links;
  };
}
