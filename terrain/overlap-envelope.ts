/** Station overlaps as guaranteed under the attitude envelope: each photo's ground extents over every attitude the envelope allows. */
import type { Camera } from './camera';
import type { HeightAt } from './footprint';
import { crabAngleDeg, envelopeSamples, type AttitudeEnvelope } from './attitude-envelope';
import { photoExtents, STRIDE, type LinePhotos } from './overlap';
import type { GuaranteedExtents } from './guaranteed-extents';


/**
 * Cells per attitude axis the least overlap is taken over. The side overlap weighs every cell of a photo against
 * every pair of cells of the two neighbours around it (cells³ a row), so the count stays small: two halves an
 * axis keep a fixed wing's 15° roll, 8° pitch and crab to 8 cells; finer cells would tighten the bound a little.
 */
const CELLS_PER_AXIS = 2;

/** Crab angle of a line in the envelope's wind (0 for an aircraft that holds its heading, or without wind). */
export function lineCrabDeg(headingDeg: number, env: AttitudeEnvelope): number {
  return env.crabs ? crabAngleDeg(headingDeg, env.windMps, env.windFromDeg, env.airspeedMps) : 0;
}

/**
 * The guaranteed extents of one line's photos. Each photo may take any attitude of the envelope's box (yaw
 * between the planned heading and the crabbed one, pitch and roll within their limits), independently of its
 * neighbours. The box is tested on the lattice of `envelopeSamples`, with its margin: a ground point inside the
 * image shrunk by the margin at every lattice attitude of a cell is inside the image at every attitude of that
 * cell (the piecewise interpolation bound stated there holds lattice cell by lattice cell), so `inner` is ground the photo
 * holds whatever its attitude within the cell; the lengths use the image grown by the same margin. Taking the
 * least overlap over pairs of cells, rather than the held ground and the longest footprint over the whole box,
 * keeps the bound close: within one cell the attitude that shortens the shared ground and the one that
 * lengthens the footprint are never far apart. The planned attitude's extents join every cell, so the
 * guaranteed figure never exceeds the planned one.
 */
export function guaranteedExtents(camera: Camera, heightAt: HeightAt, line: LinePhotos, layoutHeadingDeg: number, planned: Float64Array, env: AttitudeEnvelope): GuaranteedExtents {
  const n = line.x.length;
  // the lattice's rotations depend on the attitude only, the same for every photo of the line
  const samples = envelopeSamples(camera, { xM: 0, yM: 0, altitudeM: 0, yawDeg: line.headingDeg, mountTiltDeg: line.mountTiltDeg }, env, lineCrabDeg(line.headingDeg, env));
  const [ny, np, nr] = samples.shape;
  const m = samples.marginPx;
  const shrunk: Float64Array[] = [], grown: Float64Array[] = [];
  for (let a = 0; a < samples.count; a++) {
    const rot = samples.rotations.subarray(a * 9, a * 9 + 9);
    shrunk.push(photoExtents(camera, heightAt, line, layoutHeadingDeg, { rot, insetPx: m }));
    grown.push(m > 0 ? photoExtents(camera, heightAt, line, layoutHeadingDeg, { rot, insetPx: -m }) : shrunk[a]);
  }
  // cells: along each axis at most CELLS_PER_AXIS runs of neighbouring lattice indices (a single index where the
  // axis has one value); a cell holds every lattice attitude of its runs, so the margin rule holds for it as for
  // each lattice cell inside it
  const runs = (k: number): number[][] => {
    if (k === 1) return [[0]];
    const parts = Math.min(CELLS_PER_AXIS, k - 1);
    return Array.from({ length: parts }, (_, i) => {
      const a = Math.round((i * (k - 1)) / parts), b = Math.round(((i + 1) * (k - 1)) / parts);
      return Array.from({ length: b - a + 1 }, (_, j) => a + j);
    });
  };
  const cellCorners: number[][] = [];
  for (const ys of runs(ny)) for (const ps of runs(np)) for (const rs of runs(nr)) {
    const members: number[] = [];
    for (const y of ys) for (const p of ps) for (const r of rs) members.push((y * np + p) * nr + r);
    cellCorners.push(members);
  }
  const cells = cellCorners.length;
  const inner = new Float64Array(n * cells * 12), lengths = new Float64Array(n * cells * 6);
  for (let s = 0; s < n; s++) {
    const o = s * STRIDE;
    for (let c = 0; c < cells; c++) {
      const bi = (s * cells + c) * 12, bl = (s * cells + c) * 6;
      for (let k = 0; k < 6; k++) {
        let lo = planned[o + 2 * k], hi = planned[o + 2 * k + 1], len = hi - lo;
        // Math.max/min carry NaN through: a ray that missed at any attitude leaves the figure unknown
        for (const a of cellCorners[c]) {
          lo = Math.max(lo, shrunk[a][o + 2 * k]);
          hi = Math.min(hi, shrunk[a][o + 2 * k + 1]);
          len = Math.max(len, grown[a][o + 2 * k + 1] - grown[a][o + 2 * k]);
        }
        inner[bi + 2 * k] = lo; inner[bi + 2 * k + 1] = hi; lengths[bl + k] = len;
      }
    }
  }
  return { cells, inner, lengths, marginPx: m, attitudeCount: samples.count };
}

/** The envelope in words, for the reasons of flagged stations. */
export function envelopeWords(env: AttitudeEnvelope, crabDegMax: number): string {
  const crab = env.crabs && crabDegMax > 0 ? `, crab up to ${crabDegMax.toFixed(1)}° in a ${env.windMps} m/s wind from ${env.windFromDeg}°` : '';
  return `±${env.rollDeg}° roll, ±${env.pitchDeg}° pitch${crab}`;
}
