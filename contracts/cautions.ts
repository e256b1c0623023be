/**
 * The safety cautions, worded once for every flight-facing screen, report, leg sheet, export, e-mail and the command
 * line. `flightCautions` words them for one plan (grid kind, datum, height limit); `generalCautions` is the short
 * form for screens and outputs that have no plan at hand. Both end with the same rule: local regulations and
 * licensed practice govern every flight.
 */

/** The closing caution of every list. */
export const regulationsCaution = 'Local regulations and licensed practice govern every flight: this plan is an aid to them, not a permission.';

/** The short list, for screens and outputs without a plan's facts. */
export const generalCautions: readonly string[] = [
  'Elevation grids are often bare-earth models: they miss trees, masts, power lines and buildings. Check obstacles on site.',
  'Local altitude limits and visual line-of-sight rules apply, whatever the plan says.',
  'Wind moves the aircraft off the planned lines and changes its ground speed; overlap and height above ground change with it.',
  regulationsCaution,
];

interface CautionFacts {
  surfaceKind: 'bare-earth' | 'surface';
  verticalDatum: string;
  maxAglM: number;
  obstacleAllowanceM: number;
  /** The camera tilts of the plan's tilted lines (oblique capture), degrees from straight down; empty or absent: none. */
  cameraTiltsDeg?: readonly number[];
}

/** "35°" or "20°–35°". */
function tiltWords(tilts: readonly number[]): string {
  const lo = Math.min(...tilts), hi = Math.max(...tilts);
  return lo === hi ? `${lo}°` : `${lo}°–${hi}°`;
}

/** Cautions for one plan, in the order the pilot should read them. */
export function flightCautions(f: CautionFacts): string[] {
  const grid =
    f.surfaceKind === 'bare-earth'
      ? `The elevation grid is bare earth: trees, masts, power lines and buildings are not in it, so heights above ground here are above the soil, not above what stands on it${f.obstacleAllowanceM > 0 ? ` (an obstacle allowance of ${f.obstacleAllowanceM} m was added to the clearance)` : ' (no obstacle allowance was added)'}. Check the site for obstacles before flying.`
      : 'The elevation grid is a surface model: it holds the tops of trees and buildings as they were when it was captured; anything built or grown since is missing. Check the site for obstacles before flying.';
  return [
    grid,
    `Local rules govern: the height limit used here (${f.maxAglM} m above ground level) is a setting, not a permission; follow the altitude limits, airspace restrictions and permissions that apply where you fly.`,
    'Keep the aircraft within visual line of sight as your local rules require; the plan does not check line of sight, terrain masking or radio range.',
    'Wind moves the aircraft off the planned track and changes its ground speed: overlap, time and battery figures assume still air.',
    `Altitudes above takeoff assume the takeoff point's ground height from the grid (heights above the vertical datum ${f.verticalDatum}); check the takeoff point's height on site, and if you take off elsewhere every altitude above takeoff changes.`,
    // a photo at another angle sees other ground: the plan's coverage holds only with the camera as planned
    ...(f.cameraTiltsDeg?.length
      ? [`The camera is tilted ${tiltWords(f.cameraTiltsDeg)} from straight down towards the nose on the lines marked so, and straight down on the others: the coverage was worked out at those angles. The MAVLink mission items point the gimbal before each line; flying from waypoints alone, set it yourself before each line and check it holds in flight.`]
      : []),
    regulationsCaution,
  ];
}

/** One line to stamp on exports and sheets that are not signed off. */
export const notSignedOffCaution = 'NOT SIGNED OFF: this version has not been signed off by a surveyor and is not for flight.';

/**
 * Cautions for a plan handed to an autopilot as MAVLink mission items: the plan's own, then what the hand-off adds
 * (the autopilot's home as the altitude reference, unplanned transits), ending with the same closing rule.
 */
export function missionCautions(f: CautionFacts): string[] {
  const plan = flightCautions(f).filter((c) => c !== regulationsCaution);
  return [
    ...plan,
    'Mission item altitudes are relative to the home position the autopilot records when it arms (MAV_FRAME_GLOBAL_RELATIVE_ALT_INT): arm at the planned takeoff point, or every altitude shifts by the height difference between the two spots.',
    'From takeoff to the first line, between lines and on the return the aircraft flies straight at the altitude of the item it heads for; the plan checks the ground under its lines only, not under these transits.',
    'Check the uploaded mission on the autopilot (its count, the first and last waypoints) before arming; the link reads it back but cannot see what the autopilot does with it.',
    regulationsCaution,
  ];
}
