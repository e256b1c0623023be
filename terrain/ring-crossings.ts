/**
 * Where a polygon's edges cross: every edge of every ring goes into a static R-tree (flatbush, by V. Agafonkin),
 * and each edge is tested only against the edges whose bounding boxes it overlaps. That is O(n log n) for the
 * outlines people draw, instead of comparing every edge with every other (which took a minute at 10,000 corners).
 */
import Flatbush from 'flatbush';

/** A crossing of two edges: ring and edge indexes (edge k runs from position k to k + 1) and the point where they cross. */
interface RingCrossing {
  ringA: number;
  edgeA: number;
  ringB: number;
  edgeB: number;
  /** The crossing point [lon, lat] (or [x, y] in whatever plane the rings are in). */
  at: [number, number];
}

/** Sign of the turn p -> q -> r (positive counter-clockwise, 0 collinear). */
function orient(px: number, py: number, qx: number, qy: number, rx: number, ry: number): number {
  return Math.sign((qx - px) * (ry - py) - (qy - py) * (rx - px));
}

/**
 * The first crossing found between two edges of `rings` that are not neighbours in the same ring, or null when
 * no two edges cross. Rings are closed (last position repeats the first); only proper crossings count (edges that
 * merely touch at a corner are allowed), which is the test the area check has always made.
 */
export function findRingCrossing(rings: ReadonlyArray<ReadonlyArray<ReadonlyArray<number>>>): RingCrossing | null {
  let edges = 0;
  for (const ring of rings) edges += Math.max(0, ring.length - 1);
  if (edges < 2) return null;
  // flat arrays of the edges' end points and their ring / index, in the order they go into the tree
  const ax = new Float64Array(edges), ay = new Float64Array(edges), bx = new Float64Array(edges), by = new Float64Array(edges);
  const ringOf = new Uint32Array(edges), edgeOf = new Uint32Array(edges), ringEdges = new Uint32Array(edges);
  const index = new Flatbush(edges);
  let e = 0;
  rings.forEach((ring, r) => {
    for (let k = 0; k + 1 < ring.length; k++, e++) {
      ax[e] = ring[k][0]; ay[e] = ring[k][1]; bx[e] = ring[k + 1][0]; by[e] = ring[k + 1][1];
      ringOf[e] = r; edgeOf[e] = k; ringEdges[e] = ring.length - 1;
      index.add(Math.min(ax[e], bx[e]), Math.min(ay[e], by[e]), Math.max(ax[e], bx[e]), Math.max(ay[e], by[e]));
    }
  });
  index.finish();
  for (let i = 0; i < edges; i++) {
    const hits = index.search(Math.min(ax[i], bx[i]), Math.min(ay[i], by[i]), Math.max(ax[i], bx[i]), Math.max(ay[i], by[i]));
    for (const j of hits) {
      if (j <= i) continue;
      if (ringOf[i] === ringOf[j]) {
        const d = edgeOf[j] - edgeOf[i];
        if (d === 1 || d === ringEdges[i] - 1) continue; // neighbours share a corner
      }
      const c1 = orient(ax[i], ay[i], bx[i], by[i], ax[j], ay[j]) * orient(ax[i], ay[i], bx[i], by[i], bx[j], by[j]);
      if (c1 >= 0) continue;
      const c2 = orient(ax[j], ay[j], bx[j], by[j], ax[i], ay[i]) * orient(ax[j], ay[j], bx[j], by[j], bx[i], by[i]);
      if (c2 >= 0) continue;
      // the two lines' intersection (they are not parallel: the orientations above differ in sign)
      const dx1 = bx[i] - ax[i], dy1 = by[i] - ay[i], dx2 = bx[j] - ax[j], dy2 = by[j] - ay[j];
      const t = ((ax[j] - ax[i]) * dy2 - (ay[j] - ay[i]) * dx2) / (dx1 * dy2 - dy1 * dx2);
      return { ringA: ringOf[i], edgeA: edgeOf[i], ringB: ringOf[j], edgeB: edgeOf[j], at: [ax[i] + t * dx1, ay[i] + t * dy1] };
    }
  }
  return null;
}
