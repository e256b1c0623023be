/**
 * Datum-shift grids for the terrain engine: the NTv2 files the EPSG table applies (terrain/epsg-table.ts
 * datumGridFiles, e.g. BETA2007.gsb) read from the grid directory (DATUM_GRID_DIR, default /usr/share/proj where
 * Debian's proj-data puts them) and given to proj4 once per process and terrain thread. A file that is absent
 * leaves its CRSs refused with a message naming it (terrain/crs.ts).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { datumGridFiles } from '../../terrain/epsg-table';
import { registerDatumGrid, registeredDatumGrids } from '../../terrain/crs';

/** Where the grids are read from when nothing is configured (Debian proj-data). */
const DEFAULT_DATUM_GRID_DIR = '/usr/share/proj';

/** Load every grid the table names from `dir`; returns the names loaded and those not found there. */
export function loadDatumGrids(dir: string = process.env.DATUM_GRID_DIR || DEFAULT_DATUM_GRID_DIR): { loaded: string[]; missing: string[] } {
  const already = new Set(registeredDatumGrids());
  const loaded: string[] = [];
  const missing: string[] = [];
  for (const name of datumGridFiles()) {
    if (already.has(name)) {
      loaded.push(name);
      continue;
    }
    let bytes: Buffer;
    try {
      bytes = readFileSync(join(dir, name));
    } catch {
      missing.push(name);
      continue;
    }
    registerDatumGrid(name, bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
    loaded.push(name);
  }
  return { loaded, missing };
}
