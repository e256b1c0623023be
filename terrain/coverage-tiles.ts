/**
 * The coverage pass's tiles (TILE x TILE cells): each tile's box of ground positions and the photos whose ground
 * boxes meet it. Each piece is its own small function: run once per raster over every cell or tile, each is
 * optimised on its own the first time and stays so, whatever else the raster's options change.
 */
import { rowPositions, type ColumnBlend, type CoverageCells } from './coverage-grid';
import { TILE, TILE_BOX } from './coverage-pass';

/** Per tile its box and ground range (TILE_BOX numbers; tiles with no cell in the area keep ±Infinity). */
export function tileBoxes(cells: CoverageCells, cb: ColumnBlend, tw: number, th: number): Float64Array {
  const { width, height, inside, z } = cells;
  const tileBox = new Float64Array(tw * th * TILE_BOX);
  for (let t = 0; t < tw * th; t++) {
    const o = t * TILE_BOX;
    tileBox[o] = Infinity; tileBox[o + 1] = Infinity; tileBox[o + 2] = -Infinity; tileBox[o + 3] = -Infinity; tileBox[o + 4] = Infinity; tileBox[o + 5] = -Infinity;
  }
  const rowX = new Float64Array(width), rowY = new Float64Array(width);
  for (let r = 0; r < height; r++) {
    rowPositions(cells.nodes, cb, r, 0, width, rowX, rowY, 0);
    const row = r * width;
    for (let tx = 0; tx < tw; tx++) {
      let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity, zLow = Infinity, zHigh = -Infinity;
      const end = Math.min(width, (tx + 1) * TILE);
      for (let c = tx * TILE; c < end; c++) {
        if (inside[row + c] === 0) continue;
        const x = rowX[c], y = rowY[c], h = z[row + c];
        if (x < x0) x0 = x; if (x > x1) x1 = x; if (y < y0) y0 = y; if (y > y1) y1 = y; if (h < zLow) zLow = h; if (h > zHigh) zHigh = h;
      }
      if (!(x0 <= x1)) continue;
      const t = (Math.floor(r / TILE) * tw + tx) * TILE_BOX;
      if (x0 < tileBox[t]) tileBox[t] = x0; if (y0 < tileBox[t + 1]) tileBox[t + 1] = y0;
      if (x1 > tileBox[t + 2]) tileBox[t + 2] = x1; if (y1 > tileBox[t + 3]) tileBox[t + 3] = y1;
      if (zLow < tileBox[t + 4]) tileBox[t + 4] = zLow; if (zHigh > tileBox[t + 5]) tileBox[t + 5] = zHigh;
    }
  }
  return tileBox;
}

/**
 * Per tile, in increasing photo order, the photos whose axis-aligned ground box (`boxes`, 4 per photo) meets the
 * tile's box and whose box in the heading frame (`obox`, 6 per photo, offsets from `pos`) meets the tile's corners
 * turned into that frame. The tiles are first put in square bins of the local frame (one tile's span wide), so each
 * photo is tested against the tiles of the bins its box meets instead of against every tile; the test itself is
 * the same, so are the lists.
 */
export function tilePhotoLists(tileBox: Float64Array, tiles: number, boxes: Float64Array, obox: Float64Array, pos: Float64Array, P: number): Int32Array[] {
  let gx0 = Infinity, gy0 = Infinity, gx1 = -Infinity, gy1 = -Infinity, span = 0;
  for (let t = 0; t < tiles; t++) {
    const x0 = tileBox[t * TILE_BOX], y0 = tileBox[t * TILE_BOX + 1], x1 = tileBox[t * TILE_BOX + 2], y1 = tileBox[t * TILE_BOX + 3];
    if (!(x0 <= x1)) continue;
    if (x0 < gx0) gx0 = x0; if (y0 < gy0) gy0 = y0; if (x1 > gx1) gx1 = x1; if (y1 > gy1) gy1 = y1;
    span = Math.max(span, x1 - x0, y1 - y0);
  }
  const lists: number[][] = [];
  for (let t = 0; t < tiles; t++) lists.push([]);
  if (!(gx0 <= gx1)) return lists.map(() => new Int32Array(0));
  // bins: at most about as many as tiles (a tile's span, or wider where the tiles are scattered)
  let bin = Math.max(span, 1e-6);
  while (((gx1 - gx0) / bin + 1) * ((gy1 - gy0) / bin + 1) > 4 * tiles + 16) bin *= 2;
  const bnx = Math.floor((gx1 - gx0) / bin) + 1, bny = Math.floor((gy1 - gy0) / bin) + 1;
  const binOf = (v: number, v0: number, nb: number) => Math.min(nb - 1, Math.max(0, Math.floor((v - v0) / bin)));
  // tiles per bin (counting, then filling: one flat array)
  const count = new Int32Array(bnx * bny + 1);
  const each = (t: number, f: (b: number) => void) => {
    const i0 = binOf(tileBox[t * TILE_BOX], gx0, bnx), i1 = binOf(tileBox[t * TILE_BOX + 2], gx0, bnx);
    const j0 = binOf(tileBox[t * TILE_BOX + 1], gy0, bny), j1 = binOf(tileBox[t * TILE_BOX + 3], gy0, bny);
    for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) f(j * bnx + i);
  };
  const filled = (t: number) => tileBox[t * TILE_BOX] <= tileBox[t * TILE_BOX + 2];
  for (let t = 0; t < tiles; t++) if (filled(t)) each(t, (b) => { count[b + 1]++; });
  for (let b = 0; b < bnx * bny; b++) count[b + 1] += count[b];
  const inBin = new Int32Array(count[bnx * bny]), at = count.slice(0, bnx * bny);
  for (let t = 0; t < tiles; t++) if (filled(t)) each(t, (b) => { inBin[at[b]++] = t; });
  const seen = new Int32Array(tiles).fill(-1);
  for (let j = 0; j < P; j++) {
    const bx0 = boxes[j * 4], by0 = boxes[j * 4 + 1], bx1 = boxes[j * 4 + 2], by1 = boxes[j * 4 + 3];
    if (!(bx0 <= gx1 && bx1 >= gx0 && by0 <= gy1 && by1 >= gy0)) continue;
    const i0 = binOf(bx0, gx0, bnx), i1 = binOf(bx1, gx0, bnx), j0 = binOf(by0, gy0, bny), j1 = binOf(by1, gy0, bny);
    for (let bj = j0; bj <= j1; bj++) {
      for (let bi = i0; bi <= i1; bi++) {
        const b = bj * bnx + bi;
        for (let k = count[b]; k < count[b + 1]; k++) {
          const t = inBin[k];
          if (seen[t] === j) continue;
          seen[t] = j;
          if (meets(tileBox, t, boxes, obox, pos, j)) lists[t].push(j);
        }
      }
    }
  }
  return lists.map((l) => Int32Array.from(l));
}

/** Whether photo j's boxes meet tile t's box (the axis-aligned box, then the tile's corners in the photo's heading frame). */
function meets(tileBox: Float64Array, t: number, boxes: Float64Array, obox: Float64Array, pos: Float64Array, j: number): boolean {
  const x0 = tileBox[t * TILE_BOX], y0 = tileBox[t * TILE_BOX + 1], x1 = tileBox[t * TILE_BOX + 2], y1 = tileBox[t * TILE_BOX + 3];
  if (!(boxes[j * 4] <= x1 && boxes[j * 4 + 2] >= x0 && boxes[j * 4 + 1] <= y1 && boxes[j * 4 + 3] >= y0)) return false;
  const o = j * 6, sp = obox[o], cp = obox[o + 1];
  let a0 = Infinity, a1 = -Infinity, c0 = Infinity, c1 = -Infinity;
  for (let k = 0; k < 4; k++) {
    const dx = (k & 1 ? x1 : x0) - pos[j * 3], dy = (k & 2 ? y1 : y0) - pos[j * 3 + 1];
    const a = sp * dx + cp * dy, c = cp * dx - sp * dy;
    if (a < a0) a0 = a; if (a > a1) a1 = a; if (c < c0) c0 = c; if (c > c1) c1 = c;
  }
  return a0 <= obox[o + 3] && a1 >= obox[o + 2] && c0 <= obox[o + 5] && c1 >= obox[o + 4];
}
