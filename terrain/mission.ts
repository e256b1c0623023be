/** The mission a plan is analysed for: the Mission type, its defaults and ranges, and the boundary check that applies them. */
import type { Camera } from './camera';
import { checkCamera } from './camera';
import type { AltitudeMode } from './altitude';
import { TerrainError, check } from './errors';
import { findRingCrossing } from './ring-crossings';

/** A GeoJSON Polygon in WGS 84 longitude/latitude (outer ring first, then holes; rings closed). */
export interface AreaPolygon {
  type: 'Polygon';
  coordinates: number[][][];
}

/** Everything a plan analysis needs; heights in metres, overlaps and tolerances as fractions, speeds in m/s. */
export interface Mission {
  area: AreaPolygon;
  camera: Camera;
  targetGsdCm: number;
  gsdTolerance: number;
  forwardOverlap: number;
  sideOverlap: number;
  /** Flight direction of the first line (degrees clockwise from north), or "advise" to pick the least AGL spread. */
  headingDeg: number | 'advise';
  mode: AltitudeMode;
  clearanceM: number;
  obstacleAllowanceM: number;
  maxAglM: number;
  speedMps: number;
  climbMps: number;
  descentMps: number;
  takeoff: { lon: number; lat: number };
  minLegLengthM: number;
  maxLegsPerLine: number;
  altitudeRoundingM: number;
  runInM: number;
  enduranceMin: number;
  batteryReserve: number;
  turnTimeS: number;
  /** Ground-profile sample step along lines; null = from the grid's pixel size (clamped to 1..10 m). */
  stationStepM: number | null;
}

/** A mission as written by a user: the required fields, the rest optional (defaults below). */
export type MissionInput = Pick<Mission, 'area' | 'camera' | 'targetGsdCm' | 'takeoff'> & Partial<Omit<Mission, 'area' | 'camera' | 'targetGsdCm' | 'takeoff'>>;

/** A numeric range: inclusive unless `exclusiveMin`; `integer` for whole numbers. */
export interface NumberRange {
  min: number;
  max: number;
  exclusiveMin?: boolean;
  integer?: boolean;
}

/** Ranges of the numeric mission fields (shared with the zod contract). */
export const MISSION_RANGES = Object.freeze({
  targetGsdCm: { min: 0.1, max: 100 },
  gsdTolerance: { min: 0, max: 0.5 },
  forwardOverlap: { min: 0, max: 0.95 },
  sideOverlap: { min: 0, max: 0.95 },
  headingDeg: { min: 0, max: 360 },
  clearanceM: { min: 0, max: 1000 },
  obstacleAllowanceM: { min: 0, max: 1000 },
  maxAglM: { min: 0, max: 3000, exclusiveMin: true },
  speedMps: { min: 0, max: 60, exclusiveMin: true },
  climbMps: { min: 0, max: 30, exclusiveMin: true },
  descentMps: { min: 0, max: 30, exclusiveMin: true },
  minLegLengthM: { min: 0, max: 10_000 },
  maxLegsPerLine: { min: 1, max: 200, integer: true },
  altitudeRoundingM: { min: 0, max: 50 },
  runInM: { min: 0, max: 2000 },
  enduranceMin: { min: 0, max: 1440, exclusiveMin: true },
  batteryReserve: { min: 0, max: 0.9 },
  turnTimeS: { min: 0, max: 600 },
  stationStepM: { min: 0.25, max: 100 },
} satisfies Record<string, NumberRange>);

/**
 * Defaults of the optional fields. Overlaps follow the usual photogrammetric 80 % / 70 % (common practice,
 * see DOMAIN.md); the 120 m height limit is a common regulatory figure that local rules override; run-in,
 * leg and battery figures are common practice for small multirotors, not any aircraft's specification.
 */
export const MISSION_DEFAULTS = Object.freeze({
  gsdTolerance: 0.1,
  forwardOverlap: 0.8,
  sideOverlap: 0.7,
  headingDeg: 'advise' as number | 'advise',
  mode: 'follow' as AltitudeMode,
  clearanceM: 30,
  obstacleAllowanceM: 0,
  maxAglM: 120,
  speedMps: 10,
  climbMps: 3,
  descentMps: 2,
  minLegLengthM: 50,
  maxLegsPerLine: 10,
  altitudeRoundingM: 1,
  runInM: 20,
  enduranceMin: 25,
  batteryReserve: 0.25,
  turnTimeS: 10,
  stationStepM: null as number | null,
});

/** Largest survey area accepted, km² (bigger areas should be split into several plans). */
export const MAX_AREA_KM2 = 100;

function inRange(name: string, v: unknown, r: NumberRange): number {
  const ok = typeof v === 'number' && Number.isFinite(v) && (r.exclusiveMin ? v > r.min : v >= r.min) && v <= r.max && (!r.integer || Number.isInteger(v));
  check(ok, `${name} must be ${r.integer ? 'a whole number' : 'a number'} ${r.exclusiveMin ? 'above' : 'from'} ${r.min} to ${r.max}, got ${JSON.stringify(v)}.`);
  return v as number;
}

/** Spherical polygon ring area in m² (Chamberlain & Duquette, "Some algorithms for polygons on a sphere", JPL 2007). */
export function ringAreaM2(ring: number[][]): number {
  const R = 6371008.8;
  let s = 0;
  for (let i = 0; i + 1 < ring.length; i++) {
    const [l1, p1] = ring[i], [l2, p2] = ring[i + 1];
    s += ((l2 - l1) * Math.PI / 180) * (2 + Math.sin((p1 * Math.PI) / 180) + Math.sin((p2 * Math.PI) / 180));
  }
  return Math.abs((s * R * R) / 2);
}

/** Throw `invalid-input` unless `area` is a closed, simple WGS 84 polygon of sensible size. */
export function checkArea(area: unknown): AreaPolygon {
  const a = area as AreaPolygon;
  check(a !== null && typeof a === 'object' && a.type === 'Polygon' && Array.isArray(a.coordinates) && a.coordinates.length > 0,
    `area must be a GeoJSON Polygon ({ "type": "Polygon", "coordinates": [[[lon, lat], …]] }), got ${JSON.stringify(area)?.slice(0, 80)}.`);
  a.coordinates.forEach((ring, r) => {
    check(Array.isArray(ring) && ring.length >= 4, `area ring ${r} needs at least 4 positions (3 corners and the closing one), got ${Array.isArray(ring) ? ring.length : typeof ring}.`);
    ring.forEach((p, i) => {
      // the message is built only on failure: building it per position cost more than the whole crossing check
      if (!(Array.isArray(p) && p.length >= 2 && Number.isFinite(p[0]) && Number.isFinite(p[1]) && Math.abs(p[0]) <= 180 && p[1] > -80 && p[1] < 84)) {
        check(false, `area ring ${r} position ${i} must be [lon, lat] with lon in -180..180 and lat in -80..84 (UTM range), got ${JSON.stringify(p)}.`);
      }
    });
    const f = ring[0], l = ring[ring.length - 1];
    check(f[0] === l[0] && f[1] === l[1], `area ring ${r} must be closed: its last position must repeat the first ${JSON.stringify(f)}, got ${JSON.stringify(l)}.`);
  });
  const x = findRingCrossing(a.coordinates);
  if (x) {
    const near = `near lon ${x.at[0].toFixed(5)}, lat ${x.at[1].toFixed(5)}`;
    check(false, x.ringA === x.ringB
      ? `area ring ${x.ringA} crosses itself (edges ${x.edgeA} and ${x.edgeB}, ${near}); draw the polygon without crossings.`
      : `area ring ${x.ringA} crosses ring ${x.ringB} (edge ${x.edgeA} and edge ${x.edgeB}, ${near}); draw the rings without crossings.`);
  }
  const km2 = ringAreaM2(a.coordinates[0]) / 1e6;
  check(km2 > 1e-6, 'area encloses no ground (all corners on one line).');
  check(km2 <= MAX_AREA_KM2, `area is ${km2.toFixed(1)} km², more than the ${MAX_AREA_KM2} km² one plan takes; split it into several plans.`);
  return a;
}

/** Apply defaults and range checks to a mission written by a user; throws TerrainError('invalid-input') saying what is wrong. */
export function resolveMission(input: unknown): Mission {
  if (input === null || typeof input !== 'object') throw new TerrainError('invalid-input', `mission must be a JSON object, got ${JSON.stringify(input)}.`);
  const m = input as Record<string, unknown>;
  const area = checkArea(m.area);
  checkCamera(m.camera as Camera);
  const take = m.takeoff as { lon: number; lat: number } | undefined;
  check(take !== null && typeof take === 'object' && Number.isFinite(take.lon) && Number.isFinite(take.lat) && Math.abs(take.lon) <= 180 && Math.abs(take.lat) <= 90,
    `takeoff must be { "lon": …, "lat": … } in degrees, got ${JSON.stringify(take)}.`);
  const num = (k: keyof typeof MISSION_RANGES) => {
    const v = m[k] === undefined ? (MISSION_DEFAULTS as Record<string, unknown>)[k] : m[k];
    return inRange(k, v, MISSION_RANGES[k]);
  };
  const heading = m.headingDeg === undefined ? MISSION_DEFAULTS.headingDeg : m.headingDeg;
  const headingDeg = heading === 'advise' ? 'advise' : inRange('headingDeg', heading, MISSION_RANGES.headingDeg) % 360;
  const mode = (m.mode ?? MISSION_DEFAULTS.mode) as AltitudeMode;
  check(mode === 'hold' || mode === 'steps' || mode === 'follow', `mode must be "hold", "steps" or "follow", got ${JSON.stringify(m.mode)}.`);
  const step = m.stationStepM === undefined || m.stationStepM === null ? null : inRange('stationStepM', m.stationStepM, MISSION_RANGES.stationStepM);
  const out: Mission = {
    area,
    camera: m.camera as Camera,
    targetGsdCm: inRange('targetGsdCm', m.targetGsdCm, MISSION_RANGES.targetGsdCm),
    gsdTolerance: num('gsdTolerance'),
    forwardOverlap: num('forwardOverlap'),
    sideOverlap: num('sideOverlap'),
    headingDeg,
    mode,
    clearanceM: num('clearanceM'),
    obstacleAllowanceM: num('obstacleAllowanceM'),
    maxAglM: num('maxAglM'),
    speedMps: num('speedMps'),
    climbMps: num('climbMps'),
    descentMps: num('descentMps'),
    takeoff: { lon: take.lon, lat: take.lat },
    minLegLengthM: num('minLegLengthM'),
    maxLegsPerLine: num('maxLegsPerLine'),
    altitudeRoundingM: num('altitudeRoundingM'),
    runInM: num('runInM'),
    enduranceMin: num('enduranceMin'),
    batteryReserve: num('batteryReserve'),
    turnTimeS: num('turnTimeS'),
    stationStepM: step,
  };
  check(out.clearanceM + out.obstacleAllowanceM < out.maxAglM,
    `clearance plus obstacle allowance (${out.clearanceM + out.obstacleAllowanceM} m) must be below the maximum height above ground (${out.maxAglM} m).`);
  return out;
}
