/** Line positions with spacing that varies line by line: each next line as far as the highest ground between it and the last one lets the side overlap floor hold under the envelope's roll. */
import { evaluate } from './solve-profile';
import { fitAtBestSpeed, layRow, type FittedLine, type LineContext } from './solve-line';

const DEG = Math.PI / 180;

/** One row of the layout (one cross-track offset; several pieces where a concave area is crossed twice). */
export interface LayoutRow {
  offsetM: number;
  pieces: FittedLine[];
  /** Distance to the next row and what set it (null for the last row). */
  next: SpacingReason | null;
}

/** Why two neighbouring rows are as far apart as they are. */
interface SpacingReason {
  spacingM: number;
  /** Highest ground between the rows where the bound is tightest, metres above the grid's datum, and its local position. */
  groundM: number;
  atX: number;
  atY: number;
  /** Guaranteed half-footprints of both rows there, metres. */
  halfLeftM: number;
  halfRightM: number;
  /** The bound held (false: the layout could not place the row within it after its tries). */
  held: boolean;
}

/** Rotated-frame helpers for a layout heading: a along it, c to its right. */
export function rotated(headingDeg: number) {
  const s = Math.sin(headingDeg * DEG), c = Math.cos(headingDeg * DEG);
  return {
    a: (x: number, y: number) => x * s + y * c,
    c: (x: number, y: number) => x * c - y * s,
    toLocal: (a: number, cc: number): [number, number] => [a * s + cc * c, a * c - cc * s],
  };
}

/** Altitude of a row at along-position `a` (NaN where no piece of it flies). */
function rowAltitude(row: FittedLine[], a: number, rot: ReturnType<typeof rotated>): number {
  for (const p of row) {
    const a0 = rot.a(p.line.start[0], p.line.start[1]);
    const d = a - a0;
    if (d >= 0 && d <= p.line.lengthM) return evaluate(p.x, p.fit.altitudeM, d);
  }
  return NaN;
}

function rowSpan(row: FittedLine[], rot: ReturnType<typeof rotated>): [number, number] {
  let lo = Infinity, hi = -Infinity;
  for (const p of row) {
    const a0 = rot.a(p.line.start[0], p.line.start[1]);
    lo = Math.min(lo, a0 + p.line.areaStartM); hi = Math.max(hi, a0 + p.line.areaEndM);
  }
  return [lo, hi];
}

/**
 * The smallest guaranteed half-footprint reach between cross-track positions c0 and c1 along the rows: at each
 * along-position, the highest ground across [c0, c1] and each row's height above it.
 */
function pairBound(ctx: LineContext, rowP: FittedLine[] | null, cP: number, rowQ: FittedLine[] | null, cQ: number, side: number): { bound: number; g: number; a: number; wP: number; wQ: number } {
  const rot = rotated(ctx.headingDeg);
  const spans = [rowP, rowQ].filter((r): r is FittedLine[] => r !== null && r.length > 0).map((r) => rowSpan(r, rot));
  if (spans.length === 0) return { bound: Infinity, g: NaN, a: 0, wP: 0, wQ: 0 };
  const aLo = Math.min(...spans.map((s) => s[0])), aHi = Math.max(...spans.map((s) => s[1]));
  const stepA = Math.max(2, ctx.stepM * 2);
  const na = Math.max(2, Math.ceil((aHi - aLo) / stepA) + 1);
  const width = Math.abs(cQ - cP);
  const nc = Math.max(2, Math.ceil(width / Math.max(2, ctx.stepM)) + 1);
  const xs = new Float64Array(na * nc), ys = new Float64Array(na * nc), h = new Float64Array(na * nc);
  for (let i = 0; i < na; i++) {
    const a = aLo + ((aHi - aLo) * i) / (na - 1);
    for (let j = 0; j < nc; j++) {
      const [x, y] = rot.toLocal(a, cP + ((cQ - cP) * j) / (nc - 1));
      xs[i * nc + j] = x; ys[i * nc + j] = y;
    }
  }
  ctx.heights.sampleMany(xs, ys, h);
  const t = ctx.geometry.tanAcross;
  let best = { bound: Infinity, g: NaN, a: aLo, wP: 0, wQ: 0 };
  for (let i = 0; i < na; i++) {
    const a = aLo + ((aHi - aLo) * i) / (na - 1);
    let g = -Infinity;
    for (let j = 0; j < nc; j++) { const v = h[i * nc + j]; if (v === v && v > g) g = v; }
    if (!Number.isFinite(g)) continue;
    const zP = rowP ? rowAltitude(rowP, a, rot) : NaN, zQ = rowQ ? rowAltitude(rowQ, a, rot) : NaN;
    let bound: number, wP = 0, wQ = 0;
    if (rowP && rowQ) {
      if (!(zP === zP && zQ === zQ)) continue;
      wP = Math.max(0, (zP - g) * t); wQ = Math.max(0, (zQ - g) * t);
      // the strips overlap by wP + wQ − S; the floor asks that share of the narrower strip
      bound = wP + wQ - 2 * side * Math.min(wP, wQ);
    } else {
      const z = rowP ? zP : zQ;
      if (!(z === z)) continue;
      wP = Math.max(0, (z - g) * t);
      bound = wP;
    }
    if (bound < best.bound) best = { bound, g, a, wP, wQ };
  }
  return best;
}

/** Lay the rows across the area from its cross-track start to its end, each spacing set by `pairBound`. */
export function layoutRows(ctx: LineContext, heightFactorAt: (cM: number) => number, sideFloor: number): LayoutRow[] {
  const rot = rotated(ctx.headingDeg);
  let cMin = Infinity, cMax = -Infinity;
  for (const [x, y] of ctx.area[0]) { const c = rot.c(x, y); cMin = Math.min(cMin, c); cMax = Math.max(cMax, c); }
  const nominalHalf = ctx.geometry.specHeightM * heightFactorAt((cMin + cMax) / 2) * ctx.geometry.tanAcross;
  const nominalS = Math.max(1, 2 * nominalHalf * (1 - sideFloor));
  const trig = Math.max(5, nominalHalf);
  const fitRow = (c: number, below: number, above: number) => layRow(ctx, c, below, above, trig).map((l) => fitAtBestSpeed(ctx, l, heightFactorAt(c), { belowM: below, aboveM: above }));
  // first row: its own guaranteed reach must get to the area's edge
  let c0 = Math.min(cMin + 0.9 * nominalHalf, (cMin + cMax) / 2);
  let row0 = fitRow(c0, Math.max(1, c0 - cMin), nominalS / 2);
  for (let k = 0; k < 5; k++) {
    const b = pairBound(ctx, null, cMin, row0, c0, sideFloor).bound;
    if (!Number.isFinite(b) || c0 - cMin <= b + 1e-6) break;
    c0 = cMin + Math.max(0.5, 0.97 * b);
    row0 = fitRow(c0, Math.max(1, c0 - cMin), nominalS / 2);
  }
  const rows: LayoutRow[] = [{ offsetM: c0, pieces: row0, next: null }];
  let lastS = nominalS;
  for (let guard = 0; guard < 5000; guard++) {
    const prev = rows[rows.length - 1];
    const reach = pairBound(ctx, prev.pieces, prev.offsetM, null, cMax, sideFloor).bound;
    if (prev.offsetM + reach >= cMax - 1e-6 || prev.offsetM >= cMax) break;
    // start from the last spacing; when it holds with room, grow to the bound and bisect back if the grown place fails
    let S = lastS;
    let accepted: { row: FittedLine[]; S: number; r: ReturnType<typeof pairBound>; held: boolean } | null = null;
    let failedS = Infinity;
    for (let k = 0; k < 8; k++) {
      const c1 = prev.offsetM + S;
      const row = fitRow(c1, S / 2, nominalS / 2);
      const r = pairBound(ctx, prev.pieces, prev.offsetM, row.length ? row : null, c1, sideFloor);
      if (S <= r.bound + 1e-6) {
        accepted = { row, S, r, held: true };
        const next = Number.isFinite(failedS) ? (S + failedS) / 2 : Math.min(0.97 * r.bound, 3 * nominalS);
        if (!Number.isFinite(r.bound) || next < 1.04 * S) break;
        S = next;
        continue;
      }
      failedS = Math.min(failedS, S);
      if (accepted) {
        const mid = (accepted.S + failedS) / 2;
        if (mid < 1.04 * accepted.S) break;
        S = mid;
        continue;
      }
      S = Math.max(0.1 * nominalS, 0.97 * r.bound);
      if (k === 7) accepted = { row, S, r, held: false };
    }
    if (!accepted) break;
    const c1 = prev.offsetM + accepted.S;
    const [ax, ay] = rot.toLocal(accepted.r.a, prev.offsetM + accepted.S / 2);
    prev.next = { spacingM: accepted.S, groundM: accepted.r.g, atX: ax, atY: ay, halfLeftM: accepted.r.wP, halfRightM: accepted.r.wQ, held: accepted.held };
    rows.push({ offsetM: c1, pieces: accepted.row, next: null });
    lastS = accepted.S;
  }
  return rows;
}
