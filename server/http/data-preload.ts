/**
 * `Link: rel=preload; as=fetch` headers on the app shell for the first API answers the screen will ask for, so they
 * travel beside the app's scripts instead of after them. On a weak field signal (1.6 Mbit/s, 150 ms round trips)
 * the pilot's leg sheet otherwise waits, after about 2.5 s of scripts, for the session check and then the sheet:
 * two more round trips in a row. Chromium hands a preloaded answer to the app's own fetch when the request matches
 * (same URL, `credentials: 'include'` ↔ `crossorigin=use-credentials`), so nothing is fetched twice.
 *
 * Only for a caller with a live session, a sheet only in a team the caller belongs to, and a home screen's list
 * (flights, work) only when the caller belongs to exactly one team: the header never names a team or version the
 * caller could not already read, nor guesses which of several teams the app will open. The sheet's own route still applies every permission.
 */
import { eq, sql } from 'drizzle-orm';
import type { Request } from 'express';
import { apiPaths } from '../../contracts/api-paths';
import { screenGroupOf } from '../../contracts/screen-groups';
import type { Db } from '../../db/client';
import { member, planVersion } from '../../db/schema';
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

  // Two rows are enough to know whether the caller has exactly one team (the app's current team is then that one).
  const teamsOf = deps.db
    .select({ teamId: member.organizationId })
    .from(member)
    .where(eq(member.userId, sql.placeholder('userId')))
    .limit(2)
    .prepare('shell_user_teams');
  /** The team lists the pilot's and the office's home screens read first, by address. */
  const homeLists: Record<string, (teamId: string) => string> = {
    '/flights': apiPaths.flights,
    '/work': apiPaths.work,
  };

  return async (req: Request): Promise<string[]> => {
    if (!screenGroupOf(req.path)) return []; // signed-out screens (sign-in, invitations) ask for nothing first
    const auth = await deps.guards.sessionOf(req).catch(() => null);
    if (!auth) return [];
    const links = [fetchLink(apiPaths.me)];
    const home = homeLists[req.path.replace(/\/$/, '')];
    if (home) {
      // Which team's list the app opens is its own choice when the caller has several: named only when there is one.
      const teams = await teamsOf.execute({ userId: auth.user.id });
      if (teams.length === 1) links.push(fetchLink(home(teams[0]!.teamId)));
    }
    const sheet = /^\/flights\/([^/]+)\/?$/.exec(req.path);
    const versionId = sheet?.[1];
    if (versionId && isUuid(versionId)) {
      const teamId = (await teamOfVersion.execute({ versionId }))[0]?.teamId;
      if (teamId && (await deps.guards.roleIn(auth.user.id, teamId))) {
        links.push(fetchLink(apiPaths.legSheet(teamId, versionId)));
      }
    }
    return links;
  };
}
