/** Errors the terrain core raises on bad input: a stable code for programs, a message that says what is wrong and what to do. */

/** Every code a TerrainError carries, as data (the server answers each with a 422 naming it). */
export const TERRAIN_ERROR_CODES = [
  'not-tiff', // the bytes are not a TIFF at all
  'truncated', // a TIFF whose data ends early
  'not-elevation', // a colour image (palette, RGB …), not heights
  'damaged', // a TIFF with a block or directory entry that cannot be read (named in the message)
  'unsupported', // a TIFF feature we do not read (sample format, compression, bands)
  'no-georeference', // no tiepoint/scale or transformation
  'unknown-crs', // GeoKeys missing or naming a CRS we cannot resolve
  'too-large', // width x height beyond the configured limit
  'all-nodata', // nothing but nodata in the grid or window
  'outside-grid', // a requested area or point set does not touch the grid
  'invalid-input', // a parameter out of range
] as const;

export type TerrainErrorCode = (typeof TERRAIN_ERROR_CODES)[number];

/** An input problem the user can fix; `message` is written for the user. */
export class TerrainError extends Error {
  readonly code: TerrainErrorCode;
  constructor(code: TerrainErrorCode, message: string) {
    super(message);
    this.name = 'TerrainError';
    this.code = code;
  }
}

/** Throw an `invalid-input` TerrainError unless `ok`; message should say expected vs got. */
export function check(ok: boolean, message: string): asserts ok {
  if (!ok) throw new TerrainError('invalid-input', message);
}
