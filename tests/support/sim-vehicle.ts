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

export interface SimVehicleOptions {
  sysid?: number;
  compid?: number;
  /** Ignore the first MISSION_ITEM_INT with each of these seq numbers (as if it were lost on the way). */
  dropItemsOnce?: number[];
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
  stop(): Promise<void>;
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
  const v: SimVehicle = { port: (sock.address() as { port: number }).port, items: [], received: [], sent: [], codec: rx, stop: async () => undefined };
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
        v.items[f.seq] = f;
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
  let stopped = false;
  v.stop = async () => {
    if (stopped) return;
    stopped = true;
    clearInterval(beat);
    await new Promise<void>((resolve) => sock.close(() => resolve()));
  };
  return v;
}
