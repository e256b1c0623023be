/** GeoTIFF GeoKeys (OGC GeoTIFF 1.1 standard, OGC 19-008r4) to a Loftline CRS and length units. */
import type { GridCrs, LengthUnit } from './grid';
import { TerrainError } from './errors';
import { crsFromEpsg, crsFromProj4 } from './crs';
import { lookupEpsg } from './epsg-table';

/** GeoKeys as geotiff.js's `getGeoKeys()` returns them (key name -> value). */
export type GeoKeys = Record<string, unknown>;

const USER_DEFINED = 32767;

function num(keys: GeoKeys, name: string): number | undefined {
  const v = keys[name];
  if (typeof v === 'number' && Number.isFinite(v)) return v;
  if (Array.isArray(v) && typeof v[0] === 'number') return v[0];
  return undefined;
}

/** EPSG unit-of-measure code (9001 metre, 9002 foot, 9003 US survey foot) to our unit; null when unknown. */
export function lengthUnitFromCode(code: number | undefined): LengthUnit | null {
  if (code === undefined || code === 9001) return 'metre';
  if (code === 9002 || code === 9005 || code === 9095) return 'foot'; // international, Clarke's (close), British 1936 (close)
  if (code === 9003) return 'us-survey-foot';
  return null;
}

/** Vertical unit of the heights from VerticalUnitsGeoKey (metre when absent); throws for units we do not convert. */
export function verticalUnitFromGeoKeys(keys: GeoKeys | null | undefined): LengthUnit {
  let code = keys ? num(keys, 'VerticalUnitsGeoKey') : undefined;
  const vcs = keys ? num(keys, 'VerticalCSTypeGeoKey') : undefined;
  if (code === undefined && vcs !== undefined && vcs !== USER_DEFINED) {
    // GDAL writes only the vertical CRS code when the unit follows from it (e.g. EPSG:6360, NAVD88 height (ftUS))
    const unit = lookupEpsg(vcs)?.unit?.toLowerCase() ?? '';
    if (unit.includes('us survey foot')) return 'us-survey-foot';
    if (unit.includes('foot')) return 'foot';
    return 'metre';
  }
  if (code === USER_DEFINED) return 'metre';
  const unit = lengthUnitFromCode(code);
  if (unit === null) {
    throw new TerrainError('unsupported', `The grid's heights use unit EPSG:${code}, which Loftline does not convert; store heights in metres or feet.`);
  }
  return unit;
}

/** Vertical datum named by VerticalCSTypeGeoKey / VerticalCitationGeoKey, or null when the file says nothing. */
export function verticalDatumFromGeoKeys(keys: GeoKeys | null | undefined): { epsg: number | null; name: string } | null {
  if (!keys) return null;
  const code = num(keys, 'VerticalCSTypeGeoKey');
  const citation = typeof keys.VerticalCitationGeoKey === 'string' ? keys.VerticalCitationGeoKey.replace(/\|$/, '') : null;
  const known: Record<number, string> = { 5773: 'EGM96 height', 3855: 'EGM2008 height', 5703: 'NAVD88 height', 5701: 'ODN height', 4979: 'WGS 84 ellipsoidal height' };
  if (code !== undefined && code !== USER_DEFINED) return { epsg: code, name: known[code] ?? citation ?? `EPSG:${code}` };
  return citation ? { epsg: null, name: citation } : null;
}

/** proj4 datum/ellipsoid terms of the geographic part of the keys (e.g. "+datum=WGS84"). */
function datumTerms(keys: GeoKeys): string {
  const geog = num(keys, 'GeographicTypeGeoKey');
  if (geog !== undefined && geog !== USER_DEFINED) {
    const base = crsFromEpsg(geog);
    if (!base.geographic) throw new TerrainError('unknown-crs', `GeographicTypeGeoKey EPSG:${geog} is not a geographic CRS; the file's georeference is inconsistent.`);
    return base.proj4.split(/\s+/).filter((t) => !/^\+(proj|no_defs|units|type)\b/.test(t)).join(' ');
  }
  const datum = num(keys, 'GeogGeodeticDatumGeoKey');
  if (datum === 6326) return '+datum=WGS84';
  const ellipsoid = num(keys, 'GeogEllipsoidGeoKey');
  if (ellipsoid === 7030) return '+ellps=WGS84';
  if (ellipsoid === 7019) return '+ellps=GRS80';
  const a = num(keys, 'GeogSemiMajorAxisGeoKey');
  const rf = num(keys, 'GeogInvFlatteningGeoKey');
  const b = num(keys, 'GeogSemiMinorAxisGeoKey');
  if (a !== undefined && rf !== undefined) return rf === 0 ? `+a=${a} +b=${a}` : `+a=${a} +rf=${rf}`;
  if (a !== undefined && b !== undefined) return `+a=${a} +b=${b}`;
  throw new TerrainError('unknown-crs', 'The GeoKeys define no datum or ellipsoid; save the grid with an EPSG code (e.g. gdal_translate -a_srs EPSG:32633).');
}

/** A user-defined projection (ProjCoordTransGeoKey) as proj4 terms, for the common map projections. */
function projectionTerms(keys: GeoKeys): string {
  const ct = num(keys, 'ProjCoordTransGeoKey');
  const angleUnit = num(keys, 'GeogAngularUnitsGeoKey');
  const deg = (name: string, fallback?: string): number => {
    const v = num(keys, name) ?? (fallback ? num(keys, fallback) : undefined) ?? 0;
    return angleUnit === 9101 ? (v * 180) / Math.PI : v;
  };
  const fe = num(keys, 'ProjFalseEastingGeoKey') ?? num(keys, 'ProjFalseOriginEastingGeoKey') ?? num(keys, 'ProjCenterEastingGeoKey') ?? 0;
  const fn = num(keys, 'ProjFalseNorthingGeoKey') ?? num(keys, 'ProjFalseOriginNorthingGeoKey') ?? num(keys, 'ProjCenterNorthingGeoKey') ?? 0;
  const k = num(keys, 'ProjScaleAtNatOriginGeoKey') ?? num(keys, 'ProjScaleAtCenterGeoKey') ?? 1;
  const lon0 = deg('ProjNatOriginLongGeoKey', 'ProjFalseOriginLongGeoKey');
  const lat0 = deg('ProjNatOriginLatGeoKey', 'ProjFalseOriginLatGeoKey');
  const feFn = `+x_0=${fe} +y_0=${fn}`;
  switch (ct) {
    case 1: // CT_TransverseMercator
      return `+proj=tmerc +lat_0=${lat0} +lon_0=${lon0} +k=${k} ${feFn}`;
    case 7: // CT_Mercator
      return `+proj=merc +lon_0=${lon0} +k=${k} ${feFn}`;
    case 8: // CT_LambertConfConic_2SP
      return `+proj=lcc +lat_1=${deg('ProjStdParallel1GeoKey')} +lat_2=${deg('ProjStdParallel2GeoKey')} +lat_0=${lat0} +lon_0=${lon0} ${feFn}`;
    case 9: // CT_LambertConfConic_1SP
      return `+proj=lcc +lat_1=${lat0} +lat_0=${lat0} +lon_0=${lon0} +k_0=${k} ${feFn}`;
    case 11: // CT_AlbersEqualArea
      return `+proj=aea +lat_1=${deg('ProjStdParallel1GeoKey')} +lat_2=${deg('ProjStdParallel2GeoKey')} +lat_0=${lat0} +lon_0=${lon0} ${feFn}`;
    case 15: // CT_PolarStereographic
      return `+proj=stere +lat_0=${lat0 >= 0 ? 90 : -90} +lat_ts=${lat0} +lon_0=${deg('ProjStraightVertPoleLongGeoKey', 'ProjNatOriginLongGeoKey')} +k=${k} ${feFn}`;
    default:
      throw new TerrainError('unknown-crs', `The grid uses a user-defined projection (GeoTIFF coordinate transformation ${ct ?? 'missing'}) that Loftline does not read; reproject it to a UTM zone or save it with an EPSG code.`);
  }
}

/** The first meaningful citation among the named keys (GDAL writes "unknown" when it has none). */
function citation(keys: GeoKeys, ...names: string[]): string | null {
  for (const n of names) {
    const v = keys[n];
    if (typeof v === 'string') {
      const t = v.replace(/\|$/, '').trim();
      if (t && t.toLowerCase() !== 'unknown') return t;
    }
  }
  return null;
}

/** The horizontal CRS described by a GeoTIFF's GeoKeys; throws `unknown-crs` when they do not name one we can use. */
export function crsFromGeoKeys(keys: GeoKeys | null | undefined): GridCrs {
  if (!keys || Object.keys(keys).length === 0) {
    throw new TerrainError('unknown-crs', 'The GeoTIFF has no GeoKeys, so its coordinate system is unknown; assign one (e.g. gdal_translate -a_srs EPSG:32633 in.tif out.tif).');
  }
  const model = num(keys, 'GTModelTypeGeoKey');
  const pcs = num(keys, 'ProjectedCSTypeGeoKey');
  const geog = num(keys, 'GeographicTypeGeoKey');
  if (model === 3) {
    throw new TerrainError('unknown-crs', 'The grid is in geocentric (earth-centred XYZ) coordinates; reproject it to a map or geographic CRS.');
  }
  if (pcs !== undefined && pcs !== USER_DEFINED && model !== 2) return crsFromEpsg(pcs);
  if (model === 1 || (model === undefined && pcs !== undefined)) {
    const unit = lengthUnitFromCode(num(keys, 'ProjLinearUnitsGeoKey'));
    const size = num(keys, 'ProjLinearUnitSizeGeoKey');
    const units = unit === 'foot' ? '+units=ft' : unit === 'us-survey-foot' ? '+units=us-ft' : size ? `+to_meter=${size}` : '+units=m';
    const def = `${projectionTerms(keys)} ${datumTerms(keys)} ${units} +no_defs`;
    return crsFromProj4(def, citation(keys, 'PCSCitationGeoKey', 'GTCitationGeoKey') ?? `User-defined ${def.split(' ')[0].slice(6)} projection`);
  }
  if (geog !== undefined && geog !== USER_DEFINED) return crsFromEpsg(geog);
  if (model === 2) {
    return crsFromProj4(`+proj=longlat ${datumTerms(keys)} +no_defs`, citation(keys, 'GeogCitationGeoKey') ?? 'User-defined geographic CRS');
  }
  throw new TerrainError('unknown-crs', 'The GeoKeys name neither a projected nor a geographic CRS; assign one (e.g. gdal_translate -a_srs EPSG:4326 in.tif out.tif).');
}
