/**
 * A line's photos under the envelope, cell by cell of the lattice of tested attitudes (`cells` a photo; a cell
 * is a box of neighbouring lattice attitudes, at most two an axis, or the single attitude of a zero envelope). For each photo,
 * cell and each of the six intervals of `photoExtents` (three along-track image columns, three across-track
 * image rows): `inner` (12 numbers) the ground every attitude of the cell sees (the latest start and earliest
 * end over the cell's lattice attitudes, the image shrunk by the envelope's margin), `lengths` (6 numbers) the
 * longest the interval gets over the cell (the image grown by the margin). Photo s, cell c starts at
 * (s · cells + c) · 12 and · 6. NaN where any attitude's ray missed the ground.
 */
export interface GuaranteedExtents {
  cells: number;
  inner: Float64Array;
  lengths: Float64Array;
  /** Pixels the edges were moved in (and out) so the lattice of tested attitudes stands for the whole box. */
  marginPx: number;
  /** Tested attitudes per photo. */
  attitudeCount: number;
}
