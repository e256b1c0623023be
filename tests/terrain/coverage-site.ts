/** Synthetic sites for the coverage tests: a UTM 31N grid whose heights follow a function of the local frame, and a square area. */
import { createGrid, type Grid } from '../../terrain/grid';
import { utmCrs } from '../../terrain/crs';
import { localFrameFor, type LocalFrame } from '../../terrain/local-frame';
import type { AreaPolygon } from '../../terrain/mission';

export interface Site {
  grid: Grid;
  frame: LocalFrame;
  /** Local frame -> grid CRS (UTM 31N). */
  toGrid(x: number, y: number): [number, number];
  /** Square area [x0, x1] x [y0, y1] of the local frame as a WGS 84 polygon. */
  area(x0: number, y0: number, x1: number, y1: number): AreaPolygon;
}

/**
 * A grid of `pixelM` pixels (UTM metres) covering ±halfM of local frame around lon 4.48, lat 46.77, heights
 * `h(x, y)` at each pixel centre's local position. The grid's origin is snapped to whole metres.
 */
export function syntheticSite(halfM: number, pixelM: number, h: (x: number, y: number) => number): Site {
  const frame = localFrameFor(4.48, 46.77);
  const k = frame.scale;
  const e0 = Math.floor(frame.originE - halfM * k), n0 = Math.ceil(frame.originN + halfM * k);
  const size = Math.ceil((2 * halfM * k) / pixelM);
  const data = new Float32Array(size * size);
  for (let r = 0; r < size; r++) {
    for (let c = 0; c < size; c++) {
      const E = e0 + (c + 0.5) * pixelM, N = n0 - (r + 0.5) * pixelM;
      data[r * size + c] = h((E - frame.originE) / k, (N - frame.originN) / k);
    }
  }
  const grid = createGrid({ width: size, height: size, data, transform: [e0, pixelM, 0, n0, 0, -pixelM], crs: utmCrs(31, false) });
  return {
    grid,
    frame,
    toGrid: (x, y) => [frame.originE + x * k, frame.originN + y * k],
    area: (x0, y0, x1, y1) => ({
      type: 'Polygon',
      coordinates: [[[x0, y0], [x1, y0], [x1, y1], [x0, y1], [x0, y0]].map(([x, y]) => frame.toLonLat(x, y))],
    }),
  };
}
