/**
 * The seeded demo as a newcomer meets it: the demo pilot has a signed-off flight from the first sign-in (its leg
 * sheet and MAVLink items load), signed off by the demo surveyor with a reason beside every requirement it misses.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { flightListSchema } from '../../contracts/flights';
import { complianceReportSchema } from '../../contracts/reports';
import type { Role } from '../../contracts/roles';
import { demoUsers } from '../../contracts/demo-team';
import { demoProject } from '../../server/seed/demo-project';
import { demoClients, demoTeamId } from '../support/demo';
import type { ApiClient } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

let srv: TestServer;
let clients: Record<Role, ApiClient>;
let teamId: string;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  clients = await demoClients(srv);
  teamId = await demoTeamId(srv);
});
afterAll(async () => srv?.stop());

describe('the seeded demo', () => {
  it('gives the demo pilot a signed-off flight, with its leg sheet and mission items', async () => {
    const flights = flightListSchema.parse((await clients.pilot.get(`/api/teams/${teamId}/flights`)).body).flights;
    const f = flights.find((x) => x.planName === demoProject.flightPlanName);
    expect(f).toBeDefined();
    expect(f!.signedOffBy).toBe(demoUsers.find((u) => u.role === 'surveyor')!.name);
    expect(f!.photoCount).toBeGreaterThan(0);
    expect((await clients.pilot.get(`/api/teams/${teamId}/flights/${f!.versionId}/leg-sheet`)).status).toBe(200);
    expect((await clients.pilot.get(`/api/teams/${teamId}/flights/${f!.versionId}/mission-items`)).status).toBe(200);
  });

  it('prints the surveyor\'s reason beside every requirement the flight misses', async () => {
    const f = flightListSchema.parse((await clients.surveyor.get(`/api/teams/${teamId}/flights`)).body).flights.find((x) => x.planName === demoProject.flightPlanName)!;
    const r = complianceReportSchema.parse((await clients.surveyor.get(`/api/teams/${teamId}/plans/${f.planId}/versions/${f.versionId}/report`)).body);
    expect(r.signOff.state).toBe('signed_off');
    const unmet = r.checks.filter((c) => !c.pass).map((c) => c.key).sort();
    expect(r.signOff.reasons.map((x) => x.key).sort()).toEqual(unmet);
    for (const x of r.signOff.reasons) expect(x.reason).toMatch(/^Demo: /);
  });
});
