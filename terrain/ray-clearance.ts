/**
 * Proving viewing rays clear of the terrain without marching them, for all rays from one tile of cells to one
 * camera at once. Such a ray leaves its cell towards the camera, so at a distance s along the ground it lies in the
 * tile's box moved by s·u for some direction u from the tile to the camera. Cut s into bins [S_k, S_k+1) (S_k = k·W):
 * the highest lattice node H_k of the blocks holding bin k's box (`latticeMax`) bounds the bilinear ground under every sample the march takes in that
 * bin (`occludedRay`), and a ray from height pz rising at ρ is at least pz + ρ·S_k there. Where
 * pz + ρ·S_k ≥ H_k − tolerance for every bin from k on, no sample from S_k on can hide the point; the march need only
 * look before S_k, and not at all when k = 0, or when the ray leaves the surface at its cell and rises faster than
 * the steepest ground of the bins before k (`slopeIn`, the argument of `blockSlope`).
 */
import type { HeightLattice } from './occlusion';
import { slopeIn } from './occlusion';
import { latticeMax, type MaxRuns } from './lattice-range';

/** Most bins per tile and camera. */
const CLEAR_BINS = 24;
/**
 * Numbers per profile: bin count K, bin width W, the first bin K0 from which every ray of the tile is proven clear
 * (from the tile's lowest ground and the slowest rise of its rays), then the highest ground of each bin (CLEAR_BINS
 * slots), then the steepest ground of bins 0..k−1 for k = 0..CLEAR_BINS (CLEAR_BINS + 1 slots); of both, only
 * the slots of the bins before K0 are written (the rays' own tests read no other).
 */
export const CLEARANCE_STRIDE = 3 + 2 * CLEAR_BINS + 1;
/** Offset of the highest-ground slots and of the steepest-ground slots in a profile. */
export const HIGHEST_AT = 3, STEEPEST_AT = 3 + CLEAR_BINS;

/** Range of cos and sin over the angles [lo, hi] (hi − lo < 2π). */
function angleRange(lo: number, hi: number): [number, number, number, number] {
  const has = (a: number) => Math.ceil((lo - a) / (2 * Math.PI)) * 2 * Math.PI + a <= hi;
  let c0 = Math.min(Math.cos(lo), Math.cos(hi)), c1 = Math.max(Math.cos(lo), Math.cos(hi));
  let s0 = Math.min(Math.sin(lo), Math.sin(hi)), s1 = Math.max(Math.sin(lo), Math.sin(hi));
  if (has(0)) c1 = 1;
  if (has(Math.PI)) c0 = -1;
  if (has(Math.PI / 2)) s1 = 1;
  if (has(-Math.PI / 2)) s0 = -1;
  // a hair wider than the rounding of cos and sin
  return [Math.max(-1, c0 - 1e-12), Math.min(1, c1 + 1e-12), Math.max(-1, s0 - 1e-12), Math.min(1, s1 + 1e-12)];
}

/**
 * The profile of the rays from a tile (x0, y0, x1, y1 of its cells' horizontal positions, their lowest and highest
 * ground: `tb` from `t`) to a camera at (ox, oy, oz), written into `out` from `at` (CLEARANCE_STRIDE numbers). Bins
 * are `minBinM` wide, or wider where the camera is farther than CLEAR_BINS of them from the tile's far corner.
 */
export function clearanceProfile(L: HeightLattice, M: MaxRuns, tb: Float64Array, t: number, ox: number, oy: number, oz: number, toleranceM: number, minBinM: number, out: Float64Array, at: number, topM = Infinity): void {
  const x0 = tb[t], y0 = tb[t + 1], x1 = tb[t + 2], y1 = tb[t + 3], zLow = tb[t + 4], zHigh = tb[t + 5];
  // the directions u = (o − p)/|o − p| from points p of the box: from outside it, an angle range ending at corners
  let ux0 = -1, ux1 = 1, uy0 = -1, uy1 = 1;
  const pad = 1e-6;
  if (ox < x0 - pad || ox > x1 + pad || oy < y0 - pad || oy > y1 + pad) {
    const mid = Math.atan2(oy - (y0 + y1) / 2, ox - (x0 + x1) / 2);
    let lo = Infinity, hi = -Infinity;
    for (let k = 0; k < 4; k++) {
      let d = Math.atan2(oy - (k & 2 ? y1 : y0), ox - (k & 1 ? x1 : x0)) - mid;
      if (d > Math.PI) d -= 2 * Math.PI; else if (d < -Math.PI) d += 2 * Math.PI;
      if (d < lo) lo = d; if (d > hi) hi = d;
    }
    [ux0, ux1, uy0, uy1] = angleRange(mid + lo, mid + hi);
  }
  // the farthest any cell of the box is from the camera (a corner)
  let dmax = 0;
  for (let k = 0; k < 4; k++) dmax = Math.max(dmax, Math.hypot(ox - (k & 1 ? x1 : x0), oy - (k & 2 ? y1 : y0)));
  let W = minBinM;
  if (dmax > CLEAR_BINS * W) W = (dmax / CLEAR_BINS) * (1 + 1e-9);
  const K = Math.max(1, Math.min(CLEAR_BINS, Math.ceil(dmax / W)));
  out[at] = K;
  out[at + 1] = W;
  // every ray of the tile starts at or above zLow and rises at least (oz − zHigh) / dmax: the bins it clears from
  // the last down are cleared by each ray, whose own test can start there. Where the caller knows the highest
  // ground around every ray that counts (`topM`: a photo's box holds its views' ground points and its camera), the
  // bins from the first the slowest ray clears that height on need no box of their own: only those before are
  // worked out (their heights are the only ones the rays' own tests read)
  const rise = (oz - zHigh) / dmax, lift = zLow + toleranceM - 1e-6;
  let kTop = K;
  if (rise > 0 && topM < Infinity) {
    kTop = Math.min(K, Math.max(0, Math.ceil((topM - lift) / (W * rise))));
    // the division's rounding settled by the test the descent itself makes
    while (kTop > 0 && lift + (kTop - 1) * W * rise >= topM) kTop--;
    while (kTop < K && !(lift + kTop * W * rise >= topM)) kTop++;
  }
  // each bin's box: the tile's box moved by s·u for s in the bin and u in the ranges (extremes at the ends of both),
  // within the box of the tile and the camera (the rays lie in it); the boxes of the bins before k for the slopes
  const hx0 = Math.min(x0, ox), hx1 = Math.max(x1, ox), hy0 = Math.min(y0, oy), hy1 = Math.max(y1, oy);
  let bx0 = Infinity, by0 = Infinity, bx1 = -Infinity, by1 = -Infinity;
  const box: [number, number, number, number] = [0, 0, 0, 0];
  out[at + STEEPEST_AT] = 0;
  for (let k = 0; k < kTop; k++) {
    const sa = k * W, sb = (k + 1) * W;
    box[0] = Math.max(hx0, x0 + Math.min(sa * ux0, sb * ux0));
    box[2] = Math.min(hx1, x1 + Math.max(sa * ux1, sb * ux1));
    box[1] = Math.max(hy0, y0 + Math.min(sa * uy0, sb * uy0));
    box[3] = Math.min(hy1, y1 + Math.max(sa * uy1, sb * uy1));
    out[at + HIGHEST_AT + k] = latticeMax(L, M, box);
    if (box[0] < bx0) bx0 = box[0]; if (box[1] < by0) by0 = box[1]; if (box[2] > bx1) bx1 = box[2]; if (box[3] > by1) by1 = box[3];
    box[0] = bx0; box[1] = by0; box[2] = bx1; box[3] = by1;
    out[at + STEEPEST_AT + k + 1] = slopeIn(L, box);
  }
  let k0 = kTop;
  if (rise > 0) while (k0 > 0 && lift + (k0 - 1) * W * rise >= out[at + HIGHEST_AT + k0 - 1]) k0--;
  out[at + 2] = k0;
}
