/**
 * The MAVLink mission protocol (mavlink.io/en/services/mission.html) as the ground side runs it: upload
 * (MISSION_COUNT, answer each MISSION_REQUEST_INT / MISSION_REQUEST with MISSION_ITEM_INT, wait for MISSION_ACK) and
 * read-back (MISSION_REQUEST_LIST, MISSION_COUNT, MISSION_REQUEST_INT per item, MISSION_ACK). A step that gets no
 * answer within the timeout sends its last message again, up to the retry limit, as the protocol's timeouts ask.
 */
import { common } from 'node-mavlink';
import type { MissionItem } from '../../contracts/mission-items';
import { LinkError } from './loftline-client';
import type { Incoming, MavlinkChannel } from './mavlink-channel';

const { MissionCount, MissionItemInt, MissionRequest, MissionRequestInt, MissionAck, MissionRequestList, MavMissionResult, MavMissionType } = common;

interface TransferOptions {
  timeoutMs: number;
  retries: number;
  log: (line: string) => void;
}

const nan = (p: number | null) => (p === null ? Number.NaN : p);

/** MISSION_ITEM_INT of one JSON item, addressed to the aircraft. */
function toMessage(item: MissionItem, target: { sysid: number; compid: number }): InstanceType<typeof MissionItemInt> {
  const m = new MissionItemInt();
  m.targetSystem = target.sysid;
  m.targetComponent = target.compid;
  m.seq = item.seq;
  m.frame = item.frame;
  m.command = item.command;
  m.current = item.current;
  m.autocontinue = item.autocontinue;
  m.param1 = nan(item.param1);
  m.param2 = nan(item.param2);
  m.param3 = nan(item.param3);
  m.param4 = nan(item.param4);
  m.x = item.x;
  m.y = item.y;
  m.z = item.z;
  m.missionType = MavMissionType.MISSION;
  return m;
}

const resultName = (t: number) => `MAV_MISSION_${MavMissionResult[t] ?? t}`;

/** Upload every item; resolves once the aircraft acknowledges the whole mission. */
export async function uploadMission(ch: MavlinkChannel, items: MissionItem[], o: TransferOptions): Promise<{ resent: number }> {
  const target = ch.target!;
  const count = new MissionCount();
  count.targetSystem = target.sysid;
  count.targetComponent = target.compid;
  count.count = items.length;
  count.missionType = MavMissionType.MISSION;
  let last: InstanceType<typeof MissionCount> | InstanceType<typeof MissionItemInt> = count;
  let lastWhat = 'MISSION_COUNT';
  let resent = 0;
  let tries = 0;
  o.log(`sending MISSION_COUNT ${items.length}`);
  type Answer = { kind: 'request'; seq: number } | { kind: 'ack'; type: number };
  const answer = (m: Incoming): Answer | null => {
    if (m.msg instanceof MissionRequestInt || m.msg instanceof MissionRequest) {
      return (m.msg.missionType ?? 0) === MavMissionType.MISSION ? { kind: 'request', seq: m.msg.seq } : null;
    }
    if (m.msg instanceof MissionAck && (m.msg.missionType ?? 0) === MavMissionType.MISSION) return { kind: 'ack', type: m.msg.type };
    return null;
  };
  for (;;) {
    // Each turn sends the last message (the count, the requested item, or either again after a timeout) and waits.
    const a = (await ch.request(last, (m) => answer(m) as never, o.timeoutMs)) as Answer | null;
    if (!a) {
      if (tries >= o.retries) throw new LinkError(`The aircraft stopped answering after ${lastWhat} (${o.retries} retries of ${o.timeoutMs} ms); nothing is ready. Check the telemetry link and run the link again.`);
      tries++;
      resent++;
      o.log(`no answer to ${lastWhat} within ${o.timeoutMs} ms: sending it again (retry ${tries} of ${o.retries})`);
      continue;
    }
    if (a.kind === 'ack') {
      if (a.type === MavMissionResult.ACCEPTED && lastWhat === `MISSION_ITEM_INT ${items.length - 1}`) return { resent };
      if (a.type === MavMissionResult.ACCEPTED) throw new LinkError(`The aircraft acknowledged the mission before receiving every item (after ${lastWhat}); nothing is ready.`);
      throw new LinkError(`The aircraft refused the mission: ${resultName(a.type)} (after ${lastWhat}). Nothing is ready.`);
    }
    if (a.seq < 0 || a.seq >= items.length) throw new LinkError(`The aircraft asked for item ${a.seq} of a ${items.length}-item mission; nothing is ready.`);
    tries = 0;
    last = toMessage(items[a.seq], target);
    lastWhat = `MISSION_ITEM_INT ${a.seq}`;
  }
}

/** Read the mission back from the aircraft, item by item. */
export async function downloadMission(ch: MavlinkChannel, o: TransferOptions): Promise<InstanceType<typeof MissionItemInt>[]> {
  const target = ch.target!;
  const ask = async <T>(msg: Parameters<MavlinkChannel['send']>[0], what: string, match: (m: Incoming) => T | null): Promise<T> => {
    for (let attempt = 0; attempt <= o.retries; attempt++) {
      if (attempt > 0) o.log(`no answer to ${what} within ${o.timeoutMs} ms: sending it again (retry ${attempt} of ${o.retries})`);
      const got = await ch.request(msg, (m) => match(m) as never, o.timeoutMs);
      if (got) return got as T;
    }
    throw new LinkError(`The aircraft did not answer ${what} (${o.retries} retries of ${o.timeoutMs} ms); the mission could not be read back, so it is NOT ready.`);
  };
  const list = new MissionRequestList();
  list.targetSystem = target.sysid;
  list.targetComponent = target.compid;
  list.missionType = MavMissionType.MISSION;
  const count = await ask(list, 'MISSION_REQUEST_LIST', (m) => (m.msg instanceof MissionCount && (m.msg.missionType ?? 0) === MavMissionType.MISSION ? m.msg : null));
  const out: InstanceType<typeof MissionItemInt>[] = [];
  for (let seq = 0; seq < count.count; seq++) {
    const req = new MissionRequestInt();
    req.targetSystem = target.sysid;
    req.targetComponent = target.compid;
    req.seq = seq;
    req.missionType = MavMissionType.MISSION;
    out.push(await ask(req, `MISSION_REQUEST_INT ${seq}`, (m) => (m.msg instanceof MissionItemInt && m.msg.seq === seq ? m.msg : null)));
  }
  const ack = new MissionAck();
  ack.targetSystem = target.sysid;
  ack.targetComponent = target.compid;
  ack.type = MavMissionResult.ACCEPTED;
  ack.missionType = MavMissionType.MISSION;
  await ch.send(ack);
  return out;
}

/**
 * The items with a placeholder for the home position in front (seq 0, at the takeoff point, 0 m above it), for
 * autopilots that keep home as item 0 and overwrite whatever is sent there (ArduPilot's convention).
 */
export function withHomeItem(items: MissionItem[], takeoff: { lon: number; lat: number }): MissionItem[] {
  const first = items[0];
  const home: MissionItem = {
    ...first,
    seq: 0,
    command: common.MavCmd.NAV_WAYPOINT,
    frame: common.MavFrame.GLOBAL_RELATIVE_ALT_INT,
    param1: 0,
    param2: 0,
    param3: 0,
    param4: null,
    x: Math.round(takeoff.lat * 1e7),
    y: Math.round(takeoff.lon * 1e7),
    z: 0,
    about: { kind: 'home', commandName: 'MAV_CMD_NAV_WAYPOINT', frameName: 'MAV_FRAME_GLOBAL_RELATIVE_ALT_INT', line: null, leg: null },
  };
  return [home, ...items.map((i) => ({ ...i, seq: i.seq + 1 }))];
}

/**
 * Differences between what was meant and what the aircraft holds (floats compared as the float32 they travel as).
 * `from` skips leading items the autopilot owns (its home position as item 0).
 */
export function compareMission(want: MissionItem[], got: InstanceType<typeof MissionItemInt>[], from = 0): string[] {
  const diffs: string[] = [];
  if (got.length !== want.length) diffs.push(`the aircraft holds ${got.length} items, ${want.length} were sent`);
  const f32 = (v: number) => Math.fround(v);
  const same = (a: number, b: number) => (Number.isNaN(a) && Number.isNaN(b)) || a === b;
  want.forEach((w, i) => {
    const g = got[i];
    if (!g || i < from) return;
    const fields: Array<[string, number, number]> = [
      ['seq', w.seq, g.seq],
      ['frame', w.frame, g.frame],
      ['command', w.command, g.command],
      ['autocontinue', w.autocontinue, g.autocontinue],
      ['param1', f32(nan(w.param1)), g.param1],
      ['param2', f32(nan(w.param2)), g.param2],
      ['param3', f32(nan(w.param3)), g.param3],
      ['param4', f32(nan(w.param4)), g.param4],
      ['x', w.x, g.x],
      ['y', w.y, g.y],
      ['z', f32(w.z), g.z],
    ];
    for (const [name, a, b] of fields) if (!same(a, b)) diffs.push(`item ${i} ${name}: sent ${a}, the aircraft holds ${b}`);
  });
  return diffs;
}
