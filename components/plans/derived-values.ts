/** The flat-ground values a planner sees live while filling in the form: height for the target GSD, footprint, spacing. */
import type { Camera } from '../../terrain/camera';
import { airBaseM, footprintM, heightForGsdM, lineSpacingM } from '../../terrain/gsd';

/** Inputs, as far as the form has them (any may still be missing or out of range while typing). */
interface DerivedInput {
  camera: Partial<Camera> | null | undefined;
  targetGsdCm: number | undefined;
  gsdTolerance: number | undefined;
  forwardOverlap: number | undefined;
  sideOverlap: number | undefined;
  maxAglM: number | undefined;
}

/** Flat-ground planning figures; the analysis then checks them station by station over the real terrain. */
interface DerivedValues {
  /** Height above ground that gives the target GSD. */
  heightM: number;
  /** Heights that give the tolerance band's finest and coarsest GSD. */
  bandLowM: number;
  bandHighM: number;
  footprintAcrossM: number;
  footprintAlongM: number;
  lineSpacingM: number;
  triggerDistanceM: number;
  /** The target height is above the maximum height above ground: the target GSD cannot be flown. */
  aboveMaxAgl: boolean;
}

const positive = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v) && v > 0;
const fraction = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v) && v >= 0 && v < 1;

/** The live figures, or null while the camera or targets are incomplete (the form shows its own errors then). */
export function deriveValues(input: DerivedInput): DerivedValues | null {
  const c = input.camera;
  if (!c || !positive(c.sensorWidthMm) || !positive(c.sensorHeightMm) || !positive(c.focalLengthMm) || !positive(c.imageWidthPx) || !positive(c.imageHeightPx)) {
    return null;
  }
  if (!positive(input.targetGsdCm) || !fraction(input.forwardOverlap) || !fraction(input.sideOverlap)) return null;
  const camera = c as Camera;
  const heightM = heightForGsdM(camera, input.targetGsdCm);
  const tol = fraction(input.gsdTolerance) ? input.gsdTolerance : 0;
  const fp = footprintM(camera, heightM);
  return {
    heightM,
    // GSD is proportional to height (GSD = H p / f), so the band of heights scales with the GSD band.
    bandLowM: heightM * (1 - tol),
    bandHighM: heightM * (1 + tol),
    footprintAcrossM: fp.acrossM,
    footprintAlongM: fp.alongM,
    lineSpacingM: lineSpacingM(camera, heightM, input.sideOverlap),
    triggerDistanceM: airBaseM(camera, heightM, input.forwardOverlap),
    aboveMaxAgl: positive(input.maxAglM) ? heightM > input.maxAglM : false,
  };
}
