/** Survey areas at and past the corner limit over real HTTP: refused with the limit stated, crossings located. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MAX_AREA_CORNERS } from '../../contracts/mission';
import { startTestServer, type TestServer } from '../support/test-server';
import { wavyRing, withSwappedCorners } from '../support/area-rings';
import { areaLimitsFixture, type AreaLimitsFixture } from '../support/area-limits-fixture';

let srv: TestServer;
let fx: AreaLimitsFixture;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  fx = await areaLimitsFixture(srv, 'area-limits');
});
afterAll(async () => srv?.stop());

describe('survey area size and crossings', () => {
  it('refuses a 10,000-corner area with a 422 that states the limit', async () => {
    const r = await fx.c.post(fx.plansPath, fx.planBody(wavyRing(10_000)));
    expect(r.status).toBe(422);
    expect(r.body.error.fields.map((f: { path: string }) => f.path)).toContain('input.area');
    expect(r.body.error.message).toContain(`the limit is ${MAX_AREA_CORNERS.toLocaleString('en')}`);
    expect(r.body.error.message).toContain('10,000 corners');
  });

  it('refuses a 1,999-corner area that crosses itself, saying where', async () => {
    const r = await fx.c.post(fx.plansPath, fx.planBody(withSwappedCorners(wavyRing(MAX_AREA_CORNERS - 1), 1200)));
    expect(r.status).toBe(422);
    expect(r.body.error.message).toMatch(/crosses itself \(edges 1199 and 1201, near lon 4\.\d{5}, lat 46\.\d{5}\)/);
  });

  it('saves a 1,999-corner area and lists it without checking its geometry again', async () => {
    const t0 = performance.now();
    const created = await fx.c.post(fx.plansPath, fx.planBody(wavyRing(MAX_AREA_CORNERS - 1), 'Large outline'));
    const saveMs = performance.now() - t0;
    expect(created.status).toBe(201);
    expect(created.body.input.area.coordinates[0]).toHaveLength(MAX_AREA_CORNERS);
    const t1 = performance.now();
    const list = await fx.c.get(fx.plansPath);
    const listMs = performance.now() - t1;
    expect(list.status).toBe(200);
    expect(list.body.plans.map((p: { id: string }) => p.id)).toContain(created.body.id);
    console.info(`1,999-corner plan: saved in ${saveMs.toFixed(0)} ms, listed in ${listMs.toFixed(0)} ms`);
  });
});
