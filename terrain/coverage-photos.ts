/** The photos of an analysed plan as coverage poses: each station's position and altitude, yaw along its line, and its line's crab angle in the envelope's wind. */
import type { PlanResult } from './plan-result';
import type { AreaPolygon } from './mission';
import { localFrameFor, type LocalFrame } from './local-frame';
import { crabAngleDeg, type AttitudeEnvelope } from './attitude-envelope';
import type { CoveragePhoto } from './coverage';

/** The local frame a coverage of `area` is computed in (UTM of the area's corner mean, as the plan analysis uses). */
export function coverageFrame(area: AreaPolygon): LocalFrame {
  const ring = area.coordinates[0];
  let cx = 0, cy = 0;
  for (let i = 0; i < ring.length - 1; i++) { cx += ring[i][0]; cy += ring[i][1]; }
  return localFrameFor(cx / (ring.length - 1), cy / (ring.length - 1));
}

/** Planned photo poses (no roll or pitch) and each line's crab angle (0 without an envelope or for aircraft that do not crab). */
export function planPhotos(plan: PlanResult, frame: LocalFrame, envelope: AttitudeEnvelope | null): { photos: CoveragePhoto[]; lines: Array<{ line: number; headingDeg: number; crabDeg: number }> } {
  const photos: CoveragePhoto[] = [];
  const lines: Array<{ line: number; headingDeg: number; crabDeg: number }> = [];
  for (const line of plan.lines) {
    const crabDeg = envelope && envelope.crabs ? crabAngleDeg(line.headingDeg, envelope.windMps, envelope.windFromDeg, envelope.airspeedMps) : 0;
    lines.push({ line: line.index + 1, headingDeg: line.headingDeg, crabDeg });
    for (const s of line.stations) {
      const [x, y] = frame.toLocal(s.lon, s.lat);
      photos.push({ xM: x, yM: y, altitudeM: s.altitudeM, yawDeg: line.headingDeg, crabDeg, ...(line.cameraTiltDeg ? { mountTiltDeg: line.cameraTiltDeg } : {}) });
    }
  }
  return { photos, lines };
}
