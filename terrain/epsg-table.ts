/** The EPSG definitions Loftline can resolve beyond its built-in CRSs, from the epsg-index package. */
import all from 'epsg-index/all.json';

/** One EPSG index entry as epsg-index ships it. */
export interface EpsgEntry {
  code: string;
  kind: string;
  name: string;
  proj4: string | null;
  unit: string | null;
}

// epsg-index's all.json is ~8 MB: a browser bundle that needs only WGS 84 / UTM can swap this
// module for a small table (platform split, e.g. epsg-table.web.ts).
const table = all as unknown as Record<string, EpsgEntry | undefined>;

/** The epsg-index entry for `code`, or undefined when the index does not know it. */
export function lookupEpsg(code: number): EpsgEntry | undefined {
  return table[String(code)];
}
