/** What a map canvas draws over the hillshade: outlines, lines and station markers, in image pixels. */
import type { MarkerShape } from '../results/station-status';

export type PxPoint = [number, number];

/** Follows a press on the map that grabbed something (a corner, the takeoff point): each move, in image pixels. */
export type DragMove = (xPx: number, yPx: number) => void;

export type MapShape =
  | { kind: 'polygon'; id: string; points: PxPoint[]; closed: boolean; stroke: string; fill?: string; fillOpacity?: number; dashed?: boolean; widthPx?: number }
  | { kind: 'polyline'; id: string; points: PxPoint[]; stroke: string; dashed?: boolean; widthPx?: number }
  | { kind: 'marker'; id: string; at: PxPoint; shape: MarkerShape; fill: string; stroke: string; sizePx?: number; label?: string; opacity?: number };

/** SVG path of a marker shape of `r` (half the size) centred on (x, y); the cross is drawn as a stroked path. */
/**
 * An image laid over the map at `rect` ([x, y, width, height] in map image pixels): `image` draws it as it is
 * (pixels kept square when enlarged), `hatch` uses it as a mask (white shows) for a hatch pattern.
 */
export type MapImageLayer = { kind: 'image' | 'hatch'; href: string; rect: readonly [number, number, number, number]; opacity?: number; testID?: string };

export function markerPath(shape: MarkerShape, x: number, y: number, r: number): string {
  switch (shape) {
    case 'circle':
      return `M ${x - r} ${y} a ${r} ${r} 0 1 0 ${2 * r} 0 a ${r} ${r} 0 1 0 ${-2 * r} 0 Z`;
    case 'square': {
      const s = r * 0.85;
      return `M ${x - s} ${y - s} H ${x + s} V ${y + s} H ${x - s} Z`;
    }
    case 'triangle':
      return `M ${x} ${y - r} L ${x + r * 0.95} ${y + r * 0.75} L ${x - r * 0.95} ${y + r * 0.75} Z`;
    case 'diamond':
      return `M ${x} ${y - r} L ${x + r} ${y} L ${x} ${y + r} L ${x - r} ${y} Z`;
    case 'cross':
      return `M ${x - r} ${y - r} L ${x + r} ${y + r} M ${x - r} ${y + r} L ${x + r} ${y - r}`;
  }
}
