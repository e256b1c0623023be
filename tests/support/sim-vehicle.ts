/**
 * A simulated aircraft for the link's tests, written on a second MAVLink implementation that shares no code with the
 * product's node-mavlink: the `mavlink` npm package 1.0.1 (Owen McAree, BSD; a MAVLink 1 codec that reads the
 * protocol's XML definitions and computes each message's CRC_EXTRA and field order itself). Its bundled common.xml
 * predates integer mission items, so tests/fixtures/mavlink/mission-int.xml adds MISSION_ITEM_INT and
 * MISSION_REQUEST_INT from the protocol's common.xml.
 *
 * It listens on UDP on loopback, answers whoever last wrote to it, sends a HEARTBEAT every 200 ms once it has a peer,
 * and plays the aircraft's side of the mission protocol (mavlink.io/en/services/mission.html): on MISSION_COUNT it
 * requests each item with MISSION_REQUEST_INT, stores what arrives and acknowledges with MISSION_ACK; it answers
 * MISSION_REQUEST_LIST with MISSION_COUNT and each MISSION_REQUEST_INT with the stored MISSION_ITEM_INT. It never
 * re-requests on its own, so an item it drops must be sent again by the link.
 */
import dgram from 'node:dgram';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type MavlinkType from 'mavlink';

const require = createRequire(import.meta.url);
const Mavlink = require('mavlink') as typeof MavlinkType;

const here = path.dirname(fileURLToPath(import.meta.url));
const extraXml = path.join(here, '../fixtures/mavlink/mission-int');

/**
 * The package reads definitions by name from its own folder, so ours is named relative to it. It loads the files of
 * one call side by side and the last one read wins an id, and its common.xml still has id 51 for an older message;
 * so common.xml is loaded first and ours after it, overriding that id.
 */
async function codec(sysid: number, compid: number): Promise<MavlinkType> {
  const defsDir = path.join(path.dirname(require.resolve('mavlink')), 'mavlink/message_definitions/v1.0');
  const m = new Mavlink(sysid, compid, 'v1.0', ['common']);
  await new Promise((resolve) => m.once('ready', resolve));
  const loader = m as unknown as { definitions: string[]; loadDefinitions(): void };
  loader.definitions = [path.relative(defsDir, extraXml)];
  const more = new Promise((resolve) => m.once('ready', resolve));
  loader.loadDefinitions();
  await more;
  if (m.getMessageName(51) !== 'MISSION_REQUEST_INT' || m.getMessageName(73) !== 'MISSION_ITEM_INT') throw new Error('independent MAVLink definitions did not load in order');
  return m;
}

/** An enum value by its MAVLink name, as the independent package read it from XML. */
export function enumValue(m: MavlinkType, name: string): number {
  for (const e of m.enums) for (const entry of e.entry ?? []) if (entry.$.name === name) return Number(entry.$.value);
  throw new Error(`enum entry ${name} not in the independent definitions`);
}

interface SimVehicleOptions {
  sysid?: number;
  compid?: number;
  /** Ignore the first MISSION_ITEM_INT with each of these seq numbers (as if it were lost on the way). */
  dropItemsOnce?: number[];
  /**
   * Keep the home position as item 0 whatever is sent there, as ArduPilot does: item 0 is stored as a NAV_WAYPOINT in
   * MAV_FRAME_GLOBAL at this place and height above mean sea level, and flying starts at item 1.
   */
  homeAtZero?: { lat: number; lon: number; altMslM: number };
  /** Store these items changed (field values by seq), as an aircraft that rounds or clamps what it is sent; it still acknowledges. */
  alterItems?: Record<number, Record<string, number>>;
}

export interface SimVehicle {
  port: number;
  /** Items as the independent codec decoded them, by seq. */
  items: Array<Record<string, number>>;
  /** Every message received, by MAVLink name, in order. */
  received: Array<{ name: string; fields: Record<string, number>; payloadLength: number }>;
  /** Messages the vehicle sent, by name. */
  sent: string[];
  codec: MavlinkType;
  /** Photos the vehicle reported with CAMERA_FEEDBACK while flying, field values as sent. */
  photos: Array<{ img_idx: number; lat: number; lng: number; alt_msl: number; alt_rel: number; roll: number; pitch: number; yaw: number }>;
  /** Fly the stored mission (see `flyMission`); resolves once it has returned to launch. */
  fly(o?: FlightOptions): Promise<void>;
  stop(): Promise<void>;
}

interface FlightOptions {
  /** Steady drift of the aircraft off its track, metres east and north (wind). */
  driftEastM?: number;
  driftNorthM?: number;
  /** Ground height of home above mean sea level, for alt_msl. */
  homeMslM?: number;
}

export async function startSimVehicle(o: SimVehicleOptions = {}): Promise<SimVehicle> {
  const sysid = o.sysid ?? 1;
  const compid = o.compid ?? 1;
  // The package's parser only passes on messages from the ids it was made with (0, 0 = all); a second instance sends.
  const rx = await codec(0, 0);
  const tx = await codec(sysid, compid);
  const sock = dgram.createSocket('udp4');
  await new Promise<void>((resolve) => sock.bind(0, '127.0.0.1', () => resolve()));
  let peer: { address: string; port: number } | null = null;
  const drop = new Set(o.dropItemsOnce ?? []);
  const v: SimVehicle = { port: (sock.address() as { port: number }).port, items: [], received: [], sent: [], photos: [], codec: rx, fly: async () => undefined, stop: async () => undefined };
  let expected = 0;
  let uploadCount = 0;
  let gcs = { sysid: 255, compid: 190 };

  const send = (name: string, data: Record<string, unknown>) => {
    tx.createMessage(name, data, (msg) => {
      v.sent.push(name);
      if (peer) sock.send(msg.buffer, peer.port, peer.address);
    });
  };
  const requestItem = (seq: number) => send('MISSION_REQUEST_INT', { target_system: gcs.sysid, target_component: gcs.compid, seq });

  rx.on('message', (msg) => {
    const name = rx.getMessageName(msg.id);
    if (!name) return;
    const f = rx.decodeMessage(msg) as Record<string, number>;
    v.received.push({ name, fields: f, payloadLength: msg.length });
    gcs = { sysid: msg.system, compid: msg.component };
    if ('target_system' in f && (f.target_system !== sysid || f.target_component !== compid)) return;
    switch (name) {
      case 'MISSION_COUNT':
        uploadCount = f.count;
        v.items = [];
        expected = 0;
        if (uploadCount === 0) send('MISSION_ACK', { target_system: gcs.sysid, target_component: gcs.compid, type: 0 });
        else requestItem(0);
        break;
      case 'MISSION_ITEM_INT':
        if (drop.has(f.seq)) {
          drop.delete(f.seq);
          break;
        }
        if (f.seq !== expected) break;
        v.items[f.seq] = f.seq === 0 && o.homeAtZero ? { ...f, frame: 0, command: 16, x: Math.round(o.homeAtZero.lat * 1e7), y: Math.round(o.homeAtZero.lon * 1e7), z: o.homeAtZero.altMslM } : { ...f, ...o.alterItems?.[f.seq] };
        expected++;
        if (expected < uploadCount) requestItem(expected);
        else send('MISSION_ACK', { target_system: gcs.sysid, target_component: gcs.compid, type: 0 });
        break;
      case 'MISSION_REQUEST_LIST':
        send('MISSION_COUNT', { target_system: gcs.sysid, target_component: gcs.compid, count: v.items.length });
        break;
      case 'MISSION_REQUEST_INT': {
        const item = v.items[f.seq];
        if (item) send('MISSION_ITEM_INT', { ...item, target_system: gcs.sysid, target_component: gcs.compid });
        break;
      }
    }
  });
  sock.on('message', (bytes, rinfo) => {
    peer = { address: rinfo.address, port: rinfo.port };
    rx.parse(bytes);
  });
  const beat = setInterval(() => {
    // MAV_TYPE_QUADROTOR 2, MAV_AUTOPILOT_GENERIC 0, MAV_STATE_STANDBY 3 (common.xml).
    if (peer) send('HEARTBEAT', { type: 2, autopilot: 0, base_mode: 0, custom_mode: 0, system_status: 3, mavlink_version: 3 });
  }, 200);
  v.fly = (f = {}) => flyMission(v, send, rx, f, o.homeAtZero ? 1 : 0);
  let stopped = false;
  v.stop = async () => {
    if (stopped) return;
    stopped = true;
    clearInterval(beat);
    await new Promise<void>((resolve) => sock.close(() => resolve()));
  };
  return v;
}

/**
 * Metres per degree of latitude and of longitude at `latDeg` on the WGS 84 ellipsoid (meridional radius M and prime
 * vertical radius N; textbook geodesy). A sphere of the equatorial radius, as some autopilots use, is 0.2 % long
 * east-west at 54° north: 1.5 m over a 700 m line.
 */
export function metresPerDeg(latDeg: number): { lat: number; lon: number } {
  const a = 6378137;
  const e2 = 0.00669437999014;
  const phi = (latDeg * Math.PI) / 180;
  const w = 1 - e2 * Math.sin(phi) ** 2;
  return { lat: ((a * (1 - e2)) / w ** 1.5) * (Math.PI / 180), lon: (a / Math.sqrt(w)) * Math.cos(phi) * (Math.PI / 180) };
}
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * Fly the stored items in simulated time (1 s steps, a few milliseconds each in real time): climb at takeoff, fly
 * each NAV_WAYPOINT in a straight line at the speed DO_CHANGE_SPEED set (5 m/s before), fire the camera every
 * DO_SET_CAM_TRIGG_DIST metres of track (one photo at once when param3 is 1), return to launch. Each step sends
 * GLOBAL_POSITION_INT and ATTITUDE, each photo CAMERA_FEEDBACK, each NAV item reached MISSION_ITEM_REACHED. The
 * reported position carries a steady wind drift off the track, and the yaw a crab angle.
 */
async function flyMission(v: SimVehicle, send: (name: string, data: Record<string, unknown>) => void, codec: MavlinkType, f: FlightOptions, firstSeq: number): Promise<void> {
  const cmd = (name: string) => enumValue(codec, name);
  const home = { lat: v.items[0].x / 1e7, lon: v.items[0].y / 1e7 };
  const mPerDeg = metresPerDeg(home.lat);
  const drift = { e: f.driftEastM ?? 0, n: f.driftNorthM ?? 0 };
  const homeMsl = f.homeMslM ?? 0;
  let pos = { ...home };
  let alt = 0;
  let speed = 5;
  let trigger = 0;
  let sinceShotM = 0;
  let headingRad = 0;
  let bootMs = 0;
  const reported = () => ({ lat: pos.lat + drift.n / mPerDeg.lat, lon: pos.lon + drift.e / mPerDeg.lon });
  const crabRad = Math.atan2(drift.e, 50); // a fixed crab into the wind (simulation only)
  // The package writes no 64-bit fields (it warns and leaves zeros): time_usec goes out as 0.
  const warn = console.warn;
  console.warn = (...a: unknown[]) => (a[0] === 'No 64-bit Integer support yet!' ? undefined : warn(...a));
  const shoot = () => {
    const p = reported();
    const photo = { img_idx: v.photos.length, lat: Math.round(p.lat * 1e7), lng: Math.round(p.lon * 1e7), alt_msl: Math.fround(homeMsl + alt), alt_rel: Math.fround(alt), roll: Math.fround(0.02), pitch: Math.fround(-0.01), yaw: Math.fround(headingRad + crabRad) };
    v.photos.push(photo);
    send('CAMERA_FEEDBACK', { time_usec: 0, target_system: 0, cam_idx: 0, flags: 0, foc_len: 8.8, ...photo });
  };
  const tick = async () => {
    bootMs += 1000;
    const p = reported();
    send('GLOBAL_POSITION_INT', { time_boot_ms: bootMs, lat: Math.round(p.lat * 1e7), lon: Math.round(p.lon * 1e7), alt: Math.round((homeMsl + alt) * 1000), relative_alt: Math.round(alt * 1000), vx: 0, vy: 0, vz: 0, hdg: Math.round(((headingRad * 180) / Math.PI + 360) % 360 * 100) });
    send('ATTITUDE', { time_boot_ms: bootMs, roll: 0.02, pitch: -0.01, yaw: headingRad + crabRad, rollspeed: 0, pitchspeed: 0, yawspeed: 0 });
    await sleep(2);
  };
  const moveTo = async (to: { lat: number; lon: number }, toAlt: number) => {
    const dE = (to.lon - pos.lon) * mPerDeg.lon;
    const dN = (to.lat - pos.lat) * mPerDeg.lat;
    const total = Math.hypot(dE, dN);
    if (total > 0.01) headingRad = Math.atan2(dE, dN);
    const from = { ...pos, alt };
    let done = 0;
    let sinceTick = 0;
    while (done < total - 1e-9) {
      let stepM = Math.min(speed - sinceTick, total - done);
      if (trigger > 0 && sinceShotM + stepM >= trigger) stepM = trigger - sinceShotM;
      done += stepM;
      sinceTick += stepM;
      sinceShotM += stepM;
      const t = done / total;
      pos = { lat: from.lat + (to.lat - from.lat) * t, lon: from.lon + (to.lon - from.lon) * t };
      alt = from.alt + (toAlt - from.alt) * t;
      if (trigger > 0 && sinceShotM >= trigger - 1e-9) {
        shoot();
        sinceShotM = 0;
      }
      if (sinceTick >= speed - 1e-9) {
        sinceTick = 0;
        await tick();
      }
    }
    pos = { ...to };
    alt = toAlt;
  };
  try {
    for (const item of v.items.slice(firstSeq)) {
      if (item.command === cmd('MAV_CMD_NAV_TAKEOFF')) {
        alt = item.z;
        await tick();
      } else if (item.command === cmd('MAV_CMD_NAV_WAYPOINT')) {
        await moveTo({ lat: item.x / 1e7, lon: item.y / 1e7 }, item.z);
      } else if (item.command === cmd('MAV_CMD_DO_CHANGE_SPEED')) {
        speed = item.param2;
      } else if (item.command === cmd('MAV_CMD_DO_SET_CAM_TRIGG_DIST')) {
        trigger = item.param1;
        sinceShotM = 0;
        if (trigger > 0 && item.param3 === 1) shoot();
      } else if (item.command === cmd('MAV_CMD_NAV_RETURN_TO_LAUNCH')) {
        await moveTo(home, alt);
        alt = 0;
        await tick();
      }
      if (item.frame !== cmd('MAV_FRAME_MISSION') || item.command === cmd('MAV_CMD_NAV_RETURN_TO_LAUNCH')) send('MISSION_ITEM_REACHED', { seq: item.seq });
    }
  } finally {
    console.warn = warn;
  }
}
