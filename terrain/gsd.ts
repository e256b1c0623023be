/** Flat-ground photo geometry: GSD, photo scale, footprint, air base and line spacing from height above ground. */
import type { Camera } from './camera';
import { pixelPitchMm, trackSides } from './camera';
import { check } from './errors';

// Textbook vertical-photo geometry (similar triangles; e.g. Wolf, Dewitt & Wilkinson, Elements of
// Photogrammetry, ch. 6): scale = f / (H - h); a sensor length l covers l (H - h) / f on the ground.

function checkHeight(heightM: number): void {
  check(Number.isFinite(heightM) && heightM > 0, `height above ground must be a positive number of metres, got ${heightM}.`);
}

function checkFraction(name: string, v: number): void {
  check(Number.isFinite(v) && v >= 0 && v < 1, `${name} must be a fraction in [0, 1), got ${v}.`);
}

/**
 * The GSD band a mission accepts: target ± tolerance (a fraction of the target), cm. The one computation of it:
 * the plan's summary (`gsdBandCm`), the report's spec and the coverage spec's coarse end all take it from here.
 */
export function gsdBandCm(m: { targetGsdCm: number; gsdTolerance: number }): { min: number; max: number } {
  return { min: m.targetGsdCm * (1 - m.gsdTolerance), max: m.targetGsdCm * (1 + m.gsdTolerance) };
}

/** Ground sample distance in centimetres at `heightM` above flat ground (pixel pitch along the image width). */
export function gsdCm(camera: Camera, heightM: number): number {
  checkHeight(heightM);
  return (heightM * pixelPitchMm(camera) * 100) / camera.focalLengthMm;
}

/** Height above ground (metres) that gives `targetGsdCm`. */
export function heightForGsdM(camera: Camera, targetGsdCm: number): number {
  check(Number.isFinite(targetGsdCm) && targetGsdCm > 0, `GSD must be a positive number of centimetres, got ${targetGsdCm}.`);
  return (targetGsdCm * camera.focalLengthMm) / (pixelPitchMm(camera) * 100);
}

/** Photo scale f / (H - h) as a ratio (0.0001 means 1:10 000); terrain height defaults to 0. */
export function photoScale(focalLengthMm: number, flyingHeightM: number, terrainHeightM = 0): number {
  check(Number.isFinite(focalLengthMm) && focalLengthMm > 0, `focal length must be positive millimetres, got ${focalLengthMm}.`);
  checkHeight(flyingHeightM - terrainHeightM);
  return focalLengthMm / 1000 / (flyingHeightM - terrainHeightM);
}

/** Ground footprint of one vertical photo over flat ground: metres across and along track. */
export function footprintM(camera: Camera, heightM: number): { acrossM: number; alongM: number } {
  checkHeight(heightM);
  const s = trackSides(camera);
  return { acrossM: (s.acrossMm * heightM) / camera.focalLengthMm, alongM: (s.alongMm * heightM) / camera.focalLengthMm };
}

/** Air base (trigger distance) B = (1 - forward overlap) x along-track footprint, metres. */
export function airBaseM(camera: Camera, heightM: number, forwardOverlap: number): number {
  checkFraction('forward overlap', forwardOverlap);
  return (1 - forwardOverlap) * footprintM(camera, heightM).alongM;
}

/** Line spacing S = (1 - side overlap) x across-track footprint, metres. */
export function lineSpacingM(camera: Camera, heightM: number, sideOverlap: number): number {
  checkFraction('side overlap', sideOverlap);
  return (1 - sideOverlap) * footprintM(camera, heightM).acrossM;
}

/** Overlap of two photos whose footprint length is `footprintLengthM` and whose centres are `baseM` apart (flat ground), in [0, 1]. */
export function flatOverlap(footprintLengthM: number, baseM: number): number {
  if (!(footprintLengthM > 0)) return 0;
  const o = 1 - baseM / footprintLengthM;
  return o < 0 ? 0 : o > 1 ? 1 : o;
}
