/** The view geometry the solver lays lines by: the GSD height of the spec and the footprint half-angles guaranteed under the attitude envelope. */
import type { Camera } from './camera';
import { pixelPitchMm, trackSides } from './camera';
import type { CoverageSpec } from './coverage-spec';
import type { AttitudeEnvelope } from './attitude-envelope';
import { heightForGsdM } from './gsd';

const DEG = Math.PI / 180;

/** Figures of one camera under one envelope for one spec. */
export interface ViewGeometry {
  /** Height above flat ground whose nadir GSD is the spec's coarsest allowed GSD, metres. */
  specHeightM: number;
  /** GSD per metre of height above ground (cm/m). */
  gsdPerM: number;
  /**
   * Tangent of the half-angle across (along) the track that stays in the image at every roll (pitch) of the
   * envelope: the image half-angle less the largest tilt (a tilted camera loses that much on one side).
   */
  tanAcross: number;
  tanAlong: number;
  rollDeg: number;
  pitchDeg: number;
}

export function viewGeometry(camera: Camera, spec: CoverageSpec, envelope: AttitudeEnvelope | null): ViewGeometry {
  const s = trackSides(camera);
  const rollDeg = envelope ? envelope.rollDeg : 0;
  const pitchDeg = envelope ? envelope.pitchDeg : 0;
  const half = (mm: number) => Math.atan(mm / 2 / camera.focalLengthMm);
  return {
    specHeightM: heightForGsdM(camera, spec.maxGsdCm),
    gsdPerM: (pixelPitchMm(camera) / camera.focalLengthMm) * 100,
    tanAcross: Math.max(0.01, Math.tan(half(s.acrossMm) - rollDeg * DEG)),
    tanAlong: Math.max(0.01, Math.tan(half(s.alongMm) - pitchDeg * DEG)),
    rollDeg,
    pitchDeg,
  };
}

/** Forward overlap a line needs so that every point along it is in `views` photos (photo spacing at most 1/views of the footprint), with a 5-point margin, and at least `floor`. */
export function forwardOverlapForViews(views: number, floor: number): number {
  const need = views <= 1 ? 0.1 : 1 - 1 / views + 0.05;
  return Math.min(0.95, Math.max(floor, need));
}

/**
 * Forward overlap a nadir line needs so that every point along it is also seen from ahead and from behind at least
 * `obliqueDeg` from the vertical (views from all round): a photo must fall between h·tan θ and h·tan(half-angle
 * along) ahead of the point, so photos are at most h·(tan(half-angle) − tan θ) apart, with the same 5-point margin.
 * Null when the camera's guaranteed half-angle along the track is no wider than θ (no nadir photo sees that slant).
 */
export function forwardOverlapForSlant(g: ViewGeometry, obliqueDeg: number): number | null {
  const t = Math.tan(obliqueDeg * DEG);
  if (!(g.tanAlong > t)) return null;
  return Math.min(0.95, 1 - (g.tanAlong - t) / (2 * g.tanAlong) + 0.05);
}
