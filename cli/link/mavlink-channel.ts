/**
 * MAVLink over a byte transport, with node-mavlink: frames in (splitter + parser, CRC checked), messages out in the
 * protocol version the aircraft speaks. The aircraft is the first non-GCS system whose HEARTBEAT arrives; until then
 * the link sends its own GCS heartbeat once a second in MAVLink 1 (which every MAVLink system reads), so a UDP peer
 * learns where to answer.
 */
import { ardupilotmega, common, minimal, MavLinkPacketParser, MavLinkPacketSplitter, MavLinkProtocolV1, MavLinkProtocolV2, type MavLinkData, type MavLinkPacket, type MavLinkPacketRegistry, x25crc } from 'node-mavlink';
import type { Transport } from './transport';

const REGISTRY: MavLinkPacketRegistry = { ...minimal.REGISTRY, ...common.REGISTRY, ...ardupilotmega.REGISTRY };

/** A ground station's ids (255 / MAV_COMP_ID_MISSIONPLANNER 190: common practice for ground software). */
const GCS_SYSID = 255;
const GCS_COMPID = 190;

export interface Incoming {
  msg: MavLinkData;
  sysid: number;
  compid: number;
  version: 1 | 2;
}

/**
 * One frame of `msg`. MAVLink 1 carries no extension fields (mavlink.io "MAVLink 2 / message extensions"), while
 * node-mavlink's v1 serializer writes the whole v2 payload: cut the extensions off and sign the shorter frame again
 * with the message's CRC_EXTRA.
 */
function encodeFrame(msg: MavLinkData, seq: number, version: 1 | 2, sysid = GCS_SYSID, compid = GCS_COMPID): Buffer {
  if (version === 2) return new MavLinkProtocolV2(sysid, compid).serialize(msg, seq);
  const full = new MavLinkProtocolV1(sysid, compid).serialize(msg, seq);
  const def = msg.constructor as unknown as { FIELDS: Array<{ extension: boolean; offset: number; size: number; length: number }>; MAGIC_NUMBER: number };
  const base = def.FIELDS.filter((f) => !f.extension).reduce((end, f) => Math.max(end, f.offset + f.size * Math.max(1, f.length)), 0);
  if (full.length - 8 === base) return full;
  const frame = Buffer.alloc(base + 8);
  full.copy(frame, 0, 0, 6 + base);
  frame.writeUInt8(base, 1);
  frame.writeUInt16LE(x25crc(frame, 1, 2, def.MAGIC_NUMBER), base + 6);
  return frame;
}

export class MavlinkChannel {
  private seq = 0;
  private listeners = new Set<(m: Incoming) => void>();
  private heartbeat: ReturnType<typeof setInterval> | null = null;
  target: { sysid: number; compid: number; version: 1 | 2 } | null = null;

  constructor(private readonly transport: Transport) {
    const splitter = new MavLinkPacketSplitter();
    const parser = splitter.pipe(new MavLinkPacketParser());
    parser.on('data', (packet: MavLinkPacket) => this.receive(packet));
    transport.onData((bytes) => splitter.write(bytes));
  }

  private receive(packet: MavLinkPacket): void {
    const clazz = REGISTRY[packet.header.msgid];
    if (!clazz) return;
    const msg = packet.protocol.data(packet.payload, clazz);
    const version: 1 | 2 = packet.header.magic === MavLinkProtocolV2.START_BYTE ? 2 : 1;
    const m: Incoming = { msg, sysid: packet.header.sysid, compid: packet.header.compid, version };
    if (!this.target && msg instanceof minimal.Heartbeat && msg.type !== minimal.MavType.GCS) {
      this.target = { sysid: m.sysid, compid: m.compid, version };
    }
    for (const l of [...this.listeners]) l(m);
  }

  /** Send one message in the aircraft's protocol version (MAVLink 1 until it is known). */
  async send(msg: MavLinkData): Promise<void> {
    const frame = encodeFrame(msg, this.seq, this.target?.version ?? 1);
    this.seq = (this.seq + 1) & 0xff;
    await this.transport.write(frame);
  }

  /** The first message from the aircraft that `match` accepts, or null after `timeoutMs`. */
  waitFor<T extends MavLinkData>(match: (m: Incoming) => T | null, timeoutMs: number): Promise<T | null> {
    return new Promise((resolve) => {
      const done = (v: T | null) => {
        clearTimeout(timer);
        this.listeners.delete(listener);
        resolve(v);
      };
      const listener = (m: Incoming) => {
        if (this.target && (m.sysid !== this.target.sysid || m.compid !== this.target.compid)) return;
        const v = match(m);
        if (v) done(v);
      };
      const timer = setTimeout(() => done(null), timeoutMs);
      this.listeners.add(listener);
    });
  }

  /**
   * Send `msg` and wait for the answer `match` accepts (null after `timeoutMs`). The listener is in place before the
   * message leaves, so an answer that comes back while a slow link (a serial port draining) is still sending is kept.
   */
  async request<T extends MavLinkData>(msg: MavLinkData, match: (m: Incoming) => T | null, timeoutMs: number): Promise<T | null> {
    const answer = this.waitFor(match, timeoutMs);
    await this.send(msg);
    return answer;
  }

  /** Every message from the aircraft, until the returned function is called. */
  listen(cb: (m: Incoming) => void): () => void {
    const l = (m: Incoming) => {
      if (!this.target || (m.sysid === this.target.sysid && m.compid === this.target.compid)) cb(m);
    };
    this.listeners.add(l);
    return () => this.listeners.delete(l);
  }

  /** Send GCS heartbeats once a second until `stop`. */
  startHeartbeat(): void {
    const beat = () => {
      const hb = new minimal.Heartbeat();
      hb.type = minimal.MavType.GCS;
      hb.autopilot = minimal.MavAutopilot.INVALID;
      hb.mavlinkVersion = 3;
      void this.send(hb).catch(() => undefined);
    };
    beat();
    this.heartbeat = setInterval(beat, 1000);
  }

  /** Wait for the aircraft's heartbeat (its ids and protocol version). */
  async findAircraft(timeoutMs: number): Promise<{ sysid: number; compid: number; version: 1 | 2 } | null> {
    if (this.target) return this.target;
    await this.waitFor((m) => (m.msg instanceof minimal.Heartbeat && m.msg.type !== minimal.MavType.GCS ? m.msg : null), timeoutMs);
    return this.target;
  }

  stop(): void {
    if (this.heartbeat) clearInterval(this.heartbeat);
    this.heartbeat = null;
  }
}
