/**
 * EPSG definitions beyond the built-in CRSs, as PROJ 9.1.1 itself defines them: terrain/data/epsg-proj.json, made
 * from PROJ's database by `python3 scripts/gen-epsg-table.py > terrain/data/epsg-proj.json` (see that script).
 * Only crs.ts and geokeys.ts load it (server and command line); the web client never imports them.
 */
import data from './data/epsg-proj.json';

/** One way PROJ reaches WGS 84 from a CRS's datum: a +towgs84 Helmert or an NTv2 grid, and the area where PROJ uses it. */
export interface DatumShift {
  /** The proj4 term: `+towgs84=…`, or `+nadgrids=FILE` for an NTv2 grid of Debian's proj-data (see datumGridFiles). */
  towgs84: string;
  /** Area of use [west, south, east, north] in degrees (west > east when it crosses 180 degrees). */
  bbox: readonly [number, number, number, number];
  /** EPSG transformation name, e.g. "ED50 to WGS 84 (18)". */
  name: string;
  /** EPSG's stated accuracy in metres, -1 when unknown: where several areas hold a point, PROJ takes the best. */
  accuracyM: number;
  /** PROJ counts the area as offshore: used only where no onshore transformation covers the point. */
  offshore: boolean;
}

/** One EPSG CRS: its proj4 definition without datum shift and the shifts in PROJ's order, or why it is refused. */
export interface EpsgEntry {
  code: number;
  name: string;
  /** proj4 definition (ellipsoid, projection, units) without +towgs84; null when refused. */
  proj4: string | null;
  /** PROJ's transformations to WGS 84 in its order of preference; empty when the datum is WGS 84's own. */
  shifts: DatumShift[];
  /** Why Loftline cannot place this CRS (e.g. it needs a grid file); null when it can. */
  refusal: string | null;
}

type RawEntry = [string, string | null, number[] | string] | [string, string];
type RawShift = [string, number, number, number, number, string, number, number?];
const raw = data as unknown as {
  crs: Record<string, RawEntry | undefined>;
  shifts: RawShift[];
  vertical: Record<string, number | undefined>;
  primeMeridians: Record<string, number | undefined>;
};

function shiftAt(i: number): DatumShift {
  const s = raw.shifts[i];
  return { towgs84: s[0], bbox: [s[1], s[2], s[3], s[4]], name: s[5], accuracyM: s[6], offshore: s[7] === 1 };
}

/** The table entry for `code` (a compound CRS resolves to its horizontal part), or undefined when PROJ has none. */
export function lookupEpsg(code: number): EpsgEntry | undefined {
  const e = raw.crs[String(code)];
  if (!e) return undefined;
  if (e.length === 2) {
    const horizontal = lookupEpsg(Number(e[1].slice(1)));
    return horizontal && { ...horizontal, code, name: e[0] };
  }
  const [name, proj4, rest] = e;
  if (proj4 === null || typeof rest === 'string') return { code, name, proj4: null, shifts: [], refusal: typeof rest === 'string' ? rest : `${name} has no PROJ definition` };
  return { code, name, proj4, shifts: rest.map(shiftAt), refusal: null };
}

/** EPSG unit-of-measure code of a vertical CRS's heights (9001 metre, 9002 foot, 9003 US survey foot), or undefined. */
export function verticalCrsUnit(code: number): number | undefined {
  return raw.vertical[String(code)];
}

/** Longitude of an EPSG prime meridian (e.g. 8903 Paris) east of Greenwich in degrees, or undefined. */
export function primeMeridianDeg(code: number): number | undefined {
  return raw.primeMeridians[String(code)];
}

/** The NTv2 grid files (e.g. BETA2007.gsb) some datum shifts of the table apply: the server and the command line load them. */
export function datumGridFiles(): string[] {
  const names = new Set<string>();
  for (const sh of raw.shifts) {
    const m = /^\+nadgrids=(\S+)$/.exec(sh[0]);
    if (m) names.add(m[1]);
  }
  return [...names].sort();
}
