/**
 * GET /teams/:teamId/work over real HTTP: each role's home lists what waits for it (reviews for surveyors, returned
 * and unsent versions for planners, signed-off flights for pilots, all of them for owners), with the review state,
 * who moved each version there and the return comment; another team's versions never appear and non-members get 404.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { workListSchema, type WorkList } from '../../contracts/work';
import { createVersion, freshTeam, type FreshTeam, type VersionFixture } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';

let srv: TestServer;
let team: FreshTeam;
let other: FreshTeam;
const v = {} as Record<'sent' | 'returned' | 'signed' | 'draft' | 'failed' | 'otherSent', VersionFixture>;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  team = await freshTeam(srv, 'work');
  other = await freshTeam(srv, 'work-other');
  const make = (planName: string, extra: Partial<Parameters<typeof createVersion>[1]> = {}) =>
    createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, planName, ...extra });
  v.sent = await make('Sent north face');
  v.returned = await make('Returned spoil heap');
  v.signed = await make('Signed quarry floor', { reviewState: 'signed_off' });
  v.draft = await make('Draft haul road');
  v.failed = await make('Failed east bench', { analysisState: 'failed' });
  v.otherSent = await createVersion(srv, { teamId: other.teamId, createdBy: other.users.planner.id, planName: 'Other team plan' });

  // Through the product's own transitions, so the audit trail says who sent and who returned.
  expect((await team.clients.planner.post(`${v.sent.path}/submit`, {})).status).toBe(200);
  expect((await team.clients.planner.post(`${v.returned.path}/submit`, {})).status).toBe(200);
  expect((await team.clients.surveyor.post(`${v.returned.path}/return`, { comment: 'Raise the clearance over the spoil heap crest.' })).status).toBe(200);
  expect((await other.clients.planner.post(`${v.otherSent.path}/submit`, {})).status).toBe(200);
}, 60_000);
afterAll(async () => srv?.stop());

async function workOf(role: keyof FreshTeam['clients'], t = team): Promise<WorkList> {
  const res = await t.clients[role].get(`/api/teams/${t.teamId}/work`);
  expect(res.status).toBe(200);
  return workListSchema.parse(res.body);
}

const kinds = (w: WorkList) => w.sections.map((s) => s.kind);
const names = (w: WorkList, kind: string) => w.sections.find((s) => s.kind === kind)!.items.map((i) => i.planName);

describe('each role sees its own work list', () => {
  it('a surveyor sees the versions in review, with who sent them and when', async () => {
    const w = await workOf('surveyor');
    expect(kinds(w)).toEqual(['review']);
    const [item] = w.sections[0].items;
    expect(w.sections[0].items).toHaveLength(1);
    expect(item).toMatchObject({ versionId: v.sent.versionId, planId: v.sent.planId, projectId: v.sent.projectId, planName: 'Sent north face', reviewState: 'in_review', analysisState: 'done', by: team.users.planner.name, comment: null, number: 1 });
    expect(Date.now() - Date.parse(item.since)).toBeLessThan(5 * 60_000);
  });

  it('a planner sees returned versions with the surveyor\'s comment, and analysed drafts not yet sent', async () => {
    const w = await workOf('planner');
    expect(kinds(w)).toEqual(['returned', 'send']);
    const [returned] = w.sections[0].items;
    expect(w.sections[0].items).toHaveLength(1);
    expect(returned).toMatchObject({ versionId: v.returned.versionId, reviewState: 'returned', by: team.users.surveyor.name, comment: 'Raise the clearance over the spoil heap crest.' });
    // The failed analysis cannot be sent, so it does not wait in this list.
    expect(names(w, 'send')).toEqual(['Draft haul road']);
    expect(w.sections[1].items[0].reviewState).toBe('draft');
  });

  it('a pilot sees signed-off versions only', async () => {
    const w = await workOf('pilot');
    expect(kinds(w)).toEqual(['flight']);
    expect(w.sections[0].items.map((i) => [i.versionId, i.reviewState])).toEqual([[v.signed.versionId, 'signed_off']]);
  });

  it('an owner sees every list', async () => {
    const w = await workOf('owner');
    expect(kinds(w)).toEqual(['review', 'returned', 'send', 'flight']);
    expect(names(w, 'review')).toEqual(['Sent north face']);
    expect(names(w, 'returned')).toEqual(['Returned spoil heap']);
    expect(names(w, 'send')).toEqual(['Draft haul road']);
    expect(names(w, 'flight')).toEqual(['Signed quarry floor']);
  });

  it('a returned version leaves the lists once it is sent again, and a signed-off one moves to the flights', async () => {
    const t = await freshTeam(srv, 'work-moves');
    const x = await createVersion(srv, { teamId: t.teamId, createdBy: t.users.planner.id, planName: 'Moving plan' });
    expect((await t.clients.planner.post(`${x.path}/submit`, {})).status).toBe(200);
    expect((await t.clients.surveyor.post(`${x.path}/return`, { comment: 'Check the takeoff point.' })).status).toBe(200);
    expect(names(await workOf('planner', t), 'returned')).toEqual(['Moving plan']);
    expect((await t.clients.planner.post(`${x.path}/submit`, { comment: 'Takeoff checked on site.' })).status).toBe(200);
    expect(names(await workOf('planner', t), 'returned')).toEqual([]);
    expect(names(await workOf('surveyor', t), 'review')).toEqual(['Moving plan']);
    const unmet: { key: string }[] = (await t.clients.surveyor.get(`${x.path}/review`)).body.unmet;
    const reasons = unmet.map((u) => ({ key: u.key, reason: 'Accepted by the client for this synthetic test site.' }));
    expect((await t.clients.surveyor.post(`${x.path}/sign-off`, { reasons })).status).toBe(200);
    expect(names(await workOf('surveyor', t), 'review')).toEqual([]);
    const flights = await workOf('pilot', t);
    expect(flights.sections[0].items).toMatchObject([{ planName: 'Moving plan', reviewState: 'signed_off', by: t.users.surveyor.name }]);
  }, 30_000);
});

describe('other teams are kept out', () => {
  it('never lists another team\'s versions', async () => {
    const w = await workOf('owner', other);
    expect(names(w, 'review')).toEqual(['Other team plan']);
    const all = (await workOf('owner')).sections.flatMap((s) => s.items.map((i) => i.versionId));
    expect(all).not.toContain(v.otherSent.versionId);
  });

  it('answers 404 to someone outside the team and 401 without a session', async () => {
    for (const role of ['owner', 'surveyor', 'pilot'] as const) {
      const res = await other.clients[role].get(`/api/teams/${team.teamId}/work`);
      expect(res.status, role).toBe(404);
    }
    const res = await fetch(`${srv.url}/api/teams/${team.teamId}/work`);
    expect(res.status).toBe(401);
  });
});
