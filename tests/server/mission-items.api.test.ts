/**
 * MAVLink hand-off end to end: the mission-items route, the link's upload and read-back against a simulated aircraft
 * built on the independent `mavlink` npm package (tests/support/sim-vehicle.ts), and `npm run link` as a crew runs it.
 */
import { execFile, spawn } from 'node:child_process';
import crypto from 'node:crypto';
import dgram from 'node:dgram';
import net from 'node:net';
import readline from 'node:readline';
import { fileURLToPath } from 'node:url';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { LegSheet } from '../../contracts/flights';
import type { MissionItems } from '../../contracts/mission-items';
import { MavlinkChannel } from '../../cli/link/mavlink-channel';
import { compareMission, downloadMission, uploadMission } from '../../cli/link/mission-transfer';
import { openTransport, type Transport } from '../../cli/link/transport';
import { analysedResult, createVersion, fixturePassword, freshTeam, solvedMission, solvedResult, type FreshTeam, type VersionFixture } from '../support/fixtures';
import { enumValue, metresPerDeg, startSimVehicle, type SimVehicle } from '../support/sim-vehicle';
import { startTestServer, type TestServer } from '../support/test-server';

const root = fileURLToPath(new URL('../../', import.meta.url));
let srv: TestServer;
let team: FreshTeam;
let signed: VersionFixture;
let draft: VersionFixture;
let solved: VersionFixture;
let doc: MissionItems;
let sheet: LegSheet;
const open: Array<{ stop: () => unknown }> = [];

const itemsPath = (v: VersionFixture) => `/api/teams/${team.teamId}/flights/${v.versionId}/mission-items`;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  team = await freshTeam(srv, 'mavlink');
  signed = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off', planName: 'Scar edge' });
  draft = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review', planName: 'Scar edge draft' });
  solved = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off', planName: 'Scar edge solved', input: solvedMission(), result: solvedResult() });
  const r = await team.clients.pilot.get(itemsPath(signed));
  expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(200);
  doc = r.body;
  sheet = (await team.clients.pilot.get(`/api/teams/${team.teamId}/flights/${signed.versionId}/leg-sheet`)).body;
});
afterEach(async () => {
  for (const o of open.splice(0)) await o.stop();
});
afterAll(async () => srv?.stop());

async function linkTo(sim: SimVehicle): Promise<MavlinkChannel> {
  const t: Transport = await openTransport({ kind: 'udp', host: '127.0.0.1', port: sim.port });
  const ch = new MavlinkChannel(t);
  open.push({ stop: async () => { ch.stop(); await t.close(); } });
  ch.startHeartbeat();
  expect(await ch.findAircraft(5000)).toEqual({ sysid: 1, compid: 1, version: 1 });
  return ch;
}

describe('mission items of a version', () => {
  it('gives a pilot the signed-off version as MAVLink items with the altitude frame and the cautions', async () => {
    expect(doc.altitude.frameName).toBe('MAV_FRAME_GLOBAL_RELATIVE_ALT_INT');
    expect(doc.altitude.frame).toBe(6);
    expect(doc.altitude.reference).toMatch(/above the takeoff point/);
    expect(doc.altitude.verticalDatum).toBe('EGM96 geoid');
    expect(doc.cautions.join(' ')).toMatch(/home position the autopilot records when it arms/);
    expect(doc.cautions.at(-1)).toMatch(/Local regulations and licensed practice govern/);
    expect(doc.lines).toHaveLength(sheet.lines.length);
    expect(doc.lines.every((l) => l.triggerDistanceM === analysedResult().summary.triggerDistanceM && l.speedMps === sheet.speedMps)).toBe(true);
    expect(doc.protocol.source).toMatch(/common\.xml/);
  });

  it('offers it as a file on request', async () => {
    const r = await team.clients.pilot.get(`${itemsPath(signed)}?download=1`);
    expect(r.headers.get('content-disposition')).toBe('attachment; filename="scar-edge-v1-mission-items.json"');
  });

  it('is also beside the flight exports, under the plan and version, with the same answers', async () => {
    const beside = (v: VersionFixture) => `${v.path}/mission-items`;
    const r = await team.clients.pilot.get(beside(signed));
    expect(r.status).toBe(200);
    expect({ ...r.body, generatedAt: null }).toEqual({ ...doc, generatedAt: null });
    expect((await team.clients.planner.get(beside(draft))).status).toBe(409);
    expect((await team.clients.pilot.get(beside(draft))).status).toBe(404);
    // A version under another plan's path is not found.
    expect((await team.clients.pilot.get(`/api/teams/${team.teamId}/plans/${draft.planId}/versions/${signed.versionId}/mission-items`)).status).toBe(404);
  });

  it('refuses a version that is not signed off: 409 for the planner, not found for the pilot', async () => {
    const p = await team.clients.planner.get(itemsPath(draft));
    expect(p.status).toBe(409);
    expect(p.body.error.code).toBe('not_signed_off');
    expect(p.body.error.message).toMatch(/not signed off \(it is in review\).*signed-off versions only/);
    expect((await team.clients.pilot.get(itemsPath(draft))).status).toBe(404);
  });
});

describe('upload to a simulated aircraft on an independent MAVLink implementation', () => {
  it('stores items that decode to the version\'s legs: positions to 1e-7 degree, altitudes to 1 cm, trigger distances exact', async () => {
    const sim = await startSimVehicle();
    open.push(sim);
    const ch = await linkTo(sim);
    const log: string[] = [];
    await uploadMission(ch, doc.items, { timeoutMs: 1500, retries: 5, log: (l) => log.push(l) });
    expect(sim.items).toHaveLength(doc.items.length);
    // MAVLink 1 frames carry the base fields only: 37 payload bytes for MISSION_ITEM_INT, without mission_type.
    expect(new Set(sim.received.filter((m) => m.name === 'MISSION_ITEM_INT').map((m) => m.payloadLength))).toEqual(new Set([37]));
    const v = (name: string) => enumValue(sim.codec, name);
    const WAYPOINT = v('MAV_CMD_NAV_WAYPOINT');
    const TRIGG = v('MAV_CMD_DO_SET_CAM_TRIGG_DIST');
    const stationsOf = analysedResult().lines;
    sheet.lines.forEach((line, li) => {
      const m = doc.lines[li];
      const own = sim.items.slice(m.firstSeq, m.lastSeq + 1);
      const wps = own.filter((i) => i.command === WAYPOINT);
      // The legs' ends from the leg sheet, and the first photo station of the analysis, in flying order.
      const want = [
        { lat: line.legs[0].start.lat, lon: line.legs[0].start.lon, z: line.legs[0].altitudeAboveTakeoffM.start },
        { lat: stationsOf[li].stations[0].lat, lon: stationsOf[li].stations[0].lon, z: stationsOf[li].stations[0].altitudeAboveTakeoffM },
        ...line.legs.slice(1).map((g) => ({ lat: g.start.lat, lon: g.start.lon, z: g.altitudeAboveTakeoffM.start })),
        { lat: line.legs.at(-1)!.end.lat, lon: line.legs.at(-1)!.end.lon, z: line.legs.at(-1)!.altitudeAboveTakeoffM.end },
      ];
      expect(wps).toHaveLength(want.length);
      wps.forEach((w, k) => {
        expect(w.frame).toBe(v('MAV_FRAME_GLOBAL_RELATIVE_ALT_INT'));
        expect(Math.abs(w.x / 1e7 - want[k].lat)).toBeLessThanOrEqual(1e-7);
        expect(Math.abs(w.y / 1e7 - want[k].lon)).toBeLessThanOrEqual(1e-7);
        expect(Math.abs(w.z - want[k].z)).toBeLessThanOrEqual(0.01);
      });
      const trig = own.filter((i) => i.command === TRIGG);
      expect(trig.map((t) => t.param1)).toEqual([Math.fround(analysedResult().summary.triggerDistanceM), 0]);
    });
    expect(sim.items[0].command).toBe(v('MAV_CMD_NAV_TAKEOFF'));
    expect(sim.items.at(-1)!.command).toBe(v('MAV_CMD_NAV_RETURN_TO_LAUNCH'));
    expect(sim.sent.filter((s) => s === 'MISSION_ACK')).toHaveLength(1);
    expect(log.some((l) => /again/.test(l))).toBe(false);

    const back = await downloadMission(ch, { timeoutMs: 1500, retries: 5, log: () => undefined });
    expect(compareMission(doc.items, back)).toEqual([]);
  });

  it('a solved version: each leg\'s own speed and tightest photo spacing decode exactly, altitudes are datum heights less the takeoff ground', async () => {
    const r = await team.clients.pilot.get(itemsPath(solved));
    expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(200);
    const solvedDoc: MissionItems = r.body;
    const sim = await startSimVehicle();
    open.push(sim);
    const ch = await linkTo(sim);
    await uploadMission(ch, solvedDoc.items, { timeoutMs: 1500, retries: 5, log: () => undefined });
    expect(sim.items).toHaveLength(solvedDoc.items.length);
    const v = (name: string) => enumValue(sim.codec, name);
    const WP = v('MAV_CMD_NAV_WAYPOINT');
    const SPEED = v('MAV_CMD_DO_CHANGE_SPEED');
    const TRIGG = v('MAV_CMD_DO_SET_CAM_TRIGG_DIST');
    const plan = solvedResult();
    const groundM = plan.takeoff.groundM;
    let spacingChanges = 0;
    let speedChanges = 0;
    plan.lines.forEach((line, li) => {
      const m = solvedDoc.lines[li];
      const own = sim.items.slice(m.firstSeq, m.lastSeq + 1);
      // Play the decoded items as an autopilot would (mavlink.io mission protocol: a DO item runs once the NAV item
      // before it is reached): the speed and spacing in force on each leg are the leg's own, as float32 (common.xml
      // MISSION_ITEM_INT param1..4 are float), so exact.
      let speed = NaN;
      let camera = 0;
      let leg = 0;
      const checkLeg = () => {
        if (leg === 0) return;
        const g = line.legs[leg - 1];
        expect(speed).toBe(Math.fround(g.speedMps!));
        if (camera !== 0) expect(camera).toBe(Math.fround(g.triggerDistanceM!.min));
      };
      own.forEach((it, k) => {
        if (it.command === WP) {
          // Which leg a waypoint belongs to is the item's place along the line; take it from the JSON's about.
          leg = solvedDoc.items[m.firstSeq + k].about.leg!;
          expect(it.frame).toBe(v('MAV_FRAME_GLOBAL_RELATIVE_ALT_INT'));
        }
        if (it.command === SPEED) speed = it.param2;
        if (it.command === TRIGG) camera = it.param1;
        if (it.command === TRIGG && it.param1 !== 0 && solvedDoc.items[m.firstSeq + k].about.kind === 'camera-spacing') spacingChanges++;
        if (it.command === SPEED && solvedDoc.items[m.firstSeq + k].about.kind === 'speed' && solvedDoc.items[m.firstSeq + k].about.leg! > 1) speedChanges++;
        const next = own[k + 1];
        if (next === undefined || next.command === WP) checkLeg();
      });
      // Leg ends: the altitude above the takeoff point is the leg's height above the grid's datum less the takeoff's
      // ground height above the same datum (both from the stored analysis), to 1 cm.
      const wps = own.filter((i) => i.command === WP);
      const starts = line.legs.map((g) => ({ lat: g.start.lat, lon: g.start.lon, z: g.altitudeStartM - groundM }));
      for (const s of starts) {
        const w = wps.find((x) => Math.abs(x.x / 1e7 - s.lat) <= 1e-7 && Math.abs(x.y / 1e7 - s.lon) <= 1e-7);
        expect(w, `waypoint at ${s.lat}, ${s.lon}`).toBeDefined();
        expect(Math.abs(w!.z - s.z)).toBeLessThanOrEqual(0.01);
      }
      const last = line.legs.at(-1)!;
      expect(Math.abs(wps.at(-1)!.z - (last.altitudeEndM - groundM))).toBeLessThanOrEqual(0.01);
    });
    // The fixture slows legs over the hill and spaces photos by the ground under each leg: both kinds of change happen.
    expect(speedChanges).toBeGreaterThan(0);
    expect(spacingChanges).toBeGreaterThan(0);
    expect(compareMission(solvedDoc.items, await downloadMission(ch, { timeoutMs: 1500, retries: 5, log: () => undefined }))).toEqual([]);
  });

  it('the read-back catches an aircraft that stores an item changed (a photo spacing rounded to whole metres)', async () => {
    const on = doc.items.find((i) => i.about.kind === 'camera-on')!;
    const rounded = Math.round(on.param1!);
    expect(rounded).not.toBe(Math.fround(on.param1!));
    const sim = await startSimVehicle({ alterItems: { [on.seq]: { param1: rounded } } });
    open.push(sim);
    const ch = await linkTo(sim);
    await uploadMission(ch, doc.items, { timeoutMs: 1500, retries: 5, log: () => undefined });
    const back = await downloadMission(ch, { timeoutMs: 1500, retries: 5, log: () => undefined });
    expect(compareMission(doc.items, back)).toEqual([`item ${on.seq} param1: sent ${Math.fround(on.param1!)}, the aircraft holds ${rounded}`]);
  });

  it('sends an item again when the aircraft drops it and never asks for the next one', async () => {
    const sim = await startSimVehicle({ dropItemsOnce: [0, 5] });
    open.push(sim);
    const ch = await linkTo(sim);
    const log: string[] = [];
    const r = await uploadMission(ch, doc.items, { timeoutMs: 200, retries: 3, log: (l) => log.push(l) });
    expect(r.resent).toBe(2);
    expect(log.filter((l) => /no answer to MISSION_ITEM_INT (0|5) within 200 ms: sending it again/.test(l))).toHaveLength(2);
    expect(sim.received.filter((m) => m.name === 'MISSION_ITEM_INT' && m.fields.seq === 5)).toHaveLength(2);
    expect(sim.items).toHaveLength(doc.items.length);
    expect(compareMission(doc.items, await downloadMission(ch, { timeoutMs: 200, retries: 3, log: () => undefined }))).toEqual([]);
  });

  it('gives up with a clear message when the aircraft stays silent', async () => {
    const sim = await startSimVehicle({ dropItemsOnce: [] });
    open.push(sim);
    const ch = await linkTo(sim);
    await sim.stop();
    await expect(uploadMission(ch, doc.items, { timeoutMs: 50, retries: 2, log: () => undefined })).rejects.toThrow(/stopped answering after MISSION_COUNT \(2 retries of 50 ms\); nothing is ready/);
  });
});

function runLink(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile('npm', ['run', '-s', 'link', '--', ...args], { cwd: root, timeout: 90_000 }, (err, stdout, stderr) => {
      const code = err ? (typeof (err as { code?: unknown }).code === 'number' ? (err as { code: number }).code : 1) : 0;
      resolve({ code, stdout, stderr });
    });
  });
}

describe('npm run link', () => {
  it('prints the cautions first, uploads, reads back and only then says ready', async () => {
    const sim = await startSimVehicle({ dropItemsOnce: [3] });
    open.push(sim);
    const r = await runLink(['--server', srv.url, '--email', team.users.pilot.email, '--password', fixturePassword, '--version', signed.versionId, '--udp', `127.0.0.1:${sim.port}`, '--timeout-ms', '300']);
    expect(r.code, r.stderr + r.stdout).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines[0]).toBe('CAUTIONS');
    expect(lines[1]).toMatch(/^ {2}- Elevation grids are often bare-earth models/);
    expect(r.stdout).toMatch(/MAV_FRAME_GLOBAL_RELATIVE_ALT_INT \(frame 6\), metres above the takeoff point/);
    expect(r.stdout).toMatch(/no answer to MISSION_ITEM_INT 3 within 300 ms: sending it again/);
    expect(r.stdout).toMatch(new RegExp(`Read back ${doc.items.length} items, each equal to what was sent`));
    expect(lines.at(-1)).toMatch(/^READY: version 1 of "Scar edge" is on the aircraft/);
    expect(r.stdout.indexOf('CAUTIONS FOR THIS PLAN')).toBeLessThan(r.stdout.indexOf('Uploaded'));
    expect(sim.items).toHaveLength(doc.items.length);
  });

  it('uploads over a serial port (a pseudo-terminal bridged to the simulated aircraft) with the serialport package', async () => {
    const sim = await startSimVehicle();
    open.push(sim);
    // Debian's python3 makes the terminal (tests/support/pty-udp-bridge.py); the link opens it as a serial port.
    const bridge = spawn('/usr/bin/python3', [fileURLToPath(new URL('../support/pty-udp-bridge.py', import.meta.url)), String(sim.port)], { stdio: ['ignore', 'pipe', 'inherit'] });
    open.push({ stop: () => bridge.kill() });
    const tty: string = await new Promise((resolve) => readline.createInterface({ input: bridge.stdout! }).once('line', resolve));
    expect(tty).toMatch(/^\/dev\/pts\/\d+$/);
    const r = await runLink(['--server', srv.url, '--email', team.users.pilot.email, '--password', fixturePassword, '--version', signed.versionId, '--serial', tty, '--baud', '57600']);
    expect(r.code, r.stderr + r.stdout).toBe(0);
    expect(r.stdout).toMatch(new RegExp(`Waiting for the aircraft's heartbeat on serial ${tty} at 57600 baud`));
    expect(r.stdout.trim().split('\n').at(-1)).toMatch(/^READY: version 1 of "Scar edge" is on the aircraft/);
    expect(sim.items).toHaveLength(doc.items.length);
  });

  it('uploads over TCP (a byte stream relayed to the simulated aircraft)', async () => {
    const sim = await startSimVehicle();
    open.push(sim);
    // A TCP telemetry bridge: each connection gets a UDP socket of its own towards the aircraft.
    const relay = net.createServer((conn) => {
      const udp = dgram.createSocket('udp4');
      udp.on('message', (b) => conn.write(b));
      conn.on('data', (b) => udp.send(b, sim.port, '127.0.0.1'));
      conn.on('close', () => udp.close());
      conn.on('error', () => undefined);
    });
    await new Promise<void>((resolve) => relay.listen(0, '127.0.0.1', resolve));
    open.push({ stop: () => new Promise<void>((resolve) => relay.close(() => resolve())) });
    const port = (relay.address() as net.AddressInfo).port;
    const r = await runLink(['--server', srv.url, '--email', team.users.pilot.email, '--password', fixturePassword, '--version', signed.versionId, '--tcp', `127.0.0.1:${port}`]);
    expect(r.code, r.stderr + r.stdout).toBe(0);
    expect(r.stdout).toMatch(new RegExp(`heartbeat on tcp 127\\.0\\.0\\.1:${port}`));
    expect(r.stdout.trim().split('\n').at(-1)).toMatch(/^READY: /);
    expect(sim.items).toHaveLength(doc.items.length);
  });

  it('follows a simulated flight with wind drift: every photo the aircraft reports is stored as flown, on the planned stations', async () => {
    const sim = await startSimVehicle();
    open.push(sim);
    const args = ['run', '-s', 'link', '--', '--server', srv.url, '--email', team.users.pilot.email, '--password', fixturePassword, '--version', signed.versionId, '--udp', `127.0.0.1:${sim.port}`, '--follow'];
    const child = spawn('npm', args, { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] });
    open.push({ stop: () => child.kill() });
    let stdout = '';
    let stderr = '';
    child.stderr!.on('data', (b) => (stderr += b));
    const exited = new Promise<number>((resolve) => child.on('exit', (code) => resolve(code ?? -1)));
    await new Promise<void>((resolve, reject) => {
      child.stdout!.on('data', (b) => {
        stdout += b;
        if (/^READY: /m.test(stdout)) resolve();
      });
      child.on('exit', () => reject(new Error(`link exited before READY: ${stderr}${stdout}`)));
    });
    await sim.fly({ driftEastM: 3, homeMslM: 215 });
    expect(await exited, stderr + stdout).toBe(0);
    const stations = analysedResult().lines.flatMap((l) => l.stations);
    expect(sim.photos).toHaveLength(stations.length);
    expect(stdout).toMatch(new RegExp(`Flight followed: ${stations.length} photos recorded in Loftline\\.`));

    const stored = (await team.clients.pilot.get(`/api/teams/${team.teamId}/flights/${signed.versionId}/triggers`)).body.triggers as Array<Record<string, number>>;
    expect(stored).toHaveLength(sim.photos.length);
    const byIndex = new Map(stored.map((t) => [t.imageIndex, t]));
    let worst = 0;
    sim.photos.forEach((p, k) => {
      const t = byIndex.get(p.img_idx)!;
      expect([t.lat, t.lon]).toEqual([p.lat / 1e7, p.lng / 1e7]);
      expect([t.altitudeAboveTakeoffM, t.altitudeMslM]).toEqual([p.alt_rel, p.alt_msl]);
      expect(t.yawDeg).toBeCloseTo((p.yaw * 180) / Math.PI, 9);
      // Each photo is where its station was planned, moved by the 3 m of drift.
      const s = stations[k];
      const m = metresPerDeg(s.lat);
      const eastM = (t.lon - s.lon) * m.lon;
      const northM = (t.lat - s.lat) * m.lat;
      worst = Math.max(worst, Math.hypot(eastM - 3, northM));
      expect(Math.abs(t.altitudeAboveTakeoffM - s.altitudeAboveTakeoffM)).toBeLessThan(0.01);
    });
    console.log(`farthest photo from its planned station (after the 3 m drift): ${worst.toFixed(3)} m`);
    // Measured 0.11 m: the simulated odometer (WGS 84 radii at home, straight in latitude/longitude) against the
    // plan's local metric frame over lines up to 700 m; a metre would mean a photo a station off its place.
    expect(worst).toBeLessThan(0.25);
  });

  it('keeps photos to pilots and owners: a surveyor may read them but not record them', async () => {
    const body = { sortie: crypto.randomUUID(), triggers: [{ imageIndex: 0, lat: 54, lon: -2, altitudeAboveTakeoffM: 100, altitudeMslM: 300, rollDeg: 0, pitchDeg: 0, yawDeg: 90, capturedAt: new Date().toISOString() }] };
    const path = `/api/teams/${team.teamId}/flights/${signed.versionId}/triggers`;
    expect((await team.clients.surveyor.post(path, body)).status).toBe(403);
    expect((await team.clients.owner.post(path, body)).body).toEqual({ stored: 1, sortieTotal: 1 });
    expect((await team.clients.owner.post(path, body)).body).toEqual({ stored: 0, sortieTotal: 1 });
    expect((await team.clients.owner.post(`/api/teams/${team.teamId}/flights/${draft.versionId}/triggers`, body)).status).toBe(409);
    const bad = await team.clients.pilot.post(path, { ...body, triggers: [{ ...body.triggers[0], lat: 91 }] });
    expect(bad.status).toBe(422);
    expect(bad.body.error.message).toMatch(/^triggers\.0\.lat/);
  });

  it('knows autopilots that keep home as item 0: the read-back names the mismatch, and --home-item sends a placeholder there', async () => {
    const takeoff = doc.altitude.takeoff;
    const homeAtZero = { lat: takeoff.lat + 2e-5, lon: takeoff.lon, altMslM: 211.4 };
    const plain = await startSimVehicle({ homeAtZero });
    open.push(plain);
    const args = (port: number) => ['--server', srv.url, '--email', team.users.pilot.email, '--password', fixturePassword, '--version', signed.versionId, '--udp', `127.0.0.1:${port}`];
    const refused = await runLink(args(plain.port));
    expect(refused.code).toBe(1);
    expect(refused.stdout).toMatch(/MISMATCH item 0 frame: sent 6, the aircraft holds 0/);
    expect(refused.stderr).toMatch(/differs from version 1 in \d+ places: NOT ready\..*run the link again with --home-item\./);
    expect(refused.stdout).not.toMatch(/READY/);

    const sim = await startSimVehicle({ homeAtZero });
    open.push(sim);
    const r = await runLink([...args(sim.port), '--home-item']);
    expect(r.code, r.stderr + r.stdout).toBe(0);
    expect(r.stdout).toMatch(/Read back \d+ items, each equal to what was sent \(item 0 is the autopilot's home\)\./);
    expect(sim.items).toHaveLength(doc.items.length + 1);
    expect(sim.items[1].command).toBe(enumValue(sim.codec, 'MAV_CMD_NAV_TAKEOFF'));
    expect(sim.items.slice(1).map((i) => [i.command, i.x, i.y])).toEqual(doc.items.map((i) => [i.command, i.x, i.y]));
  });

  it('says NOT ready when the aircraft holds an item other than the one sent', async () => {
    const sim = await startSimVehicle({ alterItems: { 2: { z: 999 } } });
    open.push(sim);
    const r = await runLink(['--server', srv.url, '--email', team.users.pilot.email, '--password', fixturePassword, '--version', signed.versionId, '--udp', `127.0.0.1:${sim.port}`]);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(new RegExp(`MISMATCH item 2 z: sent ${Math.fround(doc.items[2].z)}, the aircraft holds 999`));
    expect(r.stderr).toMatch(/differs from version 1 in 1 places: NOT ready\./);
    expect(r.stdout).not.toMatch(/READY/);
  });

  it('refuses a version that is not signed off and uploads nothing', async () => {
    const sim = await startSimVehicle();
    open.push(sim);
    const r = await runLink(['--server', srv.url, '--email', team.users.planner.email, '--password', fixturePassword, '--version', draft.versionId, '--udp', `127.0.0.1:${sim.port}`]);
    expect(r.code).toBe(1);
    expect(r.stdout.split('\n')[0]).toBe('CAUTIONS');
    expect(r.stderr).toMatch(/^Refused: Version 1 is not signed off \(it is in review\)/);
    expect(r.stdout).not.toMatch(/READY/);
    expect(sim.received).toHaveLength(0);
  });

  it('tells a pilot who asks for a version he cannot see that only signed-off versions go to an aircraft', async () => {
    const r = await runLink(['--server', srv.url, '--email', team.users.pilot.email, '--password', fixturePassword, '--version', draft.versionId, '--udp', '127.0.0.1:9']);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/^Refused: no signed-off version .* in your teams\. Only signed-off versions go to an aircraft/);
  });

  it('says what is wrong with its options', async () => {
    const r = await runLink(['--server', srv.url, '--email', 'a@b.example', '--password', 'x', '--version', 'v', '--udp', '127.0.0.1']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^--udp needs HOST:PORT \(e\.g\. 127\.0\.0\.1:14550\), got "127\.0\.0\.1"\./);
  });
});
