import type { CameraPose } from './footprint';

/** One photo: its planned pose in the local frame, and the crab angle the attitude envelope allows on its line. */
export interface CoveragePhoto extends CameraPose {
  /** Crab angle of the photo's line in the envelope's wind (degrees; 0 without wind or for aircraft that do not crab). */
  crabDeg?: number;
}
