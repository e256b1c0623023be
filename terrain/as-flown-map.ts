/**
 * The as-flown map for screens and paper: each cell of the survey area in one of three classes (meets the spec as
 * flown; short as flown and as planned too; lost in flight: met as planned, short as flown), with the same-day
 * re-flight stretches drawn over it. Colours from the Okabe–Ito palette for colour-vision deficiencies (Okabe &
 * Ito, "Color Universal Design", 2008, from memory); lost cells also carry dark diagonal stripes so the map reads
 * in black and white. North up, white outside the area.
 */
import type { AsFlown } from './as-flown';
import { cellMeetsSpec, type CoverageSpec } from './coverage-spec';
import { encode } from './coverage-layer';
import type { GeoTransform } from './grid';

/** Longest side of the map image, pixels (a printed page width at about 150 dpi; a phone scales it down). */
const MAP_PX = 1100;

export const AS_FLOWN_MAP_LEGEND = [
  { key: 'meets', colour: '#cfe3d6', name: 'pale green', words: 'meets the whole spec as flown' },
  { key: 'short-both', colour: '#9a9a9a', name: 'grey', words: 'short as flown and as planned too (a re-flight of the same plan would not mend it)' },
  { key: 'lost', colour: '#e69f00', name: 'orange with dark stripes', words: 'lost in flight: met the spec as planned, short as flown' },
  { key: 'stretch', colour: '#0072b2', name: 'blue lines', words: 'same-day re-flight stretches of the plan\'s lines' },
] as const;

const rgb = (hex: string): [number, number, number] => [parseInt(hex.slice(1, 3), 16), parseInt(hex.slice(3, 5), 16), parseInt(hex.slice(5, 7), 16)];

/** A stretch to draw, as two points in the raster's CRS. */
interface MapSegment { x0: number; y0: number; x1: number; y1: number }

interface AsFlownMap {
  png: Uint8Array;
  widthPx: number;
  heightPx: number;
  /** Pixels per cell (each cell is drawn as a square of this side). */
  pxPerCell: number;
}

/** The map of an as-flown analysis under `spec`, with `segments` (in the raster's CRS, e.g. re-flight stretches) drawn on it. */
export function asFlownMap(a: AsFlown, spec: CoverageSpec, segments: readonly MapSegment[] = []): AsFlownMap {
  const { cells } = a.flown;
  const { width, height, inside, transform } = cells;
  const k = Math.max(1, Math.floor(MAP_PX / Math.max(width, height)));
  const w = width * k, h = height * k;
  const rgba = new Uint8Array(w * h * 4).fill(255);
  const [meets, shortBoth, lost, stretch] = AS_FLOWN_MAP_LEGEND.map((l) => rgb(l.colour));
  const dark: [number, number, number] = [27, 30, 33];
  for (let row = 0; row < height; row++) {
    for (let col = 0; col < width; col++) {
      const i = row * width + col;
      if (!inside[i]) continue;
      const isLost = a.difference.lost[i] === 1;
      const c = isLost ? lost : cellMeetsSpec(a.flown, spec, i) ? meets : shortBoth;
      for (let y = row * k; y < (row + 1) * k; y++) {
        for (let x = col * k; x < (col + 1) * k; x++) {
          const o = (y * w + x) * 4;
          const [r, g, b] = isLost && (x + y) % 6 < 2 ? dark : c;
          rgba[o] = r; rgba[o + 1] = g; rgba[o + 2] = b;
        }
      }
    }
  }
  drawSegments(rgba, w, h, k, transform, segments, stretch);
  return { png: encode(w, h, rgba), widthPx: w, heightPx: h, pxPerCell: k };
}

/** Lines 3 px wide from CRS coordinates to the image's pixels (the raster's geotransform, north up). */
function drawSegments(rgba: Uint8Array, w: number, h: number, k: number, t: GeoTransform, segments: readonly MapSegment[], colour: [number, number, number]): void {
  const px = (x: number) => ((x - t[0]) / t[1]) * k, py = (y: number) => ((y - t[3]) / t[5]) * k;
  for (const s of segments) {
    const ax = px(s.x0), ay = py(s.y0), bx = px(s.x1), by = py(s.y1);
    const steps = Math.ceil(Math.max(Math.abs(bx - ax), Math.abs(by - ay))) + 1;
    for (let n = 0; n <= steps; n++) {
      const cx = Math.round(ax + ((bx - ax) * n) / steps), cy = Math.round(ay + ((by - ay) * n) / steps);
      for (let dy = -1; dy <= 1; dy++) {
        for (let dx = -1; dx <= 1; dx++) {
          const x = cx + dx, y = cy + dy;
          if (x < 0 || y < 0 || x >= w || y >= h) continue;
          const o = (y * w + x) * 4;
          rgba[o] = colour[0]; rgba[o + 1] = colour[1]; rgba[o + 2] = colour[2]; rgba[o + 3] = 255;
        }
      }
    }
  }
}
