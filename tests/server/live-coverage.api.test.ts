/**
 * Live coverage while a signed-off version is flown: photos the link records become the as-flown coverage, pushed
 * over server-sent events. Checked against the terrain engine's as-flown analysis (terrain/as-flown.ts) run here
 * directly on the same poses, and on ground passed so far with photos left out on purpose.
 */
import crypto from 'node:crypto';
import { PNG } from 'pngjs';
import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LinkState } from '../../contracts/link-state';
import type { LiveCoverage } from '../../contracts/live-coverage';
import { nodeInflate } from '../../server/analysis/terrain-tasks';
import { analyseAsFlown } from '../../terrain/as-flown';
import type { FlownPhoto } from '../../terrain/as-flown-match';
import { coverageLayout, gridCellM } from '../../terrain/coverage-grid';
import { resolveCoverageInput } from '../../terrain/coverage-spec';
import { writeFloat32GeoTiff } from '../../terrain/geotiff-write';
import { missionBboxWgs84, readDem, WGS84, type PlanResult } from '../../terrain/index';
import { resolveMission } from '../../terrain/mission';
import { analysedResult, createVersion, fixturePassword, freshTeam, storeSyntheticDem, syntheticGrid, syntheticMission, type FreshTeam, type VersionFixture } from '../support/fixtures';
import { metresPerDeg, startSimVehicle } from '../support/sim-vehicle';
import { startTestServer, type TestServer } from '../support/test-server';

const root = fileURLToPath(new URL('../../', import.meta.url));
let srv: TestServer;
let team: FreshTeam;

/** A signed-off version whose site's grid (the synthetic hill) is in storage, as an upload would leave it. */
async function flyableVersion(name: string): Promise<VersionFixture> {
  const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off', planName: name });
  await storeSyntheticDem(srv, v.siteId);
  return v;
}

/** An open event stream: every `coverage` event so far, and a wait for one that satisfies a condition. */
async function openLive(path: string) {
  const c = team.clients.pilot;
  const ctrl = new AbortController();
  const res = await fetch(srv.url + path, { headers: { Cookie: c.cookieHeader(), Origin: srv.url }, signal: ctrl.signal });
  const events: LiveCoverage[] = [];
  const links: LinkState[] = [];
  const waiters: Array<{ ok: (d: LiveCoverage) => boolean; resolve: (d: LiveCoverage) => void }> = [];
  if (res.ok && res.body) {
    void (async () => {
      const reader = res.body!.pipeThrough(new TextDecoderStream()).getReader();
      let buf = '';
      try {
        for (;;) {
          const { value, done } = await reader.read();
          if (done) return;
          buf += value;
          let k: number;
          while ((k = buf.indexOf('\n\n')) >= 0) {
            const block = buf.slice(0, k);
            buf = buf.slice(k + 2);
            const data = /^data: (.*)$/m.exec(block);
            if (/^event: link$/m.test(block) && data) links.push(JSON.parse(data[1]) as LinkState);
            if (!/^event: coverage$/m.test(block) || !data) continue;
            const doc = JSON.parse(data[1]) as LiveCoverage;
            events.push(doc);
            for (const w of waiters.splice(0)) (w.ok(doc) ? w.resolve(doc) : waiters.push(w));
          }
        }
      } catch {
        /* aborted */
      }
    })();
  }
  return {
    res,
    events,
    links,
    next: (ok: (d: LiveCoverage) => boolean, timeoutMs = 45_000) =>
      new Promise<LiveCoverage>((resolve, reject) => {
        const hit = events.find(ok);
        if (hit) return resolve(hit);
        const t = setTimeout(() => reject(new Error(`no matching event within ${timeoutMs} ms; got ${events.map((e) => `${e.state}/${e.photoCount}${e.reason ? ` (${e.reason})` : ''}`).join(', ')}`)), timeoutMs);
        waiters.push({ ok, resolve: (d) => { clearTimeout(t); resolve(d); } });
      }),
    close: () => ctrl.abort(),
  };
}

/** The engine's as-flown analysis of `photos` run directly, with the raster settings the `terrain as-flown` command takes. */
async function directAsFlown(photos: FlownPhoto[]) {
  const input = syntheticMission();
  const mission = resolveMission(input);
  const { spec, settings } = resolveCoverageInput(input, mission);
  const g = syntheticGrid();
  const bytes = writeFloat32GeoTiff({ width: g.width, height: g.height, bands: [g.data], bandNames: ['height'], transform: g.transform, epsg: g.crs.epsg!, geographic: false, nodata: -9999 });
  const grid = await readDem(bytes, { window: { bbox: missionBboxWgs84(input), crs: WGS84, marginPx: 2 }, inflate: nodeInflate });
  const ring = mission.area.coordinates[0];
  const cellM = settings.cellM ?? gridCellM(grid, ring.slice(0, -1).reduce((t, p) => t + p[1], 0) / (ring.length - 1));
  coverageLayout(grid, mission.area, cellM, settings.maxCells);
  return analyseAsFlown(grid, mission, analysedResult() as unknown as PlanResult, photos, spec, { cellM, maxCells: settings.maxCells, imageErrorPx: settings.imageErrorPx, occlusion: settings.occlusion });
}

const round6 = (v: number) => Math.round(v * 1e6) / 1e6;

beforeAll(async () => {
  srv = await startTestServer({ web: false, env: { LIVE_COVERAGE_SECONDS: '0.3' } });
  team = await freshTeam(srv, 'live');
});
afterAll(async () => srv?.stop());

describe('live coverage while the aircraft flies', () => {
  it('grows over server-sent events as the link records a simulated flight, and ends equal to the engine\'s as-flown analysis of the same poses', async () => {
    const v = await flyableVersion('Scar edge live');
    const live = await openLive(`/api/teams/${team.teamId}/flights/${v.versionId}/live`);
    try {
      expect(live.res.status).toBe(200);
      expect(live.res.headers.get('content-type')).toMatch(/^text\/event-stream/);
      const first = await live.next(() => true);
      expect(first).toMatchObject({ state: 'empty', photoCount: 0, versionId: v.versionId });
      expect(first.cautions.at(-1)).toMatch(/Local regulations and licensed practice govern/);

      const sim = await startSimVehicle();
      try {
        const args = ['run', '-s', 'link', '--', '--server', srv.url, '--email', team.users.pilot.email, '--password', fixturePassword, '--version', v.versionId, '--udp', `127.0.0.1:${sim.port}`, '--follow'];
        const child = spawn('npm', args, { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] });
        let out = '';
        child.stdout!.on('data', (b) => (out += b));
        child.stderr!.on('data', (b) => (out += b));
        const exited = new Promise<number>((resolve) => child.on('exit', (code) => resolve(code ?? -1)));
        await new Promise<void>((resolve, reject) => {
          child.stdout!.on('data', () => /^READY: /m.test(out) && resolve());
          child.on('exit', () => reject(new Error(`link exited before READY: ${out}`)));
        });
        // 90 m of drift across the east-west lines: the area's edge strip falls short, so the shares below are not all 1.
        await sim.fly({ driftNorthM: 90, homeMslM: 215 });
        expect(await exited, out).toBe(0);
      } finally {
        await sim.stop();
      }
      // The link's steps reached the stream as it went (README: the leg sheet shows the latest), with the aircraft named.
      expect(live.links.map((l) => l.step)).toEqual(['connecting', 'uploading', 'verifying', 'ready', 'following', 'finished']);
      expect(live.links.at(-1)).toMatchObject({ aircraft: { sysid: 1, compid: 1, mavlink: 1 }, reportedBy: expect.any(String) });
      expect(live.links.at(-1)!.connection).toMatch(/^udp 127\.0\.0\.1:\d+$/);
      expect(new Set(live.links.map((l) => l.run)).size).toBe(1);
      const total = sim.photos.length;
      const last = await live.next((d) => d.photoCount === total && d.state === 'ready');
      // Counts never go down while the flight is followed, and the coverage was pushed while it was still being flown.
      const counts = live.events.map((e) => e.photoCount);
      expect(counts).toEqual([...counts].sort((a, b) => a - b));
      expect(counts.some((c) => c > 0 && c < total)).toBe(true);

      // The same poses (the stored photos, heights above takeoff) through the engine directly.
      const stored = (await team.clients.pilot.get(`/api/teams/${team.teamId}/flights/${v.versionId}/triggers`)).body.triggers as Array<Record<string, number | string>>;
      const photos: FlownPhoto[] = stored.map((t) => ({
        file: `${String(t.sortie).slice(0, 8)}-${t.imageIndex}`, lon: t.lon as number, lat: t.lat as number, altitudeM: t.altitudeAboveTakeoffM as number, altitudeRef: 'takeoff',
        yawDeg: t.yawDeg as number, pitchDeg: t.pitchDeg as number, rollDeg: t.rollDeg as number, time: String(t.capturedAt),
      }));
      const direct = await directAsFlown(photos);
      expect(last.matched).toBe(direct.match.matched.length);
      expect(last.extra).toBe(direct.match.extra.length);
      expect(last.raster).toEqual({ width: direct.flown.cells.width, height: direct.flown.cells.height, cellM: round6(direct.flown.cells.cellM) });
      expect(last.flown!.shareAll).toBe(round6(direct.compliance.flown.shareAll));
      expect(last.flown!.items.map((i) => [i.item, i.share])).toEqual(direct.compliance.flown.items.map((i) => [i.item, round6(i.share)]));
      expect(last.flown!.shareAll).toBeLessThan(1);
      expect(last.passed!.shortCells).toBeGreaterThan(0);
      // 90 m across is more than half the line spacing: photos match the neighbouring line's stations, some planned
      // stations have no photo; the last line's last station is still reached, so every station counts as passed.
      expect(last.progress).toEqual({ line: analysedResult().lines.length, station: analysedResult().lines.at(-1)!.stations.length });
      expect(last.missedSoFar).toBe(direct.match.missed.length);
      console.log(`live coverage of the simulated flight: ${total} photos, events at ${counts.join(' ')} photos, share of area meeting the spec ${last.flown!.shareAll}, passed ${last.passed!.cells} cells, short ${last.passed!.shortCells}`);
    } finally {
      live.close();
    }
  }, 120_000);

  it('highlights ground already passed that the photos leave short, and only once the aircraft has passed it', async () => {
    const v = await flyableVersion('Scar edge gap');
    const live = await openLive(`/api/teams/${team.teamId}/flights/${v.versionId}/live?map=1`);
    const lean = await openLive(`/api/teams/${team.teamId}/flights/${v.versionId}/live`);
    try {
      await live.next((d) => d.state === 'empty');
      const plan = analysedResult();
      const line1 = plan.lines[0].stations;
      // Photos on the planned stations of line 1 only, the middle six left out (as if the camera stopped).
      const gap = [Math.floor(line1.length / 2) - 3, Math.floor(line1.length / 2) + 3];
      const shot = line1.map((s, k) => ({ s, k })).filter(({ k }) => k < gap[0] || k >= gap[1]);
      const sortie = crypto.randomUUID();
      const at = Date.parse('2026-12-02T10:00:00Z');
      const triggers = shot.map(({ s, k }) => ({ imageIndex: k, lat: s.lat, lon: s.lon, altitudeAboveTakeoffM: s.altitudeAboveTakeoffM, altitudeMslM: 300, rollDeg: 0, pitchDeg: 0, yawDeg: plan.lines[0].headingDeg, capturedAt: new Date(at + k * 2000).toISOString() }));
      expect((await team.clients.pilot.post(`/api/teams/${team.teamId}/flights/${v.versionId}/triggers`, { sortie, triggers })).status).toBe(201);
      const doc = await live.next((d) => d.state === 'ready' && d.photoCount === triggers.length);
      expect(doc.progress).toEqual({ line: 1, station: line1.length });
      expect(doc.missedSoFar).toBe(6);
      // The gap is short and passed; its largest patch lies on line 1 between the stations around the gap.
      expect(doc.passed!.shortCells).toBeGreaterThan(0);
      const p = doc.passed!.patches[0];
      const m = metresPerDeg(p.centroid.lat);
      const distToLine1 = Math.min(...line1.slice(gap[0], gap[1]).map((s) => Math.hypot((s.lon - p.centroid.lon) * m.lon, (s.lat - p.centroid.lat) * m.lat)));
      expect(distToLine1).toBeLessThan(plan.summary.lineSpacingM);
      // The map's hatching is exactly the short cells: one opaque pixel per cell, on the raster's lattice.
      const mask = PNG.sync.read(Buffer.from(doc.map!.shortPngBase64, 'base64'));
      expect([mask.width, mask.height]).toEqual([doc.raster!.width, doc.raster!.height]);
      let opaque = 0;
      for (let i = 3; i < mask.data.length; i += 4) if (mask.data[i] === 255) opaque++;
      expect(opaque).toBe(doc.passed!.shortCells);
      // Without ?map=1 the same document comes without its images.
      const leanDoc = await lean.next((d) => d.state === 'ready' && d.photoCount === triggers.length);
      expect(leanDoc).toEqual({ ...doc, map: null });
      // Ground under line 2 onwards is not passed yet: the passed area is less than half the area's cells.
      expect(doc.passed!.cells).toBeLessThan(doc.raster!.width * doc.raster!.height / 2);
      expect(doc.flown!.shareAll).toBeLessThan(0.5);
    } finally {
      live.close();
      lean.close();
    }
  });

  it('takes link reports from those who record flights, for signed-off versions, and gives the latest to a new watcher', async () => {
    const v = await flyableVersion('Scar edge link');
    const path = `/api/teams/${team.teamId}/flights/${v.versionId}/link-state`;
    const body = { run: crypto.randomUUID(), step: 'not-ready', message: 'No heartbeat from an aircraft.', connection: 'serial /dev/ttyUSB0 at 57600 baud', aircraft: null };
    expect((await team.clients.surveyor.post(path, body)).status).toBe(403);
    const bad = await team.clients.pilot.post(path, { ...body, step: 'flying' });
    expect(bad.status).toBe(422);
    expect(bad.body.error.message).toMatch(/^step/);
    expect((await team.clients.pilot.post(path, body)).status).toBe(201);
    const draft = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review', planName: 'Scar edge link draft' });
    expect((await team.clients.owner.post(`/api/teams/${team.teamId}/flights/${draft.versionId}/link-state`, body)).status).toBe(409);
    const live = await openLive(`/api/teams/${team.teamId}/flights/${v.versionId}/live`);
    try {
      await live.next((d) => d.state === 'empty');
      await expect.poll(() => live.links.length).toBe(1);
      expect(live.links[0]).toMatchObject({ step: 'not-ready', connection: 'serial /dev/ttyUSB0 at 57600 baud', aircraft: null });
    } finally {
      live.close();
    }
  });

  it('ends its open streams when the server stops, so stopping never waits on a watcher', async () => {
    const v = await flyableVersion('Scar edge shutdown');
    const other = await startTestServer({ web: false });
    const res = await fetch(`${other.url}/api/teams/${team.teamId}/flights/${v.versionId}/live`, { headers: { Cookie: team.clients.pilot.cookieHeader(), Origin: other.url } });
    expect(res.status).toBe(200);
    const reader = res.body!.getReader();
    await reader.read(); // the stream is open
    const t0 = Date.now();
    await other.stop();
    for (;;) if ((await reader.read()).done) break;
    expect(Date.now() - t0).toBeLessThan(5000);
  });

  it('streams signed-off versions only: 409 for a planner on a draft, not found for a pilot', async () => {
    const draft = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review', planName: 'Scar edge draft' });
    const path = `/api/teams/${team.teamId}/flights/${draft.versionId}/live`;
    const planner = await team.clients.planner.get(path);
    expect(planner.status).toBe(409);
    expect(planner.body.error.code).toBe('not_signed_off');
    expect((await team.clients.pilot.get(path)).status).toBe(404);
  });
});
