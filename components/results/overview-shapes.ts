/** The results overview as map shapes: survey area, flight lines (the chosen one emphasised), stations by status, takeoff. */
import type { ResultOverview } from '../../contracts/result-parts';
import { stationStatuses } from '../../contracts/station-status';
import type { ImageGeoref } from '../map/image-georef';
import type { MapShape, PxPoint } from '../map/map-shapes';
import { colors } from '../theme';
import { statusLooks } from './station-status';

/** Shapes in drawing order: area under lines under stations; the selected line's label on top. */
export function overviewShapes(result: ResultOverview, area: number[][][] | null, georef: ImageGeoref, selectedIndex: number | null): MapShape[] {
  const px = (lon: number, lat: number): PxPoint => georef.toPixel(lon, lat);
  const out: MapShape[] = [];
  if (area?.[0]) out.push({ kind: 'polygon', id: 'area', points: area[0].slice(0, -1).map(([lon, lat]) => px(lon, lat)), closed: true, stroke: colors.ink, fill: colors.primary, fillOpacity: 0.08, dashed: true, widthPx: 1.5 });
  for (const line of result.lines) {
    const selected = line.index === selectedIndex;
    out.push({ kind: 'polyline', id: `line-${line.index}`, points: [px(line.start.lon, line.start.lat), px(line.end.lon, line.end.lat)], stroke: selected ? colors.focus : colors.ink, widthPx: selected ? 4 : 1.2 });
  }
  // The chosen line's stations are drawn last and larger, the others a little faded, so the chosen line stands out.
  const order = [...result.lines].sort((a, b) => Number(a.index === selectedIndex) - Number(b.index === selectedIndex));
  for (const line of order) {
    const chosen = line.index === selectedIndex;
    if (chosen) out.push({ kind: 'polyline', id: `line-${line.index}-halo`, points: [px(line.start.lon, line.start.lat), px(line.end.lon, line.end.lat)], stroke: colors.focus, widthPx: 6 });
    const { lon, lat, status } = line.marks;
    for (let i = 0; i < lon.length; i++) {
      const look = statusLooks[stationStatuses[status[i]]];
      out.push({ kind: 'marker', id: `st-${line.index}-${i}`, at: px(lon[i], lat[i]), shape: look.shape, fill: look.color, stroke: colors.ink, sizePx: chosen ? 10 : 7, opacity: selectedIndex === null || chosen ? 1 : 0.55 });
    }
  }
  out.push({ kind: 'marker', id: 'takeoff', at: px(result.takeoff.lon, result.takeoff.lat), shape: 'diamond', fill: colors.ink, stroke: colors.surface, sizePx: 15, label: 'Takeoff' });
  if (selectedIndex !== null) {
    const line = result.lines.find((l) => l.index === selectedIndex);
    if (line) out.push({ kind: 'marker', id: 'selected-label', at: px(line.start.lon, line.start.lat), shape: 'circle', fill: colors.focus, stroke: colors.surface, sizePx: 9, label: `Line ${line.index + 1}` });
  }
  return out;
}

function distanceToSegment([x, y]: PxPoint, [x0, y0]: PxPoint, [x1, y1]: PxPoint): number {
  const dx = x1 - x0;
  const dy = y1 - y0;
  const len2 = dx * dx + dy * dy;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((x - x0) * dx + (y - y0) * dy) / len2));
  return Math.hypot(x - (x0 + t * dx), y - (y0 + t * dy));
}

/** The line nearest to an image point, if one lies within `maxPx` image pixels; else null. */
export function nearestLine(result: ResultOverview, georef: ImageGeoref, at: PxPoint, maxPx: number): number | null {
  let best: number | null = null;
  let bestD = maxPx;
  for (const line of result.lines) {
    const d = distanceToSegment(at, georef.toPixel(line.start.lon, line.start.lat), georef.toPixel(line.end.lon, line.end.lat));
    if (d <= bestD) {
      bestD = d;
      best = line.index;
    }
  }
  return best;
}

/** The part of the image the overview shows: the area, lines and takeoff with a margin, kept on the image. */
export function overviewView(result: ResultOverview, area: number[][][] | null, georef: ImageGeoref, marginShare = 0.12): [number, number, number, number] {
  const pts: PxPoint[] = [georef.toPixel(result.takeoff.lon, result.takeoff.lat)];
  for (const l of result.lines) pts.push(georef.toPixel(l.start.lon, l.start.lat), georef.toPixel(l.end.lon, l.end.lat));
  for (const [lon, lat] of area?.[0] ?? []) pts.push(georef.toPixel(lon, lat));
  let x0 = Math.min(...pts.map((p) => p[0]));
  let x1 = Math.max(...pts.map((p) => p[0]));
  let y0 = Math.min(...pts.map((p) => p[1]));
  let y1 = Math.max(...pts.map((p) => p[1]));
  const m = Math.max(x1 - x0, y1 - y0) * marginShare + 10;
  x0 = Math.max(0, x0 - m);
  y0 = Math.max(0, y0 - m);
  x1 = Math.min(georef.widthPx, x1 + m);
  y1 = Math.min(georef.heightPx, y1 + m);
  return [x0, y0, x1, y1];
}
