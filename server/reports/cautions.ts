/** The safety cautions every flight-facing output carries (report, leg sheet, exports), worded once. */

export interface CautionFacts {
  surfaceKind: 'bare-earth' | 'surface';
  verticalDatum: string;
  maxAglM: number;
  obstacleAllowanceM: number;
}

/** Cautions in the order the pilot should read them; they defer to local regulations. */
export function flightCautions(f: CautionFacts): string[] {
  const grid =
    f.surfaceKind === 'bare-earth'
      ? `The elevation grid is bare earth: trees, masts, power lines and buildings are not in it, so heights above ground here are above the soil, not above what stands on it${f.obstacleAllowanceM > 0 ? ` (an obstacle allowance of ${f.obstacleAllowanceM} m was added to the clearance)` : ' (no obstacle allowance was added)'}. Check the site for obstacles before flying.`
      : 'The elevation grid is a surface model: it holds the tops of trees and buildings as they were when it was captured; anything built or grown since is missing. Check the site for obstacles before flying.';
  return [
    grid,
    `Local rules govern: the height limit used here (${f.maxAglM} m above ground) is a setting, not a permission; follow the altitude limits, airspace restrictions and permissions that apply where you fly.`,
    'Keep the aircraft within visual line of sight as your local rules require; the plan does not check line of sight, terrain masking or radio range.',
    'Wind moves the aircraft off the planned track and changes its ground speed: overlap, time and battery figures assume still air.',
    `Altitudes above takeoff assume the takeoff point's ground height from the grid (datum: ${f.verticalDatum}); check the takeoff point's height on site, and if you take off elsewhere every altitude above takeoff changes.`,
  ];
}

/** One line to stamp on exports and sheets that are not signed off. */
export const notSignedOffCaution = 'NOT SIGNED OFF: this version has not been signed off by a surveyor and is not for flight.';
