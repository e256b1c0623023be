/** What the solver may choose within: its pattern, the slowest leg speed, the overlap floors, and how hard it works (mission field `solve`, all optional). */
import type { Mission } from './mission';
import { check } from './errors';

/**
 * Loftline's names for the patterns: `furrow`, one set of parallel lines (mapping); `lattice`, a second set
 * across the first, for specs that ask for views from several directions (3D); `slant`, the lattice flown with the
 * camera tilted towards the nose, so every line looks one way along it and the lines flown each way of both sets
 * look from four headings (oblique capture, when a nadir lattice cannot see that slant).
 */
export type SolvePattern = 'furrow' | 'lattice' | 'slant';

/** The solver's settings. */
interface SolveOptions {
  /** The pattern asked for; null lets the spec decide (a lattice when it asks for views from all round). */
  pattern: SolvePattern | null;
  /** Slowest ground speed a leg may be flown at to follow steep ground within the vertical-speed limits, m/s. */
  minSpeedMps: number;
  /**
   * Side overlap every pair of neighbouring lines keeps over the highest ground between them, under the attitude
   * envelope (fraction); null lets the pattern decide (solve.ts: 0.1 for a furrow, 0.55 for a lattice).
   */
  minSideOverlap: number | null;
  /** Forward overlap floor along every line (fraction); the view count may ask for more. */
  minForwardOverlap: number;
  /** Heading candidates tried (the best ones of the heading advice). */
  headingCandidates: number;
  /** Rounds of checking the coverage raster and tightening where cells fall short. */
  repairRounds: number;
  /**
   * How far beyond the area's boundary lines may be laid, metres (0: inside only). A lattice's edge is seen from
   * inside only unless lines fly past it; only where flying over the neighbouring ground is allowed.
   */
  beyondEdgeM: number;
  /** Camera tilt on its mount for the `slant` pattern, degrees from straight down; null: the spec's oblique angle + 5°. */
  tiltDeg: number | null;
  /** Rounds of adding spot photos over the cells the lines still leave short of the GSD (0: none). */
  spotRounds: number;
  /**
   * Whether a line may be cut at a face and flown as two back to back, the aircraft stopping there to climb or
   * descend straight up or down (`solve-cut.ts`); null lets the aircraft decide (solve.ts: not for one that crabs,
   * a fixed wing, which cannot stop).
   */
  cutAtFaces: boolean | null;
}

function numberIn(o: Record<string, unknown>, key: string, def: number, lo: number, hi: number): number {
  const v = o[key] === undefined ? def : o[key];
  check(typeof v === 'number' && Number.isFinite(v) && v >= lo && v <= hi, `solve.${key} must be a number from ${lo} to ${hi}, got ${JSON.stringify(v)}.`);
  return v as number;
}

function booleanOf(o: Record<string, unknown>, key: string): boolean {
  check(typeof o[key] === 'boolean', `solve.${key} must be true or false, got ${JSON.stringify(o[key])}.`);
  return o[key] as boolean;
}

/**
 * The `solve` settings of a mission written by a user. Defaults (our choices, common practice rather than any
 * standard): legs may slow to a quarter of the mission's speed (at least 1 m/s); the side overlap floor is the
 * pattern's (solve.ts); the forward floor is what the spec's view count needs.
 */
export function resolveSolveOptions(input: unknown, mission: Mission): SolveOptions {
  const raw = (input as Record<string, unknown>).solve;
  check(raw === undefined || (raw !== null && typeof raw === 'object' && !Array.isArray(raw)), `solve must be an object, got ${JSON.stringify(raw)}.`);
  const o = (raw ?? {}) as Record<string, unknown>;
  const pattern = (o.pattern ?? null) as SolvePattern | null;
  check(pattern === null || pattern === 'furrow' || pattern === 'lattice' || pattern === 'slant', `solve.pattern must be "furrow" (one set of parallel lines), "lattice" (two sets across each other) or "slant" (a lattice with the camera tilted), got ${JSON.stringify(o.pattern)}.`);
  const minSpeedMps = numberIn(o, 'minSpeedMps', Math.min(mission.speedMps, Math.max(1, mission.speedMps / 4)), 0.5, mission.speedMps);
  return {
    pattern,
    minSpeedMps,
    minSideOverlap: o.minSideOverlap === undefined ? null : numberIn(o, 'minSideOverlap', 0.1, 0, 0.9),
    // v views along a line need each point in v photos: a photo spacing of at most 1/v of the footprint
    minForwardOverlap: numberIn(o, 'minForwardOverlap', 0, 0, 0.95),
    headingCandidates: numberIn(o, 'headingCandidates', 3, 1, 12),
    repairRounds: numberIn(o, 'repairRounds', 4, 0, 12),
    spotRounds: Math.round(numberIn(o, 'spotRounds', 5, 0, 8)),
    beyondEdgeM: numberIn(o, 'beyondEdgeM', 0, 0, 100),
    tiltDeg: o.tiltDeg === undefined ? null : numberIn(o, 'tiltDeg', 35, 10, 60),
    cutAtFaces: o.cutAtFaces === undefined ? null : booleanOf(o, 'cutAtFaces'),
  };
}
