/**
 * The as-flown tests' site: a synthetic block of rolling hills with its plan, flown by `flyPlan`
 * (datasets/simulated-flight.ts: drift, crab, attitude, altitude bias, skipped triggers, two photos off the lines).
 */
import { syntheticSite, type Site } from './coverage-site';
import { analysePlan } from '../../terrain/plan';
import { resolveMission, type Mission } from '../../terrain/mission';
import { coverageFrame } from '../../terrain/coverage-photos';
import type { PlanResult } from '../../terrain/plan-result';
import type { LocalFrame } from '../../terrain/local-frame';
import type { CoveragePhoto } from '../../terrain/coverage';
import type { FlownPhoto } from '../../terrain/as-flown-match';
import { flyPlan, type FlownLog } from '../../datasets/simulated-flight';

const CAMERA = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };

/** Rolling hills: 25 m of relief over a few hundred metres. */
const hills = (x: number, y: number) => 200 + 15 * Math.sin(x / 80) + 10 * Math.cos(y / 60) + 0.02 * x;

export interface SimulatedFlight {
  site: Site;
  missionInput: Record<string, unknown>;
  mission: Mission;
  plan: PlanResult;
  frame: LocalFrame;
  /** The photo log as the camera wrote it (in flight order). */
  photos: FlownPhoto[];
  /** Skipped triggers, 1-based line and station. */
  skipped: Array<{ line: number; station: number }>;
  /** Indices in `photos` of the two photos off the lines. */
  extraPhotos: number[];
  /** Cross-track drift of each line, metres to the right of its flying direction. */
  driftM: number[];
  /** Mean altitude bias of the flight, metres (the barometer reads high). */
  altitudeBiasM: number;
  /** Every planned station's pose as it would have been flown (skipped ones included), and which were skipped. */
  allPoses: CoveragePhoto[];
  skippedPose: boolean[];
}

/** The site, the mission over a 300 m x 200 m block (east–west lines) and its plan. */
function simulatedSite(): { site: Site; missionInput: Record<string, unknown>; mission: Mission; plan: PlanResult; frame: LocalFrame } {
  const site = syntheticSite(400, 2, hills);
  const area = site.area(-150, -100, 150, 100);
  const [tlon, tlat] = site.frame.toLonLat(-170, -120);
  const missionInput: Record<string, unknown> = {
    name: 'Synthetic block (test)', area, camera: { ...CAMERA }, targetGsdCm: 2.5, gsdTolerance: 0.1, forwardOverlap: 0.8, sideOverlap: 0.7,
    headingDeg: 90, mode: 'follow', clearanceM: 30, takeoff: { lon: tlon, lat: tlat }, speedMps: 8, spec: { minViews: 9 },
  };
  const mission = resolveMission(missionInput);
  const plan = analysePlan(site.grid, missionInput);
  return { site, missionInput, mission, plan, frame: coverageFrame(mission.area) };
}

/** The synthetic site's plan flown with `skip` left out (see `flyPlan`). */
export function simulateFlight(skip: Array<{ line: number; station: number }>): SimulatedFlight {
  const base = simulatedSite();
  return { ...base, ...flyPlan(base.plan, base.frame, skip), skipped: skip };
}
