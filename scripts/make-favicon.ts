/** Draws the Loftline mark (a flight line lofted over two hills, on a rounded tile) as assets/favicon.png and assets/brand-mark.png. */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { PNG } from 'pngjs';
import { colors } from '../components/theme/tokens';

/** Supersampling per axis: 4 x 4 samples per pixel give smooth edges without a drawing library. */
const samples = 4;

function rgb(hex: string): [number, number, number] {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!m) throw new Error(`make-favicon: expected a #rrggbb colour, got ${hex}`);
  return [parseInt(m[1]!, 16), parseInt(m[2]!, 16), parseInt(m[3]!, 16)];
}

/** Inside a rounded rectangle (x0,y0)-(x1,y1) with corner radius r. */
function inRoundedRect(x: number, y: number, x0: number, y0: number, x1: number, y1: number, r: number): boolean {
  if (x < x0 || x > x1 || y < y0 || y > y1) return false;
  const cx = Math.min(Math.max(x, x0 + r), x1 - r);
  const cy = Math.min(Math.max(y, y0 + r), y1 - r);
  return (x - cx) ** 2 + (y - cy) ** 2 <= r * r;
}

/** Ground profile in tile units (0 = top, 1 = bottom): two rounded hills, the right one higher. */
function groundY(x: number): number {
  const hill = (centre: number, width: number) => Math.exp(-(((x - centre) / width) ** 2));
  return 0.84 - 0.2 * hill(0.28, 0.16) - 0.3 * hill(0.7, 0.17);
}

/** The flight line lofted a constant height above the ground, as a polyline for distance tests. */
const loftM = 0.2;
const lineHalfWidth = 0.045;
const linePoints: Array<[number, number]> = Array.from({ length: 161 }, (_, i) => {
  const x = 0.12 + (0.76 * i) / 160;
  return [x, groundY(x) - loftM];
});

function distanceToLine(x: number, y: number): number {
  let best = Infinity;
  for (let i = 1; i < linePoints.length; i++) {
    const [ax, ay] = linePoints[i - 1]!;
    const [bx, by] = linePoints[i]!;
    const dx = bx - ax;
    const dy = by - ay;
    const t = Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy)));
    best = Math.min(best, Math.hypot(x - (ax + t * dx), y - (ay + t * dy)));
  }
  return best;
}

type Paint = 'none' | 'tile' | 'ground' | 'line';

function paintAt(x: number, y: number, size: number): Paint {
  if (!inRoundedRect(x, y, 0, 0, size, size, size * 0.22)) return 'none';
  const u = x / size;
  const v = y / size;
  if (distanceToLine(u, v) <= lineHalfWidth) return 'line';
  if (v >= groundY(u)) return 'ground';
  return 'tile';
}

/** Renders the mark, `size` px square, into a PNG buffer. */
function drawMark(size: number): Buffer {
  const png = new PNG({ width: size, height: size });
  const fills: Record<Exclude<Paint, 'none'>, [number, number, number]> = {
    tile: rgb(colors.primary),
    ground: rgb(colors.primarySoft),
    line: rgb(colors.inkInverse),
  };
  const n = samples * samples;
  for (let py = 0; py < size; py++) {
    for (let px = 0; px < size; px++) {
      const sum = [0, 0, 0];
      let hits = 0;
      for (let sy = 0; sy < samples; sy++) {
        for (let sx = 0; sx < samples; sx++) {
          const paint = paintAt(px + (sx + 0.5) / samples, py + (sy + 0.5) / samples, size);
          if (paint === 'none') continue;
          hits++;
          const c = fills[paint];
          sum[0] += c[0];
          sum[1] += c[1];
          sum[2] += c[2];
        }
      }
      const i = (py * size + px) * 4;
      for (let ch = 0; ch < 3; ch++) png.data[i + ch] = hits ? Math.round(sum[ch]! / hits) : 0;
      png.data[i + 3] = Math.round((hits / n) * 255);
    }
  }
  return PNG.sync.write(png);
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const assets = path.join(path.dirname(fileURLToPath(import.meta.url)), '..', 'assets');
  for (const [name, size] of [['favicon.png', 64], ['brand-mark.png', 128]] as const) {
    fs.writeFileSync(path.join(assets, name), drawMark(size));
    console.log(`wrote assets/${name} (${size} px)`);
  }
}
