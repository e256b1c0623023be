import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createVersion, freshTeam, type FreshTeam } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';
import { signOffBody } from '../support/review-helpers';

// Independent check (common practice in survey QA): the person who ran a version or sent it for review
// does not also sign it off; an owner holds both rights, so the rule is what keeps the check independent.
let srv: TestServer;
let team: FreshTeam;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  team = await freshTeam(srv, 'independence');
});
afterAll(async () => srv?.stop());

describe('sign-off needs a second person', () => {
  it('refuses an owner signing off a version the owner ran', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.owner.id, reviewState: 'in_review' });
    const r = await team.clients.owner.post(`${v.path}/sign-off`, await signOffBody(team.clients.owner, v.path, {}));
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe('not_independent');
    expect(r.body.error.message).toMatch(/another surveyor or owner/);
    const ok = await team.clients.surveyor.post(`${v.path}/sign-off`, await signOffBody(team.clients.surveyor, v.path, {}));
    expect(ok.status).toBe(200);
  });

  it('refuses an owner signing off a version the owner sent for review', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'draft' });
    expect((await team.clients.owner.post(`${v.path}/submit`, {})).status).toBe(200);
    const r = await team.clients.owner.post(`${v.path}/sign-off`, await signOffBody(team.clients.owner, v.path, {}));
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe('not_independent');
    expect((await team.clients.owner.post(`${v.path}/return`, { comment: 'Line 3 crosses the spoil heap too low.' })).status).toBe(200);
  });

  it('offers sign-off only to someone who neither ran nor sent the version', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'draft' });
    expect((await team.clients.owner.post(`${v.path}/submit`, {})).status).toBe(200);
    const ownerView = await team.clients.owner.get(`${v.path}/review`);
    expect(ownerView.body.allowedActions).toEqual(['return']);
    const surveyorView = await team.clients.surveyor.get(`${v.path}/review`);
    expect(surveyorView.body.allowedActions.sort()).toEqual(['return', 'sign-off']);
  });

  it('lets an owner sign off what a planner ran and sent', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'draft' });
    expect((await team.clients.planner.post(`${v.path}/submit`, {})).status).toBe(200);
    expect((await team.clients.owner.post(`${v.path}/sign-off`, await signOffBody(team.clients.owner, v.path, {}))).status).toBe(200);
  });
});
