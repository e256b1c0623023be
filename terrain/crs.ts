/** Coordinate reference systems: EPSG resolution, WGS 84, the UTM zone of a point, and the one gateway to proj4. */
import proj4 from 'proj4';
import type { GridCrs, LengthUnit } from './grid';
import { TerrainError } from './errors';
import { lookupEpsg } from './epsg-table';

/** WGS 84 longitude/latitude (EPSG:4326), x = longitude, y = latitude, degrees. */
export const WGS84: GridCrs = Object.freeze({
  epsg: 4326,
  proj4: '+proj=longlat +datum=WGS84 +no_defs',
  geographic: true,
  horizontalUnit: 'degree',
  name: 'WGS 84',
});

/** Web Mercator (EPSG:3857), metres on a sphere of the WGS 84 semi-major axis. */
export const WEB_MERCATOR: GridCrs = Object.freeze({
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
      if (Math.abs(f - 1200 / 3937) < 1e-12) return 'us-survey-foot';
      if (Math.abs(f - 0.3048) < 1e-12) return 'foot';
      if (Math.abs(f - 1) > 1e-12) {
        throw new TerrainError('unknown-crs', `The CRS uses a length unit of ${f} m that Loftline does not read; reproject the grid to metres.`);
      }
    }
    return 'metre';
  }
  throw new TerrainError('unknown-crs', `The CRS uses the length unit "${units}", which Loftline does not read; reproject the grid to metres or feet.`);
}

// OSGB36 -> WGS 84 seven-parameter Helmert, EPSG transformation 1314 (EPSG dataset; stated accuracy 2 m):
// stands in for the OSTN15 grid that proj4 cannot load here.
const OSGB36_TOWGS84 = '+towgs84=446.448,-125.157,542.06,0.15,0.247,0.842,-20.489';

/**
 * Drop datum-shift grid files proj4 cannot load here (they would make every transform fail). A CRS whose only
 * datum shift is such a grid is refused rather than silently shifted by up to hundreds of metres,
 * except OSGB36, which gets EPSG's Helmert fit.
 */
function withoutGridFiles(def: string, name: string): string {
  const grid = /\+nadgrids=(?!@null\b)(\S+)/.exec(def)?.[1];
  let out = def
    .replace(/\s*\+nadgrids=(?!@null\b)\S+/g, '')
    .replace(/\s*\+geoidgrids=\S+/g, '')
    .replace(/\s*\+type=crs\b/g, '')
    .trim();
  if (grid && !/\+towgs84=/.test(out) && !/\+datum=/.test(out)) {
    if (/OSTN/i.test(grid)) out += ` ${OSGB36_TOWGS84}`;
    else {
      throw new TerrainError('unknown-crs', `${name} needs the datum-shift grid ${grid}, which Loftline cannot apply; reproject the DEM to WGS 84 or a UTM zone (gdalwarp -t_srs EPSG:326xx in.tif out.tif).`);
    }
  }
  return out;
}

/** A CRS from a proj4 definition (user-defined GeoTIFF keys, tests). */
export function crsFromProj4(def: string, name: string, epsg: number | null = null): GridCrs {
  const clean = withoutGridFiles(def, name);
  try {
    proj4(WGS84.proj4, clean); // validate now rather than on first use
  } catch (err) {
    throw new TerrainError('unknown-crs', `proj4 cannot use the CRS definition "${clean}" (${(err as Error).message}); reproject the grid to WGS 84 or UTM.`);
  }
  const geographic = /\+proj=(longlat|latlong|lonlat|latlon)\b/.test(clean);
  return { epsg, proj4: clean, geographic, horizontalUnit: unitOfProj4(clean), name };
}

const USABLE_KINDS = new Set(['CRS-PROJCRS', 'CRS-GEOGCRS', 'CRS-GEOG3DCRS', 'CRS-COMPOUNDCRS']);
const cache = new Map<number, GridCrs>();

/** A horizontal CRS from its EPSG code: 4326, 3857 and every WGS 84 UTM zone built in, the rest from epsg-index. */
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
      throw new TerrainError('unknown-crs', `EPSG:${code} is not in the EPSG index Loftline uses; reproject the grid to WGS 84 (EPSG:4326) or a UTM zone.`);
    }
    if (!USABLE_KINDS.has(entry.kind) || !entry.proj4 || !/\+proj=/.test(entry.proj4)) {
      throw new TerrainError('unknown-crs', `EPSG:${code} (${entry.name}) is not a horizontal map or geographic CRS; a DEM needs one such as EPSG:4326 or a UTM zone.`);
    }
    crs = crsFromProj4(entry.proj4, entry.name, code);
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
export interface Transform {
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
  const conv = proj4(from.proj4, to.proj4);
  const forward = (x: number, y: number): [number, number] => {
    const r = conv.forward([x, y]);
    return [r[0], r[1]];
  };
  const inverse = (x: number, y: number): [number, number] => {
    const r = conv.inverse([x, y]);
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
        const r = conv.forward(p);
        xs[i] = r[0];
        ys[i] = r[1];
      }
    },
    identity: false,
  };
}

export { crsFromGeoKeys } from './geokeys';
