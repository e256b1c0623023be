/**
 * Letting Loftline lay the lines out: the mission's `layoutBy` and `solve` settings, and what the solver adds to a
 * stored result (why each line is where it is, the proof over the reachable cells, the comparison with uniform
 * settings). The terrain core (terrain/solve*.ts) checks the same ranges.
 */
import { z } from 'zod';

/** Who lays the lines out: the mission's own overlaps and heading (`settings`), or the solver (`solver`). */
export const layoutBySchema = z.enum(['settings', 'solver'], { error: 'layoutBy must be "settings" or "solver".' });

const ranged = (name: string, lo: number, hi: number) => {
  const msg = `solve.${name} must be a number from ${lo} to ${hi}.`;
  return z.number({ error: msg }).gte(lo, { error: msg }).lte(hi, { error: msg });
};

/** The solver's settings (all optional; terrain/solve-options.ts has the defaults and why). */
export const solveSettingsSchema = z.object({
  // left out, the spec decides: a lattice when it asks for views from all round, else a furrow
  pattern: z.enum(['furrow', 'lattice', 'slant'], { error: 'solve.pattern must be "furrow" (one set of parallel lines), "lattice" (a second set across the first) or "slant" (a lattice with the camera tilted).' }).optional(),
  // the slant pattern's camera tilt, degrees from straight down towards the nose
  tiltDeg: ranged('tiltDeg', 10, 60).optional(),
  minSpeedMps: ranged('minSpeedMps', 0.5, 30).optional(),
  minSideOverlap: ranged('minSideOverlap', 0, 0.9).optional(),
  minForwardOverlap: ranged('minForwardOverlap', 0, 0.95).optional(),
  headingCandidates: ranged('headingCandidates', 1, 12).int({ error: 'solve.headingCandidates must be a whole number.' }).optional(),
  repairRounds: ranged('repairRounds', 0, 12).int({ error: 'solve.repairRounds must be a whole number.' }).optional(),
  spotRounds: ranged('spotRounds', 0, 8).int({ error: 'solve.spotRounds must be a whole number.' }).optional(),
  // lines may be laid this far beyond the boundary (only where flying over the neighbouring ground is allowed)
  beyondEdgeM: ranged('beyondEdgeM', 0, 100).optional(),
  // a line may be cut at a face and flown as two, the aircraft stopping to climb or descend straight up or down
  // (left out: yes unless the attitude envelope's aircraft crabs, a fixed wing, which cannot stop)
  cutAtFaces: z.boolean({ error: 'solve.cutAtFaces must be true or false.' }).optional(),
});

const n = z.number();
const lonLat = z.object({ lon: n, lat: n });

/** What the solver adds to a stored result. */
export const solveReportSchema = z.object({
  pattern: z.string(),
  choices: z.object({
    headingDeg: n, heading: z.string(), pattern: z.string(), fallback: z.string().nullable(), summary: z.string(),
    // which tightening round was kept and why (stored before it was said: absent)
    tightening: z.string().optional(),
    lines: z.array(z.object({
      // stored before spot photos existed: every line was a line of the layout
      line: z.number().int(), kind: z.enum(['line', 'spot']).default('line'), offsetM: n, spacingToNextM: n.nullable(),
      // which set of lines: 1, or 2 for the lattice's second set across the first (stored before lattices: 1)
      set: z.number().int().default(1),
      speedMps: z.object({ min: n, max: n }), triggerDistanceM: z.object({ min: n, max: n }), legs: z.number().int(), reasons: z.array(z.string()),
    })),
  }),
  unreachable: z.array(z.object({ reason: z.string(), message: z.string(), cells: z.number().int(), areaM2: n, centroid: lonLat })),
  proof: z.object({
    cellM: n, cellsInArea: z.number().int(), reachableCells: z.number().int(), shareReachableMeeting: n, meets: z.boolean(),
    items: z.array(z.object({ item: z.string(), asks: z.string(), share: n })),
    shortCells: z.number().int(),
    short: z.array(z.object({ item: z.string(), cells: z.number().int(), areaM2: n, slopeDeg: z.object({ min: n, max: n }), centroid: lonLat, message: z.string() })),
    basis: z.string(),
  }),
  comparison: z.object({
    uniform: z.array(z.object({
      setting: z.object({ forwardOverlap: n, sideOverlap: n, mode: z.string(), headingDeg: n, targetGsdCm: n.optional() }),
      flightTimeS: n, shareReachable: n.nullable(), meets: z.boolean().nullable(),
      // the setting's photos and batteries (stored before they were given: absent)
      photoCount: z.number().int().optional(), batteries: z.number().int().optional(),
    })),
    bestUniformFlightTimeS: n.nullable(), solvedFlightTimeS: n, ratio: n.nullable(),
  }),
  rounds: z.number().int(),
});
export type SolveReportData = z.infer<typeof solveReportSchema>;

/** The solver's part of a solved plan (the rest is an ordinary plan result). */
export const SOLVE_REPORT_KEYS = ['pattern', 'choices', 'unreachable', 'proof', 'comparison', 'rounds'] as const;
