/** Mission estimates: photo count, flight distance, flight time (speed, turns, climbs) and batteries (endurance with a reserve). */
import { check } from './errors';

/** Inputs of the estimate; distances in metres, speeds in m/s. */
interface EstimateInput {
  photoCount: number;
  /** Distance along the flight lines (run-ins included). */
  lineDistanceM: number;
  /** Transits between lines and the legs from and to the takeoff point. */
  transitDistanceM: number;
  lineCount: number;
  speedMps: number;
  turnTimeS: number;
  /** Climb and descent flown vertically (metres), at the vertical speeds: off the takeoff point, back onto it, and between lines. */
  climbM?: number;
  descentM?: number;
  climbMps?: number;
  descentMps?: number;
  enduranceMin: number;
  /** Share of each battery kept in reserve, fraction. */
  batteryReserve: number;
}

/** The estimate. */
interface Estimate {
  photoCount: number;
  flightDistanceM: number;
  flightTimeS: number;
  /** Usable flight time per battery after the reserve, seconds. */
  usablePerBatteryS: number;
  batteries: number;
}

/**
 * Time = horizontal distance / speed + one turn per change of line + vertical travel at the vertical
 * speeds beyond what the horizontal legs already cover (climbs on the lines ride on the forward speed, so
 * only the takeoff climb, the final descent and the changes of altitude between lines are added, as
 * `climbM` / `descentM`).
 */
export function estimateMission(e: EstimateInput): Estimate {
  check(e.speedMps > 0 && Number.isFinite(e.speedMps), `speed must be positive, got ${e.speedMps}.`);
  check(e.enduranceMin > 0 && Number.isFinite(e.enduranceMin), `endurance must be positive minutes, got ${e.enduranceMin}.`);
  check(e.batteryReserve >= 0 && e.batteryReserve < 1, `battery reserve must be a fraction in [0, 1), got ${e.batteryReserve}.`);
  check(e.turnTimeS >= 0 && e.lineDistanceM >= 0 && e.transitDistanceM >= 0 && e.lineCount >= 0 && e.photoCount >= 0,
    'estimate inputs must be zero or more.');
  const flightDistanceM = e.lineDistanceM + e.transitDistanceM;
  const vertical = (e.climbM ?? 0) / (e.climbMps ?? Infinity) + (e.descentM ?? 0) / (e.descentMps ?? Infinity);
  const flightTimeS = flightDistanceM / e.speedMps + Math.max(0, e.lineCount - 1) * e.turnTimeS + (Number.isFinite(vertical) ? vertical : 0);
  const usablePerBatteryS = e.enduranceMin * 60 * (1 - e.batteryReserve);
  return { photoCount: e.photoCount, flightDistanceM, flightTimeS, usablePerBatteryS, batteries: Math.max(1, Math.ceil(flightTimeS / usablePerBatteryS - 1e-9)) };
}
