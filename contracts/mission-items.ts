/**
 * MAVLink mission items of a signed-off plan version, as the link uploads them and the pilot downloads them as JSON.
 * Each item carries MAVLink's own MISSION_ITEM_INT field names and enum values (common.xml, mavlink.io); `about`
 * adds our reading of it. target_system and target_component are left out: the link fills them for the aircraft.
 */
import { z } from 'zod';

const n = z.number();
/** A float parameter; null stands for NaN, MAVLink's "leave as it is / use the default" (JSON has no NaN). */
const param = z.number().nullable();
const int32 = z.number().int().min(-2147483648).max(2147483647);

/**
 * What an item does in the plan (our names); `home` is the placeholder the link adds for autopilots that keep home
 * as item 0; `transit` holds the flight between two lines at the higher of their two altitudes; `camera-tilt` points
 * the gimbal for a line of oblique capture (and back straight down before the return).
 */
const missionItemKinds = ['home', 'takeoff', 'transit', 'camera-tilt', 'line-start', 'speed', 'first-photo', 'camera-on', 'camera-spacing', 'leg-change', 'line-end', 'camera-off', 'return'] as const;
const missionItemKindSchema = z.enum(missionItemKinds);
export type MissionItemKind = z.infer<typeof missionItemKindSchema>;

/** One MISSION_ITEM_INT (message 73) without its target ids. */
const missionItemSchema = z.object({
  seq: z.number().int().min(0).max(65535),
  /** MAV_FRAME value: 6 (MAV_FRAME_GLOBAL_RELATIVE_ALT_INT) for positions, 2 (MAV_FRAME_MISSION) for commands. */
  frame: z.number().int().min(0).max(255),
  /** MAV_CMD value. */
  command: z.number().int().min(0).max(65535),
  current: z.union([z.literal(0), z.literal(1)]),
  autocontinue: z.union([z.literal(0), z.literal(1)]),
  param1: param,
  param2: param,
  param3: param,
  param4: param,
  /** Latitude in degrees x 10^7 (global frames), else 0. */
  x: int32,
  /** Longitude in degrees x 10^7 (global frames), else 0. */
  y: int32,
  /** Altitude in metres above the takeoff (home) point in MAV_FRAME_GLOBAL_RELATIVE_ALT_INT, else 0. */
  z: n,
  /** MAV_MISSION_TYPE: 0, the main mission. */
  mission_type: z.literal(0),
  about: z.object({
    kind: missionItemKindSchema,
    /** MAVLink's names of `command` and `frame`. */
    commandName: z.string(),
    frameName: z.string(),
    /** Flight line (1 first) and leg, where the item belongs to one. */
    line: z.number().int().nullable(),
    leg: z.number().int().nullable(),
  }),
});
export type MissionItem = z.infer<typeof missionItemSchema>;

/** Per leg of a line: the ground speed and photo spacing in force on it. */
const missionLegSettingSchema = z.object({
  leg: z.number().int(),
  /** Ground speed, m/s (MAV_CMD_DO_CHANGE_SPEED param2). */
  speedMps: n,
  /** Distance between photos, metres (MAV_CMD_DO_SET_CAM_TRIGG_DIST param1). */
  triggerDistanceM: n,
});

/** Per line: what the camera and the speed items set. */
const missionLineSchema = z.object({
  number: z.number().int(),
  /** Distance between photos when the camera starts, metres (MAV_CMD_DO_SET_CAM_TRIGG_DIST param1). */
  triggerDistanceM: n,
  /** Ground speed set at the line start, m/s (MAV_CMD_DO_CHANGE_SPEED param2). */
  speedMps: n,
  /** Per leg, in flying order; solved plans vary both along a line. */
  legs: z.array(missionLegSettingSchema),
  photoCount: z.number().int(),
  firstSeq: z.number().int(),
  lastSeq: z.number().int(),
});
export type MissionLine = z.infer<typeof missionLineSchema>;

export const missionItemsSchema = z.object({
  version: z.object({
    id: z.string(),
    planId: z.string(),
    number: z.number().int(),
    planName: z.string(),
    projectName: z.string(),
    signedOffBy: z.string(),
    signedOffAt: z.string().nullable(),
  }),
  /** The altitude reference of every item, named. */
  altitude: z.object({
    frame: z.number().int(),
    frameName: z.string(),
    reference: z.string(),
    takeoff: z.object({ lon: n, lat: n }),
    /** Ground height of the takeoff point above `verticalDatum`, from the grid. */
    takeoffGroundM: n.nullable(),
    verticalDatum: z.string(),
  }),
  lines: z.array(missionLineSchema),
  items: z.array(missionItemSchema),
  /** MAVLink messages and commands used, with the protocol documentation they follow. */
  protocol: z.object({ source: z.string(), messages: z.array(z.string()), commands: z.array(z.string()) }),
  cautions: z.array(z.string()),
  generatedAt: z.string(),
});
export type MissionItems = z.infer<typeof missionItemsSchema>;

/** The smallest and largest photo spacing and ground speed over a line's legs (equal when the line flies one of each). */
export function lineSettingRanges(line: MissionLine): { triggerDistanceM: { min: number; max: number }; speedMps: { min: number; max: number } } {
  const t = line.legs.map((g) => g.triggerDistanceM);
  const v = line.legs.map((g) => g.speedMps);
  if (t.length === 0) return { triggerDistanceM: { min: line.triggerDistanceM, max: line.triggerDistanceM }, speedMps: { min: line.speedMps, max: line.speedMps } };
  return { triggerDistanceM: { min: Math.min(...t), max: Math.max(...t) }, speedMps: { min: Math.min(...v), max: Math.max(...v) } };
}
