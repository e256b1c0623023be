/**
 * A north-up sketch of the sheet's lines and the takeoff point, drawn from the sheet's own coordinates so it works
 * with no network (no hillshade, no tiles): positions in a local tangent plane at the area's mean latitude, using
 * WGS 84's radii of curvature there (ground-aspect.ts), scaled to fit the box with its true shape.
 */
import { metresPerRadian } from '../map/ground-aspect';
import { scaleBar, type ScaleBar } from '../map/scale-bar';

type LonLat = { lon: number; lat: number };
const RAD = Math.PI / 180;

interface SketchLine {
  number: number;
  x1: number;
  y1: number;
  x2: number;
  y2: number;
}

interface LinesSketch {
  widthPx: number;
  heightPx: number;
  lines: SketchLine[];
  takeoff: { x: number; y: number };
  /** Ground metres per drawn pixel (the same across and down: the sketch keeps the ground's shape). */
  metresPerPx: number;
  scale: ScaleBar;
}

/** Fits `lines` and `takeoff` into a `widthPx` × `heightPx` box with `marginPx` of room on every side. */
export function linesSketch(
  lines: readonly { number: number; start: LonLat; end: LonLat }[],
  takeoff: LonLat,
  box: { widthPx: number; heightPx: number; marginPx: number },
): LinesSketch {
  const points = [takeoff, ...lines.flatMap((l) => [l.start, l.end])];
  const lat0 = points.reduce((s, p) => s + p.lat, 0) / points.length;
  const lon0 = points.reduce((s, p) => s + p.lon, 0) / points.length;
  const r = metresPerRadian(lat0);
  const local = (p: LonLat) => ({ e: (p.lon - lon0) * RAD * r.eastM, n: (p.lat - lat0) * RAD * r.northM });
  const all = points.map(local);
  const minE = Math.min(...all.map((p) => p.e));
  const maxE = Math.max(...all.map((p) => p.e));
  const minN = Math.min(...all.map((p) => p.n));
  const maxN = Math.max(...all.map((p) => p.n));
  const roomW = Math.max(1, box.widthPx - 2 * box.marginPx);
  const roomH = Math.max(1, box.heightPx - 2 * box.marginPx);
  // A single point (or a degenerate extent) still gets a sensible scale: 1 m per pixel.
  const metresPerPx = Math.max((maxE - minE) / roomW, (maxN - minN) / roomH) || 1;
  const cx = (minE + maxE) / 2;
  const cn = (minN + maxN) / 2;
  const toPx = (p: LonLat) => {
    const q = local(p);
    return { x: box.widthPx / 2 + (q.e - cx) / metresPerPx, y: box.heightPx / 2 - (q.n - cn) / metresPerPx };
  };
  return {
    widthPx: box.widthPx,
    heightPx: box.heightPx,
    lines: lines.map((l) => {
      const a = toPx(l.start);
      const b = toPx(l.end);
      return { number: l.number, x1: a.x, y1: a.y, x2: b.x, y2: b.y };
    }),
    takeoff: toPx(takeoff),
    metresPerPx,
    scale: scaleBar(metresPerPx, Math.max(20, box.widthPx / 3)),
  };
}
