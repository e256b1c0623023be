/** Coordinate reference systems: EPSG resolution, WGS 84, the UTM zone of a point, and the one gateway to proj4. */
import proj4 from 'proj4';
import type { GridCrs, LengthUnit } from './grid';
import { TerrainError } from './errors';
import { METRES_PER_FOOT, METRES_PER_US_SURVEY_FOOT } from './length-units';
import { type DatumShift, type EpsgEntry, lookupEpsg, verticalCrsUnit } from './epsg-table';

/** WGS 84 longitude/latitude (EPSG:4326), x = longitude, y = latitude, degrees. */
export const WGS84: GridCrs = Object.freeze({
  epsg: 4326,
  proj4: '+proj=longlat +datum=WGS84 +no_defs',
  geographic: true,
  horizontalUnit: 'degree',
  name: 'WGS 84',
});

/** Web Mercator (EPSG:3857), metres on a sphere of the WGS 84 semi-major axis. */
const WEB_MERCATOR: GridCrs = Object.freeze({
  epsg: 3857,
  proj4:
    '+proj=merc +a=6378137 +b=6378137 +lat_ts=0 +lon_0=0 +x_0=0 +y_0=0 +k=1 +units=m +nadgrids=@null +wktext +no_defs',
  geographic: false,
  horizontalUnit: 'metre',
  name: 'WGS 84 / Pseudo-Mercator',
});

/** WGS 84 / UTM zone `zone` (1..60), north or south hemisphere (EPSG 326zz / 327zz). */
export function utmCrs(zone: number, south: boolean): GridCrs {
  if (!Number.isInteger(zone) || zone < 1 || zone > 60) {
    throw new TerrainError('unknown-crs', `UTM zone must be a whole number 1..60, got ${zone}.`);
  }
  return {
    epsg: (south ? 32700 : 32600) + zone,
    proj4: `+proj=utm +zone=${zone}${south ? ' +south' : ''} +datum=WGS84 +units=m +no_defs`,
    geographic: false,
    horizontalUnit: 'metre',
    name: `WGS 84 / UTM zone ${zone}${south ? 'S' : 'N'}`,
  };
}

/**
 * The WGS 84 UTM CRS whose zone contains (lon, lat), with the Norway and Svalbard exceptions
 * of the UTM grid definition (common practice; as in NGA's UTM/UPS standard).
 */
export function utmCrsFor(lon: number, lat: number): GridCrs {
  if (!Number.isFinite(lon) || !Number.isFinite(lat) || lat < -90 || lat > 90) {
    throw new TerrainError('invalid-input', `Need a longitude and a latitude in degrees, got (${lon}, ${lat}).`);
  }
  const l = ((((lon + 180) % 360) + 360) % 360) - 180;
  let zone = Math.min(60, Math.floor((l + 180) / 6) + 1);
  if (lat >= 56 && lat < 64 && l >= 3 && l < 12) zone = 32;
  if (lat >= 72 && lat < 84) {
    if (l >= 0 && l < 9) zone = 31;
    else if (l >= 9 && l < 21) zone = 33;
    else if (l >= 21 && l < 33) zone = 35;
    else if (l >= 33 && l < 42) zone = 37;
  }
  return utmCrs(zone, lat < 0);
}

/** Length unit of a proj4 definition (`+units=` or `+to_meter=`); degrees for longlat. */
export function unitOfProj4(def: string): LengthUnit {
  if (/\+proj=(longlat|latlong|lonlat|latlon)\b/.test(def)) return 'degree';
  const units = /\+units=([\w-]+)/.exec(def)?.[1];
  if (units === 'us-ft') return 'us-survey-foot';
  if (units === 'ft') return 'foot';
  if (units === 'm' || units === undefined) {
    const toMeter = /\+to_meter=([\d.eE+-]+)/.exec(def)?.[1];
    if (toMeter !== undefined) {
      const f = Number(toMeter);
      if (Math.abs(f - METRES_PER_US_SURVEY_FOOT) < 1e-12) return 'us-survey-foot';
      if (Math.abs(f - METRES_PER_FOOT) < 1e-12) return 'foot';
      if (Math.abs(f - 1) > 1e-12) {
        throw new TerrainError('unknown-crs', `The CRS uses a length unit of ${f} m that Loftline does not read; reproject the grid to metres.`);
      }
    }
    return 'metre';
  }
  throw new TerrainError('unknown-crs', `The CRS uses the length unit "${units}", which Loftline does not read; reproject the grid to metres or feet.`);
}

/** NTv2 datum-shift grids given to proj4 (registerDatumGrid), by file name. */
const loadedGrids = new Set<string>();

/**
 * Give proj4 the bytes of an NTv2 datum-shift grid (e.g. BETA2007.gsb from Debian's proj-data) under its file name,
 * so that CRSs whose datum shift is that grid (+nadgrids=FILE) can be placed. The terrain engine reads no files:
 * the server and the command line read the grid directory and call this at start.
 */
export function registerDatumGrid(fileName: string, bytes: ArrayBuffer): void {
  try {
    proj4.nadgrid(fileName, bytes);
  } catch (err) {
    throw new TerrainError('unknown-crs', `The datum-shift grid ${fileName} is not a readable NTv2 file (${(err as Error)?.message ?? err}); reinstall it (Debian package proj-data).`);
  }
  loadedGrids.add(fileName);
}

/** Names of the datum-shift grids proj4 has been given. */
export function registeredDatumGrids(): string[] {
  return [...loadedGrids].sort();
}

function missingGridError(grid: string, name: string): TerrainError {
  return new TerrainError('unknown-crs', `${name} needs the datum-shift grid ${grid}, which is not loaded: install Debian's proj-data (or put ${grid} in the grid directory, setting DATUM_GRID_DIR, default /usr/share/proj) and restart, or reproject the DEM to WGS 84 or a UTM zone (gdalwarp -t_srs EPSG:326xx in.tif out.tif).`);
}

/**
 * Drop datum-shift grid files proj4 has not been given (they would make every transform fail). A CRS whose only
 * datum shift is such a grid is refused, naming the grid, rather than silently shifted by up to hundreds of metres.
 */
function withoutGridFiles(def: string, name: string): string {
  const grid = /\+nadgrids=(?!@null\b)(\S+)/.exec(def)?.[1];
  if (grid && loadedGrids.has(grid)) {
    return def.replace(/\s*\+geoidgrids=\S+/g, '').replace(/\s*\+type=crs\b/g, '').trim();
  }
  const out = def
    .replace(/\s*\+nadgrids=(?!@null\b)\S+/g, '')
    .replace(/\s*\+geoidgrids=\S+/g, '')
    .replace(/\s*\+type=crs\b/g, '')
    .trim();
  if (grid && !/\+towgs84=/.test(out) && !/\+datum=/.test(out)) throw missingGridError(grid, name);
  return out;
}

// PROJ method names proj4js 2.22 implements (node_modules/proj4/lib/projections/*.js `names`)
const PROJ4_METHODS = new Set(['longlat', 'latlong', 'lonlat', 'latlon', 'tmerc', 'etmerc', 'utm', 'merc', 'lcc', 'aea', 'stere', 'sterea', 'somerc', 'omerc', 'krovak', 'cass', 'laea', 'aeqd', 'eqc', 'eqdc', 'poly', 'nzmg', 'mill', 'sinu', 'moll', 'cea', 'gnom', 'ortho', 'robin', 'vandg', 'eqearth', 'bonne', 'geos', 'tpers', 'qsc', 'gstmerc', 'eck6', 'equi', 'gauss']);

/** proj4 definitions built on an EPSG geographic CRS's datum (GeoKeys), with that CRS's code: they share its shifts. */
const onDatumOf = new Map<string, number>();

/**
 * A CRS from a proj4 definition (user-defined GeoTIFF keys, tests). `datumOf`: the EPSG geographic CRS whose datum
 * (and first shift) the definition carries, so that transforms pick among its shifts by place as PROJ does.
 */
export function crsFromProj4(def: string, name: string, epsg: number | null = null, datumOf: number | null = null): GridCrs {
  const clean = withoutGridFiles(def, name);
  const method = /\+proj=(\w+)/.exec(clean)?.[1];
  if (method && !PROJ4_METHODS.has(method)) {
    throw new TerrainError('unknown-crs', `${name} uses the projection method "${method}", which Loftline's transform library (proj4js) does not implement; reproject the grid to WGS 84 or a UTM zone (gdalwarp -t_srs EPSG:326xx in.tif out.tif).`);
  }
  try {
    proj4(WGS84.proj4, clean); // validate now rather than on first use
  } catch (err) {
    throw new TerrainError('unknown-crs', `proj4 cannot use the CRS definition "${clean}" of ${name} (${(err as Error)?.message ?? err}); reproject the grid to WGS 84 or UTM.`);
  }
  const geographic = /\+proj=(longlat|latlong|lonlat|latlon)\b/.test(clean);
  if (datumOf !== null && epsg === null) onDatumOf.set(clean, datumOf);
  return { epsg, proj4: clean, geographic, horizontalUnit: unitOfProj4(clean), name };
}

const cache = new Map<number, GridCrs>();

/** The proj4 definition of a table entry with its datum shift number `i` (PROJ's order). */
function withShift(entry: EpsgEntry, i: number): string {
  const shift = entry.shifts[i];
  return shift ? `${entry.proj4} ${shift.towgs84}` : (entry.proj4 as string);
}

/**
 * A horizontal CRS from its EPSG code: 4326, 3857 and every WGS 84 UTM zone built in, the rest as PROJ 9.1.1
 * defines them (epsg-table.ts), with the datum shift to WGS 84 that PROJ itself uses (the first of its list;
 * createTransform picks among several by the point's place, as PROJ does).
 */
export function crsFromEpsg(code: number): GridCrs {
  if (!Number.isInteger(code) || code <= 0) {
    throw new TerrainError('unknown-crs', `An EPSG code is a positive whole number, got ${code}.`);
  }
  const hit = cache.get(code);
  if (hit) return hit;
  let crs: GridCrs;
  if (code === 4326) crs = WGS84;
  else if (code === 3857 || code === 900913 || code === 3785) crs = WEB_MERCATOR;
  else if ((code > 32600 && code <= 32660) || (code > 32700 && code <= 32760)) crs = utmCrs(code % 100, code > 32700);
  else {
    const entry = lookupEpsg(code);
    if (!entry) {
      const what = verticalCrsUnit(code) !== undefined ? 'a vertical CRS (heights only)' : 'not a map or geographic CRS in the EPSG dataset of PROJ 9.1.1';
      throw new TerrainError('unknown-crs', `EPSG:${code} is ${what}, so it cannot place a DEM; a DEM needs a horizontal CRS such as WGS 84 (EPSG:4326) or a UTM zone.`);
    }
    if (entry.refusal !== null || entry.proj4 === null) {
      throw new TerrainError('unknown-crs', `EPSG:${code}: ${entry.refusal ?? entry.name}. Reproject the DEM to WGS 84 or a WGS 84 UTM zone (e.g. gdalwarp -t_srs EPSG:326xx in.tif out.tif).`);
    }
    crs = crsFromProj4(withShift(entry, 0), entry.name, code);
  }
  cache.set(code, crs);
  return crs;
}

/** Parse "EPSG:32633", "epsg:4326" or "32633" into a CRS. */
export function crsFromString(text: string): GridCrs {
  const m = /^\s*(?:epsg:)?(\d+)\s*$/i.exec(text);
  if (!m) throw new TerrainError('unknown-crs', `Write a CRS as EPSG:<code> (e.g. EPSG:4326), got "${text}".`);
  return crsFromEpsg(Number(m[1]));
}

/** A point transform between two CRSs; x = lon/easting, y = lat/northing in both. */
interface Transform {
  forward(x: number, y: number): [number, number];
  inverse(x: number, y: number): [number, number];
  /** In-place forward transform of coordinate arrays (the hot-loop form: one converter, one scratch pair). */
  forwardArrays(xs: Float64Array, ys: Float64Array): void;
  /** True when from and to are the same CRS and the transform does nothing. */
  identity: boolean;
}

function sameCrs(a: GridCrs, b: GridCrs): boolean {
  return a === b || (a.epsg !== null && a.epsg === b.epsg) || a.proj4 === b.proj4;
}

/** One proj4 definition of a CRS per datum shift PROJ knows for it, with where PROJ uses each. */
interface Variant {
  proj4: string;
  shift: DatumShift | null;
  crsName?: string;
}

/** A shift that holds only in part of the world (EPSG area of use), so the point's place decides. */
function regional(s: DatumShift): boolean {
  return !(s.bbox[0] <= -180 && s.bbox[1] <= -90 && s.bbox[2] >= 180 && s.bbox[3] >= 90);
}

/** The CRS's definitions, one per datum shift, when PROJ chooses among several by place; else just its own. */
function variantsOf(crs: GridCrs): Variant[] {
  const own = [{ proj4: crs.proj4, shift: null }];
  if (crs.epsg === null) {
    // a user-defined CRS on an EPSG datum: the same definition with each of that datum's shifts
    const base = onDatumOf.get(crs.proj4);
    const entry = base === undefined ? undefined : lookupEpsg(base);
    const first = entry?.shifts[0]?.towgs84;
    if (!entry || !entry.shifts.some(regional) || !first || !crs.proj4.includes(first)) return own;
    return entry.shifts.map((shift) => ({ proj4: crs.proj4.replace(first, shift.towgs84), shift, crsName: crs.name }));
  }
  const entry = lookupEpsg(crs.epsg);
  // only a CRS built from the table (a caller may have made its own definition under this code)
  if (!entry || entry.proj4 === null || crs.proj4 !== withShift(entry, 0) || !entry.shifts.some(regional)) return own;
  return entry.shifts.map((shift, i) => ({ proj4: withShift(entry, i), shift, crsName: entry.name }));
}

function inArea(b: readonly [number, number, number, number], lon: number, lat: number): boolean {
  if (!(lat >= b[1] && lat <= b[3])) return false;
  return b[0] <= b[2] ? lon >= b[0] && lon <= b[2] : lon >= b[0] || lon <= b[2];
}

/**
 * The variant PROJ uses at (lon, lat), as PROJ 9.1 proj_trans chooses among the operations of a CRS pair
 * (src/4D_api.cpp, pj_get_suggested_operation): of those whose area holds the point and are not offshore, the
 * one with the best known accuracy (an unknown accuracy yields to any known one; at equal accuracy the one whose
 * area lies inside the other's). Where none holds the point PROJ would apply no shift at all: refused.
 */
function variantAt(vs: Variant[], lon: number, lat: number): number {
  let best = -1;
  let bestAcc = 0;
  for (let i = 0; i < vs.length; i++) {
    const s = vs[i].shift;
    if (!s || !inArea(s.bbox, lon, lat)) continue;
    if (best < 0) {
      best = i;
      bestAcc = s.accuracyM;
      continue;
    }
    const b = (vs[best].shift as DatumShift).bbox;
    const inside = s.bbox[0] > b[0] && s.bbox[1] > b[1] && s.bbox[2] < b[2] && s.bbox[3] < b[3];
    const better = (s.accuracyM >= 0 && (s.accuracyM < bestAcc || (s.accuracyM === bestAcc && inside))) || bestAcc < 0;
    if (better && !s.offshore) {
      best = i;
      bestAcc = s.accuracyM;
    }
  }
  if (best < 0) {
    // PROJ falls back to a ballpark (no shift) here, off by up to hundreds of metres: refuse instead
    const names = [...new Set(vs.map((v) => v.shift?.name))].slice(0, 3).join('; ');
    throw new TerrainError('unknown-crs', `${vs[0].crsName ?? 'The CRS'}: no EPSG transformation to WGS 84 covers ${lon.toFixed(5)}, ${lat.toFixed(5)} (those known hold elsewhere: ${names}); reproject the DEM to WGS 84 or a WGS 84 UTM zone with a tool that has the right datum shift for this place.`);
  }
  const grid = /\+nadgrids=(?!@null\b)(\S+)/.exec(vs[best].proj4)?.[1];
  if (grid && !loadedGrids.has(grid)) throw missingGridError(grid, vs[best].crsName ?? 'The CRS');
  return best;
}

/** A transform from one CRS to another (proj4), built once and reused for every point. */
export function createTransform(from: GridCrs, to: GridCrs): Transform {
  if (sameCrs(from, to)) {
    return {
      forward: (x, y) => [x, y],
      inverse: (x, y) => [x, y],
      forwardArrays: () => {},
      identity: true,
    };
  }
  const fromV = variantsOf(from);
  const toV = variantsOf(to);
  if (fromV.some((v) => v.shift) || toV.some((v) => v.shift)) return placeDependentTransform(fromV, toV);
  const conv = proj4(from.proj4, to.proj4);
  const forward = (x: number, y: number): [number, number] => {
    const r = conv.forward([x, y], true);
    return [r[0], r[1]];
  };
  const inverse = (x: number, y: number): [number, number] => {
    const r = conv.inverse([x, y], true);
    return [r[0], r[1]];
  };
  return {
    forward,
    inverse,
    forwardArrays(xs, ys) {
      const p: [number, number] = [0, 0];
      for (let i = 0; i < xs.length; i++) {
        p[0] = xs[i];
        p[1] = ys[i];
        const r = conv.forward(p, true);
        xs[i] = r[0];
        ys[i] = r[1];
      }
    },
    identity: false,
  };
}

type Converter = { forward(p: [number, number], enforceAxis: boolean): number[]; inverse(p: [number, number], enforceAxis: boolean): number[] };

/**
 * A converter that says so when a datum-shift grid does not cover the point (proj4 then returns nothing) instead of
 * failing later on an undefined coordinate; a grid that is not loaded yields the first pass's Helmert, never used.
 */
function gridChecked(conv: Converter, v: Variant): Converter {
  const grid = /\+nadgrids=(?!@null\b)(\S+)/.exec(v.proj4)?.[1];
  if (!grid) return conv;
  const check = (r: number[] | undefined, p: [number, number]): number[] => {
    if (r && Number.isFinite(r[0]) && Number.isFinite(r[1])) return r;
    if (!Number.isFinite(p[0]) || !Number.isFinite(p[1])) return r ?? [NaN, NaN]; // nodata stays nodata
    if (!loadedGrids.has(grid)) throw missingGridError(grid, v.crsName ?? 'The CRS');
    throw new TerrainError('unknown-crs', `${v.crsName ?? 'The CRS'}: the datum-shift grid ${grid} does not cover ${p[0].toFixed(5)}, ${p[1].toFixed(5)}; reproject the DEM to WGS 84 or a WGS 84 UTM zone with a tool that has the right datum shift for this place.`);
  };
  return {
    forward: (p, e) => check(conv.forward(p, e), p),
    inverse: (p, e) => check(conv.inverse(p, e), p),
  };
}

/**
 * A transform through WGS 84 where either side has several datum shifts (e.g. ED50, NAD27): each point goes
 * through the shift PROJ would use at its place, found from a first pass through the first shift.
 */
function placeDependentTransform(fromV: Variant[], toV: Variant[]): Transform {
  const toWgs = fromV.map((v) => gridChecked(proj4(v.proj4, WGS84.proj4), v));
  const fromWgs = toV.map((v) => gridChecked(proj4(WGS84.proj4, v.proj4), v));
  const forward = (x: number, y: number): [number, number] => {
    let ll = toWgs[0].forward([x, y], true);
    if (fromV[0].shift) {
      const i = variantAt(fromV, ll[0], ll[1]);
      if (i > 0) ll = toWgs[i].forward([x, y], true);
    }
    const r = fromWgs[toV[0].shift ? variantAt(toV, ll[0], ll[1]) : 0].forward([ll[0], ll[1]], true);
    return [r[0], r[1]];
  };
  const inverse = (x: number, y: number): [number, number] => {
    let ll = fromWgs[0].inverse([x, y], true);
    if (toV[0].shift) {
      const i = variantAt(toV, ll[0], ll[1]);
      if (i > 0) ll = fromWgs[i].inverse([x, y], true);
    }
    const r = toWgs[fromV[0].shift ? variantAt(fromV, ll[0], ll[1]) : 0].inverse([ll[0], ll[1]], true);
    return [r[0], r[1]];
  };
  return {
    forward,
    inverse,
    forwardArrays(xs, ys) {
      for (let i = 0; i < xs.length; i++) {
        const r = forward(xs[i], ys[i]);
        xs[i] = r[0];
        ys[i] = r[1];
      }
    },
    identity: false,
  };
}

