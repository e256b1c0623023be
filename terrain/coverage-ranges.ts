/** Ranges of the coverage fields of a mission: a leaf module, so the shared contracts take them without the engine. */
/** Inclusive ranges; the zod contract (contracts/coverage.ts) uses the same figures. */
export const COVERAGE_RANGES = Object.freeze({
  maxGsdCm: { min: 0.1, max: 100 },
  minViews: { min: 1, max: 100 },
  maxSigmaM: { min: 0.001, max: 100 },
  maxDirectionGapDeg: { min: 60, max: 359 },
  obliqueDeg: { min: 5, max: 80 },
  rollDeg: { min: 0, max: 45 },
  pitchDeg: { min: 0, max: 45 },
  windMps: { min: 0, max: 40 },
  windFromDeg: { min: 0, max: 360 },
  airspeedMps: { min: 1, max: 100 },
  stepDeg: { min: 0.25, max: 10 },
  cellM: { min: 0.1, max: 100 },
  maxCells: { min: 1, max: 50_000_000 },
  imageErrorPx: { min: 0.01, max: 100 },
});
