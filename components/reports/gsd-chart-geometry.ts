/** Pixel geometry of the GSD-along-a-line chart: scales, the line split at unknown stations, the target band, ticks. */
import { niceStep } from '../../contracts/format/ticks';

export type GsdPoint = { distanceM: number; gsdCm: number | null };

export type ChartBox = { widthPx: number; heightPx: number; padLeftPx: number; padRightPx: number; padTopPx: number; padBottomPx: number };

type GsdChartGeometry = {
  /** SVG path data, one "M…L…" run per stretch of known stations (an unknown station breaks the line). */
  path: string;
  /** Lone known stations between two unknown ones, drawn as dots since a path of one point is invisible. */
  dots: Array<{ x: number; y: number }>;
  /** The target band [min, max] as a rectangle, clipped to the plot. */
  band: { x: number; y: number; width: number; height: number } | null;
  /** The target GSD as a horizontal line. */
  targetY: number | null;
  xTicks: Array<{ x: number; label: string }>;
  yTicks: Array<{ y: number; label: string }>;
  /** Stretches with no known GSD, as x ranges, so the chart can say where the grid had no ground. */
  gaps: Array<{ x0: number; x1: number }>;
  domainCm: [number, number];
};

function ticks(lo: number, hi: number, count: number): number[] {
  const step = niceStep(hi - lo, count);
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) out.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  return out;
}

const decimalsFor = (step: number) => Math.max(0, Math.min(3, -Math.floor(Math.log10(step) + 1e-9)));

/**
 * Lays out `points` in `box`. The vertical domain always holds the band and the data with 10 % room, so a line that
 * stays inside the band is visibly inside it; distances run from 0 to the last station.
 */
export function gsdChartGeometry(points: readonly GsdPoint[], bandCm: readonly [number, number], targetCm: number, box: ChartBox): GsdChartGeometry {
  const plotW = Math.max(1, box.widthPx - box.padLeftPx - box.padRightPx);
  const plotH = Math.max(1, box.heightPx - box.padTopPx - box.padBottomPx);
  const known = points.filter((p): p is { distanceM: number; gsdCm: number } => p.gsdCm !== null && Number.isFinite(p.gsdCm));
  const values = [...known.map((p) => p.gsdCm), bandCm[0], bandCm[1], targetCm].filter(Number.isFinite);
  let lo = Math.min(...values);
  let hi = Math.max(...values);
  if (!(hi > lo)) {
    lo -= 0.5;
    hi += 0.5;
  }
  const room = (hi - lo) * 0.1;
  lo = Math.max(0, lo - room);
  hi += room;
  const maxD = points.length ? Math.max(...points.map((p) => p.distanceM)) : 0;
  const dSpan = maxD > 0 ? maxD : 1;
  const x = (d: number) => box.padLeftPx + (d / dSpan) * plotW;
  const y = (g: number) => box.padTopPx + (1 - (g - lo) / (hi - lo)) * plotH;

  const runs: Array<Array<{ x: number; y: number }>> = [];
  const gaps: Array<{ x0: number; x1: number }> = [];
  let run: Array<{ x: number; y: number }> = [];
  let gapStart: number | null = null;
  for (const p of points) {
    if (p.gsdCm === null || !Number.isFinite(p.gsdCm)) {
      if (run.length) runs.push(run);
      run = [];
      if (gapStart === null) gapStart = x(p.distanceM);
      continue;
    }
    if (gapStart !== null) {
      gaps.push({ x0: gapStart, x1: x(p.distanceM) });
      gapStart = null;
    }
    run.push({ x: x(p.distanceM), y: y(p.gsdCm) });
  }
  if (run.length) runs.push(run);
  if (gapStart !== null) gaps.push({ x0: gapStart, x1: x(maxD) });

  const r = (v: number) => Math.round(v * 10) / 10;
  const path = runs
    .filter((seg) => seg.length > 1)
    .map((seg) => seg.map((pt, i) => `${i === 0 ? 'M' : 'L'}${r(pt.x)},${r(pt.y)}`).join(''))
    .join('');
  const dots = runs.filter((seg) => seg.length === 1).map((seg) => seg[0]!);

  const bandTop = y(Math.min(hi, bandCm[1]));
  const bandBottom = y(Math.max(lo, bandCm[0]));
  const band = Number.isFinite(bandTop) && bandBottom > bandTop ? { x: box.padLeftPx, y: bandTop, width: plotW, height: bandBottom - bandTop } : null;

  const yStep = niceStep(hi - lo, 4);
  const xStep = niceStep(dSpan, 6);
  return {
    path,
    dots,
    band,
    targetY: Number.isFinite(targetCm) ? y(targetCm) : null,
    xTicks: ticks(0, dSpan, 6).map((d) => ({ x: x(d), label: `${d.toFixed(decimalsFor(xStep))}` })),
    yTicks: ticks(lo, hi, 4).map((g) => ({ y: y(g), label: g.toFixed(decimalsFor(yStep)) })),
    gaps,
    domainCm: [lo, hi],
  };
}
