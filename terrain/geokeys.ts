/** GeoTIFF GeoKeys (OGC GeoTIFF 1.1 standard, OGC 19-008r4) to a Loftline CRS and length units. */
import type { GridCrs, LengthUnit } from './grid';
import { TerrainError } from './errors';
import { crsFromEpsg, crsFromProj4, utmCrs } from './crs';
import { lookupEpsg, primeMeridianDeg, verticalCrsUnit } from './epsg-table';

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
function lengthUnitFromCode(code: number | undefined): LengthUnit | null {
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
    const unit = lengthUnitFromCode(verticalCrsUnit(vcs));
    return unit ?? 'metre';
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

function nums(keys: GeoKeys, name: string): number[] | undefined {
  const v = keys[name];
  if ((Array.isArray(v) || ArrayBuffer.isView(v)) && Array.from(v as ArrayLike<number>).every((x) => typeof x === 'number' && Number.isFinite(x))) return Array.from(v as ArrayLike<number>);
  if (typeof v === 'number' && Number.isFinite(v)) return [v];
  return undefined;
}

/** The prime meridian term (+pm=degrees) of user-defined keys, or '' for Greenwich. */
function primeMeridianTerm(keys: GeoKeys): string {
  const code = num(keys, 'GeogPrimeMeridianGeoKey');
  let lon: number | undefined;
  if (code !== undefined && code !== USER_DEFINED) {
    lon = primeMeridianDeg(code);
    if (lon === undefined) throw new TerrainError('unknown-crs', `GeogPrimeMeridianGeoKey names EPSG:${code}, which is not a prime meridian in the EPSG dataset; the file's georeference is inconsistent.`);
  } else {
    lon = num(keys, 'GeogPrimeMeridianLongGeoKey');
    if (lon !== undefined && num(keys, 'GeogAngularUnitsGeoKey') === 9101) lon = (lon * 180) / Math.PI;
  }
  return lon ? `+pm=${lon}` : '';
}

/** proj4 datum/ellipsoid terms of the geographic part of the keys (e.g. "+datum=WGS84"). */
function datumTerms(keys: GeoKeys): string {
  const geog = num(keys, 'GeographicTypeGeoKey');
  if (geog !== undefined && geog !== USER_DEFINED) {
    const base = crsFromEpsg(geog);
    if (!base.geographic) throw new TerrainError('unknown-crs', `GeographicTypeGeoKey EPSG:${geog} is not a geographic CRS; the file's georeference is inconsistent.`);
    return base.proj4.split(/\s+/).filter((t) => !/^\+(proj|no_defs|units|type)\b/.test(t)).join(' ');
  }
  const pm = primeMeridianTerm(keys);
  const datum = num(keys, 'GeogGeodeticDatumGeoKey');
  if (datum !== undefined && datum !== USER_DEFINED) {
    // a datum named by code: its geographic CRS (EPSG 4xxx = 6xxx - 2000 for the classic datums) carries PROJ's shift
    const entry = lookupEpsg(datum - 2000);
    if (datum === 6326) return `+datum=WGS84 ${pm}`.trim();
    if (!entry || !entry.proj4 || !/\+proj=longlat/.test(entry.proj4)) {
      throw new TerrainError('unknown-crs', `The GeoKeys name datum EPSG:${datum} without a geographic CRS Loftline knows for it; save the grid with an EPSG code (gdal_translate -a_srs EPSG:<code>).`);
    }
    return crsFromEpsg(datum - 2000).proj4.split(/\s+/).filter((t) => !/^\+(proj|no_defs|units|type|pm)\b/.test(t)).concat(pm ? [pm] : []).join(' ');
  }
  const towgs = nums(keys, 'GeogTOWGS84GeoKey');
  const shift = towgs && (towgs.length === 3 || towgs.length === 7) ? ` +towgs84=${towgs.join(',')}` : '';
  const ellipsoid = num(keys, 'GeogEllipsoidGeoKey');
  let ell: string;
  if (ellipsoid === 7030) ell = '+ellps=WGS84';
  else if (ellipsoid === 7019) ell = '+ellps=GRS80';
  else {
    const a = num(keys, 'GeogSemiMajorAxisGeoKey');
    const rf = num(keys, 'GeogInvFlatteningGeoKey');
    const b = num(keys, 'GeogSemiMinorAxisGeoKey');
    if (a !== undefined && rf !== undefined) ell = rf === 0 ? `+a=${a} +b=${a}` : `+a=${a} +rf=${rf}`;
    else if (a !== undefined && b !== undefined) ell = `+a=${a} +b=${b}`;
    else if (ellipsoid !== undefined && ellipsoid !== USER_DEFINED) {
      throw new TerrainError('unknown-crs', `The GeoKeys name ellipsoid EPSG:${ellipsoid} without its axes; save the grid with an EPSG code (gdal_translate -a_srs EPSG:<code>).`);
    } else {
      throw new TerrainError('unknown-crs', 'The GeoKeys define no datum or ellipsoid; save the grid with an EPSG code (e.g. gdal_translate -a_srs EPSG:32633).');
    }
  }
  if (!shift && ellipsoid !== 7030 && ellipsoid !== 7019) {
    // a datum of the file's own without TOWGS84: PROJ would apply no shift, which may be hundreds of metres off
    throw new TerrainError('unknown-crs', 'The GeoTIFF defines its own datum without a shift to WGS 84 (no GeogTOWGS84GeoKey), so it cannot be placed to better than hundreds of metres; save it with an EPSG code (gdal_translate -a_srs EPSG:<code>).');
  }
  return `${ell}${shift} ${pm}`.trim();
}

const CT_NAMES: Record<number, string> = {
  2: 'Transverse Mercator (modified Alaska)', 3: 'Hotine Oblique Mercator', 4: 'Laborde Oblique Mercator', 5: 'Rosenmund Oblique Mercator',
  6: 'spherical Oblique Mercator', 10: 'Lambert Azimuthal Equal Area', 12: 'Azimuthal Equidistant', 13: 'Equidistant Conic',
  17: 'Equirectangular', 19: 'Gnomonic', 20: 'Miller Cylindrical', 21: 'Orthographic', 22: 'Polyconic', 23: 'Robinson',
  24: 'Sinusoidal', 25: 'Van der Grinten', 26: 'New Zealand Map Grid', 28: 'Cylindrical Equal Area',
};

/** UTM zone of an EPSG projection (conversion) code: 16001-16060 north, 16101-16160 south; null otherwise. */
function utmOfProjectionCode(code: number | undefined): { zone: number; south: boolean } | null {
  if (code === undefined) return null;
  if (code >= 16001 && code <= 16060) return { zone: code - 16000, south: false };
  if (code >= 16101 && code <= 16160) return { zone: code - 16100, south: true };
  return null;
}

/**
 * A user-defined projection (ProjCoordTransGeoKey) as proj4 terms, read the way GDAL 3.6 reads the same keys
 * (frmts/gtiff/gt_wkt_srs.cpp): Mercator with ProjStdParallel1GeoKey is variant B; polar stereographic with a
 * latitude of origin of +-90 is variant A (scale factor), otherwise variant B (that latitude is the standard parallel).
 */
function projectionTerms(keys: GeoKeys): string {
  const ct = num(keys, 'ProjCoordTransGeoKey');
  const angleUnit = num(keys, 'GeogAngularUnitsGeoKey');
  const deg = (...names: string[]): number => {
    let v = 0;
    for (const n of names) {
      const x = num(keys, n);
      if (x !== undefined) { v = x; break; }
    }
    return angleUnit === 9101 ? (v * 180) / Math.PI : v;
  };
  const has = (name: string) => num(keys, name) !== undefined;
  const fe = num(keys, 'ProjFalseEastingGeoKey') ?? num(keys, 'ProjFalseOriginEastingGeoKey') ?? num(keys, 'ProjCenterEastingGeoKey') ?? 0;
  const fn = num(keys, 'ProjFalseNorthingGeoKey') ?? num(keys, 'ProjFalseOriginNorthingGeoKey') ?? num(keys, 'ProjCenterNorthingGeoKey') ?? 0;
  const k = num(keys, 'ProjScaleAtNatOriginGeoKey') ?? num(keys, 'ProjScaleAtCenterGeoKey') ?? 1;
  const lon0 = deg('ProjNatOriginLongGeoKey', 'ProjFalseOriginLongGeoKey', 'ProjCenterLongGeoKey', 'ProjStraightVertPoleLongGeoKey');
  const lat0 = deg('ProjNatOriginLatGeoKey', 'ProjFalseOriginLatGeoKey', 'ProjCenterLatGeoKey');
  const feFn = `+x_0=${fe} +y_0=${fn}`;
  const sp1 = deg('ProjStdParallel1GeoKey');
  const sp2 = has('ProjStdParallel2GeoKey') ? deg('ProjStdParallel2GeoKey') : sp1;
  if (ct === undefined) {
    const utm = utmOfProjectionCode(num(keys, 'ProjectionGeoKey'));
    if (utm) return `+proj=utm +zone=${utm.zone}${utm.south ? ' +south' : ''}`;
    const pcode = num(keys, 'ProjectionGeoKey');
    throw new TerrainError('unknown-crs', `The grid names its projection only by EPSG conversion ${pcode ?? '(none)'}, which Loftline reads only for UTM zones; save it with a projected CRS code (gdal_translate -a_srs EPSG:<code>).`);
  }
  switch (ct) {
    case 1: // CT_TransverseMercator
      return `+proj=tmerc +lat_0=${lat0} +lon_0=${lon0} +k=${k} ${feFn}`;
    case 27: // CT_TransvMercator_SouthOriented: westing and southing (EPSG method 9808)
      return `+proj=tmerc +axis=wsu +lat_0=${lat0} +lon_0=${lon0} +k=${k} ${feFn}`;
    case 7: // CT_Mercator: variant B when a standard parallel is given (EPSG 9805), else variant A (9804)
      return has('ProjStdParallel1GeoKey') ? `+proj=merc +lat_ts=${sp1} +lon_0=${lon0} ${feFn}` : `+proj=merc +lon_0=${lon0} +k=${k} ${feFn}`;
    case 8: // CT_LambertConfConic_2SP
      return `+proj=lcc +lat_1=${sp1} +lat_2=${sp2} +lat_0=${lat0} +lon_0=${lon0} ${feFn}`;
    case 9: // CT_LambertConfConic_1SP
      return `+proj=lcc +lat_1=${lat0} +lat_0=${lat0} +lon_0=${lon0} +k_0=${k} ${feFn}`;
    case 11: // CT_AlbersEqualArea
      return `+proj=aea +lat_1=${sp1} +lat_2=${sp2} +lat_0=${lat0} +lon_0=${lon0} ${feFn}`;
    case 15: { // CT_PolarStereographic: variant A (EPSG 9810) at a pole, else variant B (9829)
      const pole = lat0 >= 0 ? 90 : -90;
      const lon = deg('ProjStraightVertPoleLongGeoKey', 'ProjNatOriginLongGeoKey');
      return Math.abs(lat0) === 90
        ? `+proj=stere +lat_0=${pole} +lon_0=${lon} +k=${k} ${feFn}`
        : `+proj=stere +lat_0=${pole} +lat_ts=${lat0} +lon_0=${lon} ${feFn}`;
    }
    case 16: // CT_ObliqueStereographic (EPSG 9809, double stereographic)
      return `+proj=sterea +lat_0=${lat0} +lon_0=${lon0} +k=${k} ${feFn}`;
    case 18: // CT_CassiniSoldner
      return `+proj=cass +lat_0=${lat0} +lon_0=${lon0} ${feFn}`;
    default:
      throw new TerrainError('unknown-crs', `The grid uses a user-defined projection (GeoTIFF coordinate transformation ${ct}${CT_NAMES[ct] ? `, ${CT_NAMES[ct]}` : ''}) that Loftline does not read; reproject it to a UTM zone or save it with an EPSG code.`);
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
    const utm = num(keys, 'ProjCoordTransGeoKey') === undefined ? utmOfProjectionCode(num(keys, 'ProjectionGeoKey')) : null;
    const metres = [undefined, 9001].includes(num(keys, 'ProjLinearUnitsGeoKey'));
    // plain WGS 84 UTM declared through ProjectionGeoKey alone: the same CRS as EPSG 326zz / 327zz
    if (utm && geog === 4326 && metres) return utmCrs(utm.zone, utm.south);
    const unit = lengthUnitFromCode(num(keys, 'ProjLinearUnitsGeoKey'));
    const size = num(keys, 'ProjLinearUnitSizeGeoKey');
    const units = unit === 'foot' ? '+units=ft' : unit === 'us-survey-foot' ? '+units=us-ft' : size ? `+to_meter=${size}` : '+units=m';
    const def = `${projectionTerms(keys)} ${datumTerms(keys)} ${units} +no_defs`;
    const onEpsgDatum = geog !== undefined && geog !== USER_DEFINED ? geog : null;
    return crsFromProj4(def, citation(keys, 'PCSCitationGeoKey', 'GTCitationGeoKey') ?? `User-defined ${def.split(' ')[0].slice(6)} projection`, null, onEpsgDatum);
  }
  if (geog !== undefined && geog !== USER_DEFINED) return crsFromEpsg(geog);
  if (model === 2) {
    return crsFromProj4(`+proj=longlat ${datumTerms(keys)} +no_defs`, citation(keys, 'GeogCitationGeoKey') ?? 'User-defined geographic CRS');
  }
  throw new TerrainError('unknown-crs', 'The GeoKeys name neither a projected nor a geographic CRS; assign one (e.g. gdal_translate -a_srs EPSG:4326 in.tif out.tif).');
}
