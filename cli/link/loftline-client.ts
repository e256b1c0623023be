/** The link's side of the Loftline API: sign in with e-mail and password, then fetch a signed-off version's mission items. */
import { recordedTriggersSchema, type FlightTrigger } from '../../contracts/flight-triggers';
import type { ReportLinkState } from '../../contracts/link-state';
import { missionItemsSchema, type MissionItems } from '../../contracts/mission-items';

/** A refusal or failure to show the crew as it is (one line). */
export class LinkError extends Error {}

export interface Session {
  server: string;
  cookie: string;
}

function errorText(body: unknown, status: number): string {
  const e = (body as { error?: { message?: unknown } } | null)?.error;
  return typeof e?.message === 'string' ? e.message : `HTTP ${status}`;
}

async function call(s: { server: string; cookie?: string }, method: string, path: string, body?: unknown): Promise<{ status: number; body: unknown; cookies: string[] }> {
  // Loftline accepts state-changing requests only from its own origin (README, Security), so say it is that origin.
  const headers: Record<string, string> = { Origin: new URL(s.server).origin, Accept: 'application/json' };
  if (s.cookie) headers.Cookie = s.cookie;
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  let res: Response;
  try {
    res = await fetch(s.server + path, { method, headers, body: body === undefined ? undefined : JSON.stringify(body), redirect: 'manual', signal: AbortSignal.timeout(30_000) });
  } catch (err) {
    throw new LinkError(`Cannot reach Loftline at ${s.server}: ${(err as Error).message}. Check --server and the network.`);
  }
  const text = await res.text();
  let parsed: unknown = text;
  if ((res.headers.get('content-type') ?? '').includes('json') && text) parsed = JSON.parse(text);
  return { status: res.status, body: parsed, cookies: res.headers.getSetCookie() };
}

/** Sign in; the session cookie is kept for the following calls. */
export async function signIn(server: string, email: string, password: string): Promise<Session> {
  const r = await call({ server }, 'POST', '/api/auth/sign-in/email', { email, password });
  if (r.status !== 200) throw new LinkError(`Sign-in to Loftline failed (${r.status}): ${errorText(r.body, r.status)}`);
  const cookie = r.cookies.map((c) => c.split(';')[0]).filter((c) => !c.endsWith('=')).join('; ');
  if (!cookie) throw new LinkError('Loftline answered the sign-in without a session cookie.');
  return { server, cookie };
}

/**
 * The mission items of `versionId`, looked for in every team of the signed-in person. A version that is not signed off
 * is refused (409 for planners and surveyors; pilots never see it, so for them it is "not found").
 */
export async function fetchMissionItems(s: Session, versionId: string): Promise<{ doc: MissionItems; teamId: string }> {
  const me = await call(s, 'GET', '/api/me');
  if (me.status !== 200) throw new LinkError(`Loftline did not answer who is signed in (${me.status}): ${errorText(me.body, me.status)}`);
  const teams = ((me.body as { teams?: Array<{ id: string }> }).teams ?? []).map((t) => t.id);
  for (const teamId of teams) {
    const r = await call(s, 'GET', `/api/teams/${encodeURIComponent(teamId)}/flights/${encodeURIComponent(versionId)}/mission-items`);
    if (r.status === 200) {
      const parsed = missionItemsSchema.safeParse(r.body);
      if (!parsed.success) throw new LinkError(`Loftline's mission items do not have the expected shape: ${parsed.error.message}`);
      return { doc: parsed.data, teamId };
    }
    if (r.status === 409) throw new LinkError(`Refused: ${errorText(r.body, r.status)}`);
    if (r.status !== 404 && r.status !== 403) throw new LinkError(`Loftline refused the mission items (${r.status}): ${errorText(r.body, r.status)}`);
  }
  throw new LinkError(`Refused: no signed-off version ${versionId} in your teams. Only signed-off versions go to an aircraft; check the version id and that a surveyor has signed it off.`);
}

/** Send a batch of photos as flown; resolves with the sortie's total, throws LinkError when Loftline refuses it. */
export async function recordTriggers(s: Session, teamId: string, versionId: string, sortie: string, triggers: FlightTrigger[]): Promise<{ stored: number; sortieTotal: number }> {
  const r = await call(s, 'POST', `/api/teams/${encodeURIComponent(teamId)}/flights/${encodeURIComponent(versionId)}/triggers`, { sortie, triggers });
  if (r.status !== 201) throw new LinkError(`Loftline did not take ${triggers.length} photos (${r.status}): ${errorText(r.body, r.status)}`);
  return recordedTriggersSchema.parse(r.body);
}

/** Tell Loftline which step the link is at (the leg sheet shows it); a report that does not get through is skipped, never fatal. */
export async function reportLinkState(s: Session, teamId: string, versionId: string, report: ReportLinkState): Promise<boolean> {
  try {
    const r = await call(s, 'POST', `/api/teams/${encodeURIComponent(teamId)}/flights/${encodeURIComponent(versionId)}/link-state`, report);
    return r.status === 201;
  } catch {
    return false;
  }
}
