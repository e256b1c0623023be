/**
 * While the aircraft flies: every CAMERA_FEEDBACK (photo position, altitudes, attitude) goes to Loftline in batches
 * twice a second, kept and sent again when Loftline cannot be reached, until MISSION_ITEM_REACHED names the last
 * item (the return to launch) or the crew stops the link.
 */
import crypto from 'node:crypto';
import { ardupilotmega, common } from 'node-mavlink';
import type { FlightTrigger } from '../../contracts/flight-triggers';
import type { MissionItems } from '../../contracts/mission-items';
import { LinkError, recordTriggers, type Session } from './loftline-client';
import type { MavlinkChannel } from './mavlink-channel';

const deg = (rad: number) => (rad * 180) / Math.PI;

/** A photo as Loftline stores it (CAMERA_FEEDBACK lat/lng in degE7, angles in radians, altitudes in metres). */
function triggerOf(m: InstanceType<typeof ardupilotmega.CameraFeedback>, at: Date): FlightTrigger {
  return {
    imageIndex: m.imgIdx,
    lat: m.lat / 1e7,
    lon: m.lng / 1e7,
    altitudeAboveTakeoffM: m.altRel,
    altitudeMslM: m.altMsl,
    rollDeg: deg(m.roll),
    pitchDeg: deg(m.pitch),
    yawDeg: deg(m.yaw),
    capturedAt: at.toISOString(),
  };
}

export async function followFlight(ch: MavlinkChannel, s: Session, teamId: string, doc: MissionItems, lastSeq: number, log: (line: string) => void, signal?: AbortSignal): Promise<number> {
  const sortie = crypto.randomUUID();
  const queue: FlightTrigger[] = [];
  let recorded = 0;
  let landed = false;
  let failures = 0;
  const stopListening = ch.listen((m) => {
    if (m.msg instanceof ardupilotmega.CameraFeedback) queue.push(triggerOf(m.msg, new Date()));
    else if (m.msg instanceof common.MissionItemReached && m.msg.seq === lastSeq) landed = true;
  });
  log(`Following the flight (sortie ${sortie}): photos go to Loftline as the aircraft reports them`);
  try {
    for (;;) {
      const done = landed || signal?.aborted;
      while (queue.length) {
        const batch = queue.slice(0, 1000);
        try {
          const r = await recordTriggers(s, teamId, doc.version.id, sortie, batch);
          queue.splice(0, batch.length);
          recorded = r.sortieTotal;
          failures = 0;
          log(`${recorded} photos recorded`);
        } catch (err) {
          // Keep the photos and try again; give up only when Loftline keeps refusing after landing.
          failures++;
          log(`could not record ${batch.length} photos yet: ${(err as Error).message}`);
          if (done && failures >= 5) throw new LinkError(`${queue.length} photos could not be recorded in Loftline: ${(err as Error).message}`);
          break;
        }
      }
      if (done && queue.length === 0) return recorded;
      await new Promise((r) => setTimeout(r, 500));
    }
  } finally {
    stopListening();
  }
}
