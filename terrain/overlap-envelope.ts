/** Station overlaps as guaranteed under the attitude envelope: each photo's ground extents over every attitude the envelope allows. */
import type { Camera } from './camera';
import type { HeightAt } from './footprint';
import { crabAngleDeg, envelopeSamples, type AttitudeEnvelope } from './attitude-envelope';
import { photoExtents, STRIDE, type LinePhotos } from './overlap';

/**
 * A line's photos under the envelope, cell by cell of the lattice of tested attitudes (`cells` a photo; a cell
 * is the box between neighbouring lattice attitudes, or the single attitude of a zero envelope). For each photo,
 * cell and each of the six intervals of `photoExtents` (three along-track image columns, three across-track
 * image rows): `inner` (12 numbers) the ground every attitude of the cell sees (the latest start and earliest
 * end over the cell's corner attitudes, the image shrunk by the envelope's margin), `lengths` (6 numbers) the
 * longest the interval gets over the cell (the image grown by the margin). Photo s, cell c starts at
 * (s · cells + c) · 12 and · 6. NaN where any attitude's ray missed the ground.
 */
export interface GuaranteedExtents {
  cells: number;
  inner: Float64Array;
  lengths: Float64Array;
  /** Pixels the edges were moved in (and out) so the lattice of tested attitudes stands for the whole box. */
  marginPx: number;
  /** Tested attitudes per photo. */
  attitudeCount: number;
}

/** Crab angle of a line in the envelope's wind (0 for an aircraft that holds its heading, or without wind). */
export function lineCrabDeg(headingDeg: number, env: AttitudeEnvelope): number {
  return env.crabs ? crabAngleDeg(headingDeg, env.windMps, env.windFromDeg, env.airspeedMps) : 0;
}

/**
 * The guaranteed extents of one line's photos. Each photo may take any attitude of the envelope's box (yaw
 * between the planned heading and the crabbed one, pitch and roll within their limits), independently of its
 * neighbours. The box is tested on the lattice of `envelopeSamples`, with its margin: a ground point inside the
 * image shrunk by the margin at every corner of a lattice cell is inside the image at every attitude of that
 * cell (the piecewise interpolation bound stated there holds cell by cell), so `inner` is ground the photo
 * holds whatever its attitude within the cell; the lengths use the image grown by the same margin. Taking the
 * least overlap over pairs of cells, rather than the held ground and the longest footprint over the whole box,
 * keeps the bound close: within one cell the attitude that shortens the shared ground and the one that
 * lengthens the footprint are never far apart. The planned attitude's extents join every cell, so the
 * guaranteed figure never exceeds the planned one.
 */
export function guaranteedExtents(camera: Camera, heightAt: HeightAt, line: LinePhotos, layoutHeadingDeg: number, planned: Float64Array, env: AttitudeEnvelope): GuaranteedExtents {
  const n = line.x.length;
  // the lattice's rotations depend on the attitude only, the same for every photo of the line
  const samples = envelopeSamples(camera, { xM: 0, yM: 0, altitudeM: 0, yawDeg: line.headingDeg }, env, lineCrabDeg(line.headingDeg, env));
  const [ny, np, nr] = samples.shape;
  const m = samples.marginPx;
  const shrunk: Float64Array[] = [], grown: Float64Array[] = [];
  for (let a = 0; a < samples.count; a++) {
    const rot = samples.rotations.subarray(a * 9, a * 9 + 9);
    shrunk.push(photoExtents(camera, heightAt, line, layoutHeadingDeg, { rot, insetPx: m }));
    grown.push(m > 0 ? photoExtents(camera, heightAt, line, layoutHeadingDeg, { rot, insetPx: -m }) : shrunk[a]);
  }
  // cells: neighbouring lattice indices along each axis (a single index where the axis has one value)
  const spans = (k: number) => (k === 1 ? [[0, 0]] : Array.from({ length: k - 1 }, (_, i) => [i, i + 1]));
  const cellCorners: number[][] = [];
  for (const [y0, y1] of spans(ny)) for (const [p0, p1] of spans(np)) for (const [r0, r1] of spans(nr)) {
    const corners = new Set<number>();
    for (const y of [y0, y1]) for (const p of [p0, p1]) for (const r of [r0, r1]) corners.add((y * np + p) * nr + r);
    cellCorners.push([...corners]);
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
