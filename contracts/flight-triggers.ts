/** Photos as flown, forwarded by the link from the aircraft's MAVLink CAMERA_FEEDBACK messages while it flies. */
import { z } from 'zod';

const deg = (min: number, max: number) => z.number().min(min).max(max);
const metres = z.number().min(-1000).max(20000);

/** One photo: position (WGS 84), altitudes with their references, attitude, time. */
const flightTriggerSchema = z.object({
  /** CAMERA_FEEDBACK img_idx. */
  imageIndex: z.number().int().min(0).max(65535),
  lat: deg(-90, 90),
  lon: deg(-180, 180),
  /** Above the home (takeoff) point (CAMERA_FEEDBACK alt_rel). */
  altitudeAboveTakeoffM: metres,
  /** Above mean sea level as the autopilot has it (CAMERA_FEEDBACK alt_msl). */
  altitudeMslM: metres,
  rollDeg: deg(-180, 180),
  pitchDeg: deg(-180, 180),
  yawDeg: deg(-360, 360),
  /** When the link received it (ISO 8601). */
  capturedAt: z.iso.datetime({ offset: true }),
});
export type FlightTrigger = z.infer<typeof flightTriggerSchema>;

/** POST body: a batch from one run of the link. */
export const recordTriggersSchema = z.object({
  sortie: z.uuid(),
  triggers: z.array(flightTriggerSchema).min(1).max(1000),
});

export const recordedTriggersSchema = z.object({
  /** New photos stored from this batch (a photo sent again is kept once). */
  stored: z.number().int(),
  /** Photos of this sortie so far. */
  sortieTotal: z.number().int(),
});

export const triggerListSchema = z.object({
  triggers: z.array(flightTriggerSchema.extend({ sortie: z.string() })),
});
