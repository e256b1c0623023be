import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { reviewActions, reviewStates, reviewTransitions, transitionAllowed, type ReviewAction, type ReviewState } from '../../contracts/reviews';
import { can, roles, type Role } from '../../contracts/roles';
import { auditEvent, planVersion } from '../../db/schema';
import { createVersion, freshTeam, type FreshTeam } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';
import { signOffBody } from '../support/review-helpers';

let srv: TestServer;
let team: FreshTeam;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  team = await freshTeam(srv, 'reviews');
});
afterAll(async () => srv?.stop());

async function stateOf(versionId: string) {
  const [row] = await srv.db.select().from(planVersion).where(eq(planVersion.id, versionId));
  return row;
}

async function reviewEvents(versionId: string) {
  return srv.db
    .select()
    .from(auditEvent)
    .where(and(eq(auditEvent.planVersionId, versionId)))
    .then((rows) => rows.filter((r) => r.action.startsWith('review.')));
}

function expectedStatus(role: Role, action: ReviewAction, state: ReviewState): number {
  if (!can(role, reviewTransitions[action].permission)) return 403;
  return transitionAllowed(action, state) ? 200 : 409;
}

const cases = reviewStates.flatMap((state) => reviewActions.flatMap((action) => roles.map((role) => ({ state, action, role }))));

describe('the review state machine, every transition for every role', () => {
  it('covers 4 states x 3 actions x 4 roles', () => {
    expect(cases).toHaveLength(48);
    // The table itself, spelled out: what may start where.
    expect(reviewTransitions.submit.from).toEqual(['draft', 'returned']);
    expect(reviewTransitions['sign-off'].from).toEqual(['in_review']);
    expect(reviewTransitions.return.from).toEqual(['in_review']);
  });

  it.each(cases)('$role: $action from $state', async ({ state, action, role }) => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: state });
    const body = action === 'return' ? { comment: 'Raise line 2 over the hill.' } : {};
    const res = await team.clients[role].post(`${v.path}/${action}`, action === 'sign-off' ? await signOffBody(team.clients[role], v.path, body) : body);
    const want = expectedStatus(role, action, state);
    expect(res.status, JSON.stringify(res.body)).toBe(want);
    const after = await stateOf(v.versionId);
    const events = await reviewEvents(v.versionId);
    if (want === 200) {
      expect(res.body.reviewState).toBe(reviewTransitions[action].to);
      expect(after.reviewState).toBe(reviewTransitions[action].to);
      expect(events).toHaveLength(1);
      expect(events[0]).toMatchObject({ action: reviewTransitions[action].audit, fromState: state, toState: reviewTransitions[action].to, actorId: team.users[role].id });
    } else {
      expect(after.reviewState).toBe(state);
      expect(events).toHaveLength(0);
      if (want === 403) expect(res.body.error.code).toBe('forbidden');
      if (want === 409) {
        expect(res.body.error.code).toBe('invalid_transition');
        // The message names the current state and where the action may start.
        expect(res.body.error.message).toContain(`is ${state.replace('_', ' ')}`);
        expect(res.body.error.message).toMatch(/only when it is/);
      }
    }
  });
});

describe('sending for review', () => {
  it.each(['queued', 'running', 'failed'] as const)('is refused while the analysis is %s', async (analysisState) => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, analysisState });
    const res = await team.clients.planner.post(`${v.path}/submit`, {});
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('analysis_not_done');
    expect(res.body.error.message).toMatch(analysisState === 'failed' ? /analysis failed/ : new RegExp(`it is ${analysisState}`));
    expect((await stateOf(v.versionId)).reviewState).toBe('draft');
  });

  it('answers 404 for a version of another team, even with a valid id', async () => {
    const other = await freshTeam(srv, 'reviews-other');
    const v = await createVersion(srv, { teamId: other.teamId, createdBy: other.users.planner.id });
    const res = await team.clients.planner.post(`/api/teams/${team.teamId}/plans/${v.planId}/versions/${v.versionId}/submit`, {});
    expect(res.status).toBe(404);
    expect((await stateOf(v.versionId)).reviewState).toBe('draft');
  });

  it('answers 404 when the plan in the path is not the version\'s plan', async () => {
    const a = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id });
    const b = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id });
    const res = await team.clients.planner.post(`/api/teams/${team.teamId}/plans/${b.planId}/versions/${a.versionId}/submit`, {});
    expect(res.status).toBe(404);
  });
});

describe('returning a version', () => {
  it('requires a comment and changes nothing without one', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review' });
    for (const body of [{}, { comment: '   ' }]) {
      const res = await team.clients.surveyor.post(`${v.path}/return`, body);
      expect(res.status).toBe(422);
      expect(res.body.error.fields[0].path).toBe('comment');
    }
    expect((await stateOf(v.versionId)).reviewState).toBe('in_review');
  });
});

describe('a signed-off version is locked', () => {
  it('records the signer and the time, and refuses every further action saying why', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review' });
    const before = Date.now();
    const res = await team.clients.surveyor.post(`${v.path}/sign-off`, await signOffBody(team.clients.surveyor, v.path, { comment: 'Meets the spec.' }));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ reviewState: 'signed_off', locked: true, signedOffBy: { id: team.users.surveyor.id, name: team.users.surveyor.name }, allowedActions: [] });
    const at = Date.parse(res.body.signedOffAt);
    expect(at).toBeGreaterThanOrEqual(before - 1000);
    expect(at).toBeLessThanOrEqual(Date.now() + 1000);
    const row = await stateOf(v.versionId);
    expect(row.signedOffBy).toBe(team.users.surveyor.id);

    for (const [role, action] of [['planner', 'submit'], ['surveyor', 'sign-off'], ['owner', 'return']] as const) {
      const again = await team.clients[role].post(`${v.path}/${action}`, action === 'sign-off' ? await signOffBody(team.clients[role], v.path, { comment: 'again' }) : { comment: 'again' });
      expect(again.status).toBe(409);
      expect(again.body.error.message).toMatch(/is signed off.*locked/);
    }
    expect((await stateOf(v.versionId)).signedOffAt?.getTime()).toBe(row.signedOffAt?.getTime());
  });

  it('is refused by the database itself when code tries to change it', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review' });
    expect((await team.clients.surveyor.post(`${v.path}/sign-off`, await signOffBody(team.clients.surveyor, v.path, {}))).status).toBe(200);
    // drizzle wraps the PostgreSQL error; the trigger's message is on its cause.
    const refusal = (p: Promise<unknown>) => p.then(() => 'no error', (e: { cause?: { message?: string } }) => String(e.cause?.message));
    expect(await refusal(srv.db.update(planVersion).set({ reviewState: 'draft' }).where(eq(planVersion.id, v.versionId)))).toMatch(/signed off and locked/);
    expect(await refusal(srv.db.update(planVersion).set({ result: { lines: [] } }).where(eq(planVersion.id, v.versionId)))).toMatch(/signed off and locked/);
    expect((await stateOf(v.versionId)).reviewState).toBe('signed_off');
  });
});

describe('the audit trail', () => {
  it('keeps who did what, when, to which version, from and to which state, with comments', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id });
    const steps: Array<[Role, ReviewAction, string | undefined]> = [
      ['planner', 'submit', 'First pass.'],
      ['surveyor', 'return', 'Side overlap too low on line 3.'],
      ['planner', 'submit', undefined],
      ['owner', 'sign-off', 'Approved for the client.'],
    ];
    for (const [role, action, comment] of steps) {
      const r = await team.clients[role].post(`${v.path}/${action}`, action === 'sign-off' ? await signOffBody(team.clients[role], v.path, comment ? { comment } : {}) : comment ? { comment } : {});
      expect(r.status, `${role} ${action}`).toBe(200);
    }
    const trail = await team.clients.surveyor.get(`/api/teams/${team.teamId}/plans/${v.planId}/audit`);
    expect(trail.status).toBe(200);
    const review = trail.body.events.filter((e: { action: string }) => e.action.startsWith('review.'));
    expect(review.map((e: any) => [e.actor.name, e.action, e.fromState, e.toState, e.comment, e.versionId, e.versionNumber])).toEqual([
      [team.users.planner.name, 'review.submitted', 'draft', 'in_review', 'First pass.', v.versionId, 1],
      [team.users.surveyor.name, 'review.returned', 'in_review', 'returned', 'Side overlap too low on line 3.', v.versionId, 1],
      [team.users.planner.name, 'review.submitted', 'returned', 'in_review', null, v.versionId, 1],
      [team.users.owner.name, 'review.signed_off', 'in_review', 'signed_off', 'Approved for the client.', v.versionId, 1],
    ]);
    const times = review.map((e: { at: string }) => Date.parse(e.at));
    expect([...times].sort((a, b) => a - b)).toEqual(times);
  });

  it('is not shown to pilots, nor to other teams', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id });
    expect((await team.clients.pilot.get(`/api/teams/${team.teamId}/plans/${v.planId}/audit`)).status).toBe(403);
    const other = await freshTeam(srv, 'audit-other');
    expect((await other.clients.owner.get(`/api/teams/${other.teamId}/plans/${v.planId}/audit`)).status).toBe(404);
  });

  it('tells each role which actions it may take next', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review' });
    const seen = {} as Record<string, string[]>;
    for (const role of ['owner', 'planner', 'surveyor'] as const) seen[role] = (await team.clients[role].get(`${v.path}/review`)).body.allowedActions;
    expect(seen).toEqual({ owner: ['sign-off', 'return'], planner: [], surveyor: ['sign-off', 'return'] });
  });
});
