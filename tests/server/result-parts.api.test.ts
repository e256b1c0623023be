/**
 * A plan result in parts over real HTTP: the overview (no stations; each line's figures and station marks) and one
 * line with its stations. The parts are checked against the whole version read from the same server: every line
 * page equals that line of the whole result, the marks are the stations' own positions and statuses, and the
 * digests add up to the engine's plan-wide summary (computed by its own path in terrain/plan-result.ts).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { planVersionOverviewSchema, planVersionSchema } from '../../contracts/plans';
import { resultLineSchema } from '../../contracts/result-parts';
import { stationStatus, stationStatuses } from '../../contracts/station-status';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';
import { analysedExampleVersion } from '../support/analysed-version';
import { freshTeam } from '../support/fixtures';

/** A small area of the example mission, so the run takes seconds; its lines still number more than five. */
const smaller = {
  area: { type: 'Polygon', coordinates: [[[4.48, 46.766], [4.488, 46.766], [4.488, 46.771], [4.48, 46.771], [4.48, 46.766]]] },
  targetGsdCm: 2.5,
  headingDeg: 90,
  takeoff: { lon: 4.478, lat: 46.768 },
};

let srv: TestServer;
let c: ApiClient;
let versionUrl: string;
beforeAll(async () => {
  srv = await startTestServer({ env: { WORKERS: '1', JOBS_POLL_SECONDS: '0.5' } });
  const t = await freshTeam(srv, 'parts');
  c = t.clients.surveyor;
  const v = await analysedExampleVersion(t, { project: 'Parts', plan: 'Parts plan' }, smaller);
  versionUrl = `/api/teams/${t.teamId}/plans/${v.planId}/versions/${v.versionId}`;
}, 150_000);
afterAll(async () => srv?.stop());

describe('a plan result in parts', () => {
  it('gives an overview without stations whose figures and marks are the whole result\'s, at a fraction of its size', async () => {
    const whole = await c.getBytes(versionUrl);
    const over = await c.getBytes(`${versionUrl}?part=overview`);
    expect(whole.status).toBe(200);
    expect(over.status).toBe(200);
    const w = planVersionSchema.parse(JSON.parse(whole.bytes.toString()));
    const o = planVersionOverviewSchema.parse(JSON.parse(over.bytes.toString()));
    const result = w.result!;
    const overview = o.result!;
    expect(overview.lines.length).toBe(result.lines.length);
    expect(overview.lines.length).toBeGreaterThan(5);
    expect(JSON.stringify(overview)).not.toContain('"stations"');
    expect(overview.summary).toEqual(result.summary);
    expect(overview.warnings).toEqual(result.warnings);
    let photos = 0, flagged = 0;
    for (const [i, line] of overview.lines.entries()) {
      const stations = result.lines[i].stations;
      expect(line.index).toBe(result.lines[i].index);
      expect(line.legs).toEqual(result.lines[i].legs);
      expect(line.marks.lon.length).toBe(stations.length);
      for (const [k, s] of stations.entries()) {
        expect(Math.abs(line.marks.lon[k] - s.lon)).toBeLessThanOrEqual(5.1e-8);
        expect(Math.abs(line.marks.lat[k] - s.lat)).toBeLessThanOrEqual(5.1e-8);
        expect(stationStatuses[line.marks.status[k]]).toBe(stationStatus(s));
      }
      const gsd = stations.map((s) => s.gsdCm).filter((g): g is number => g !== null);
      expect(line.digest.photos).toBe(stations.length);
      expect(line.digest.gsdMinCm).toBe(gsd.length ? Math.min(...gsd) : null);
      expect(line.digest.gsdMaxCm).toBe(gsd.length ? Math.max(...gsd) : null);
      expect(Object.values(line.digest.statusCounts).reduce((a, b) => a + b, 0)).toBe(stations.length);
      photos += line.digest.photos;
      flagged += line.digest.flagged;
    }
    // against the engine's own plan-wide figures
    expect(photos).toBe(result.summary.photoCount);
    expect(flagged).toBe(result.summary.flaggedStationCount);
    // the overview is a fraction of the whole (stations are most of a result)
    expect(over.bytes.byteLength).toBeLessThan(0.35 * whole.bytes.byteLength);
  }, 60_000);

  it('gives each line with its stations, equal to that line of the whole result, cached with an ETag', async () => {
    const w = planVersionSchema.parse((await c.get(versionUrl)).body);
    const result = w.result!;
    const wholeBytes = JSON.stringify(w).length;
    for (const [i, line] of result.lines.entries()) {
      const r = await c.getBytes(`${versionUrl}/lines/${i}`);
      expect(r.status).toBe(200);
      const part = resultLineSchema.parse(JSON.parse(r.bytes.toString()));
      expect(part.versionId).toBe(w.id);
      expect(part.line).toEqual(line);
      expect(r.bytes.byteLength).toBeLessThan(wholeBytes / 3);
    }
    const first = await c.getBytes(`${versionUrl}/lines/0`);
    const etag = first.headers.get('etag');
    expect(etag).toBeTruthy();
    const again = await c.request('GET', `${versionUrl}/lines/0`, { headers: { 'If-None-Match': etag! } });
    expect(again.status).toBe(304);
  }, 60_000);

  it('refuses a bad part or line with a reason, and hides the parts from a stranger', async () => {
    const badPart = await c.get(`${versionUrl}?part=stations`);
    expect(badPart.status).toBe(422);
    expect(badPart.body.error.message).toMatch(/part=overview/);
    const notNumber = await c.get(`${versionUrl}/lines/first`);
    expect(notNumber.status).toBe(422);
    expect(notNumber.body.error.message).toMatch(/numbered from 0/);
    expect((await c.get(`${versionUrl}/lines/9999`)).status).toBe(404);
    const stranger = new ApiClient(srv.url);
    const se = uniqueEmail('parts-stranger');
    await stranger.signUp(se, 'parts password 2', 'Stranger');
    await stranger.signIn(se, 'parts password 2');
    expect((await stranger.get(`${versionUrl}?part=overview`)).status).toBe(404);
    expect((await stranger.get(`${versionUrl}/lines/0`)).status).toBe(404);
  });
});
