/** The shape of a plan analysis result (what `analysePlan` returns and the CLI `plan` prints). */
import type { Mission } from './mission';
import type { UnmetStretch } from './altitude';
import type { StationFlag } from './overlap';
import type { HeadingAdvice } from './heading';
import type { PlanWarning } from './plan-warnings';

/** A point of a line: longitude, latitude and distance from the line start. */
export interface PlanPoint { lon: number; lat: number; distanceM: number }

/** One exposure station as the plan expects it to turn out over the real terrain. */
export interface PlanStation {
  lon: number;
  lat: number;
  distanceM: number;
  /** Ground under the station, metres above the grid's vertical datum (null where unknown). */
  groundM: number | null;
  /** Planned altitude above the grid's vertical datum. */
  altitudeM: number;
  altitudeAboveTakeoffM: number;
  aglM: number | null;
  gsdCm: number | null;
  forwardOverlap: number | null;
  sideOverlap: number | null;
  /** The overlaps as guaranteed under the mission's attitude envelope (null without one or where unknown; absent in results stored before). */
  forwardOverlapGuaranteed?: number | null;
  sideOverlapGuaranteed?: number | null;
  flags: StationFlag[];
}

/** One straight altitude leg of a line. */
export interface PlanLeg {
  start: PlanPoint;
  end: PlanPoint;
  altitudeStartM: number;
  altitudeEndM: number;
  altitudeStartAboveTakeoffM: number;
  altitudeEndAboveTakeoffM: number;
  aglMinM: number;
  aglMaxM: number;
  gsdMinCm: number;
  gsdMaxCm: number;
  /** Rise over run in the flying direction (climb positive). */
  gradient: number;
  /** Ground speed on this leg when it differs by leg (solved plans; otherwise the mission's speed), m/s. */
  speedMps?: number;
  /** Distance between photos on this leg when it varies along the line (solved plans), metres: smallest and largest. */
  triggerDistanceM?: { min: number; max: number };
}

/** One flight line with its stations and legs. */
export interface PlanLine {
  index: number;
  headingDeg: number;
  lengthM: number;
  start: { lon: number; lat: number };
  end: { lon: number; lat: number };
  /** Where the line is over the survey area (distances from its start); outside it are the run-in and run-out. */
  areaStartM: number;
  areaEndM: number;
  /** Camera tilt on its mount along the line, degrees from straight down towards the nose (oblique capture); absent: straight down. */
  cameraTiltDeg?: number;
  /**
   * The altitude above takeoff at which the straight way home from this line's end keeps the clearance and
   * allowance (never below the end's own): where a battery change after this line flies home from. Absent where
   * the line has no legs.
   */
  returnAltitudeAboveTakeoffM?: number;
  stations: PlanStation[];
  legs: PlanLeg[];
  unmet: UnmetStretch[];
  warnings: PlanWarning[];
}

/** The attitude envelope of the guaranteed overlaps, as the analysis used it. */
interface OverlapEnvelopeSummary {
  rollDeg: number;
  pitchDeg: number;
  windMps: number;
  windFromDeg: number;
  airspeedMps: number;
  crabs: boolean;
  /** Largest crab angle over the lines, degrees (0 for an aircraft that holds its heading). */
  crabDegMax: number;
  stepDeg: number;
  /** Image margin that makes the lattice of tested attitudes stand for the whole box, pixels. */
  marginPx: number;
  attitudeCount: number;
  words: string;
}

/** Plan-wide figures. */
export interface PlanSummary {
  lineCount: number;
  photoCount: number;
  flightDistanceM: number;
  flightTimeS: number;
  batteries: number;
  gsdCm: { min: number | null; median: number | null; max: number | null };
  forwardOverlapMin: number | null;
  sideOverlapMin: number | null;
  /** Least guaranteed overlaps (null without an envelope). */
  forwardOverlapGuaranteedMin?: number | null;
  sideOverlapGuaranteedMin?: number | null;
  /** The attitude envelope the guaranteed overlaps hold under; null when the mission has none (overlaps as planned only). */
  overlapEnvelope?: OverlapEnvelopeSummary | null;
  aglMinM: number | null;
  aglMaxM: number | null;
  /** Share of stations whose GSD lies within the target's tolerance band, fraction. */
  shareWithinGsdTarget: number;
  flaggedStationCount: number;
  unmetLengthM: number;
  mode: Mission['mode'];
  headingDeg: number;
  plannedHeightM: number;
  gsdBandCm: { min: number; max: number };
  lineSpacingM: number;
  triggerDistanceM: number;
  footprintAcrossM: number;
  footprintAlongM: number;
  maxDistanceFromTakeoffM: number;
}

/** The analysis result (the CLI `plan` JSON document). */
export interface PlanResult {
  lines: PlanLine[];
  summary: PlanSummary;
  warnings: PlanWarning[];
  /**
   * The takeoff point; `returnAltitudeM` (above the datum) and `returnAltitudeAboveTakeoffM`: the altitude the
   * straight return from the last line's end to the takeoff keeps the clearance at, never below that end's own (the
   * MAVLink export climbs to it over the end before the return).
   */
  takeoff: { lon: number; lat: number; groundM: number; geoidUndulationM: number; returnAltitudeM?: number; returnAltitudeAboveTakeoffM?: number };
  heights: { datum: string; aboveTakeoff: string; verticalDatum: { epsg: number | null; name: string } | null };
  headingAdvice: HeadingAdvice | null;
  frame: { crs: string; epsg: number | null };
}
