/** The site's metadata as label/value lines for the table, in the project's display units. */
import type { UnitSystem } from '../../contracts/projects';
import { formatLength, formatPercent } from '../projects/units';
import { surfaceKindInfo, type Site } from './site-shape';
import { formatBytes } from '../../contracts/format/bytes';

export interface SiteFact {
  key: string;
  label: string;
  value: string;
}

/** The horizontal unit of a CRS from its proj4 definition: degrees for longlat, else the +units (metres by default). */
export function horizontalUnitOf(proj4: string): 'degree' | 'm' | 'ft' | 'US ft' {
  if (/\+proj=longlat\b/.test(proj4)) return 'degree';
  if (/\+units=us-ft\b/.test(proj4)) return 'US ft';
  if (/\+units=ft\b/.test(proj4)) return 'ft';
  return 'm';
}

const num = (v: number, digits: number) => v.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
const lat = (v: number) => `${num(Math.abs(v), 5)}° ${v >= 0 ? 'N' : 'S'}`;
const lon = (v: number) => `${num(Math.abs(v), 5)}° ${v >= 0 ? 'E' : 'W'}`;

/** Every fact the site page lists, in order. */
export function siteFacts(site: Site, units: UnitSystem): SiteFact[] {
  const m = site.metadata;
  const hu = horizontalUnitOf(m.crs.proj4);
  const [dx, dy] = m.resolution;
  const [x0, y0, x1, y1] = m.bounds;
  const [lon0, lat0, lon1, lat1] = m.boundsWgs84;
  const res = hu === 'degree' ? `${num(dx * 3600, 2)}″ × ${num(dy * 3600, 2)}″ (arc seconds)` : `${num(dx, 3)} × ${num(dy, 3)} ${hu}`;
  const extent = hu === 'degree' ? `${num(x1 - x0, 5)}° × ${num(y1 - y0, 5)}°` : `${num(x1 - x0, 0)} × ${num(y1 - y0, 0)} ${hu}`;
  const e = m.elevation;
  const range = e.min === null || e.max === null ? 'No known heights' : `${formatLength(e.min, units, 1)} to ${formatLength(e.max, units, 1)} (mean ${formatLength(e.mean, units, 1)})`;
  return [
    { key: 'crs', label: 'Coordinate system', value: `${m.crs.name}${m.crs.epsg ? ` (EPSG:${m.crs.epsg})` : ' (no EPSG code)'}` },
    { key: 'size', label: 'Size', value: `${m.width.toLocaleString('en-GB')} × ${m.height.toLocaleString('en-GB')} pixels` },
    { key: 'resolution', label: 'Resolution', value: res },
    { key: 'extent', label: 'Extent', value: `${extent}; x ${num(x0, 2)} to ${num(x1, 2)}, y ${num(y0, 2)} to ${num(y1, 2)}` },
    { key: 'extent-wgs84', label: 'Extent (WGS 84)', value: `${lon(lon0)} to ${lon(lon1)}, ${lat(lat0)} to ${lat(lat1)}` },
    { key: 'elevation', label: 'Elevation range', value: range },
    { key: 'nodata', label: 'Without data', value: `${formatPercent(m.nodataShare, 1)} of the pixels` },
    { key: 'datum', label: 'Vertical datum', value: site.verticalDatum },
    { key: 'surface', label: 'Surface kind', value: `${surfaceKindInfo[site.surfaceKind].label}, as stated at upload` },
    { key: 'vertical-unit', label: 'Heights stored in', value: m.verticalUnit === 'metre' ? 'metres' : `${m.verticalUnit} (shown converted)` },
    { key: 'file', label: 'File', value: `${site.fileName} · ${formatBytes(site.sizeBytes)}` },
    // Groups of 8 hex digits, so the 64-digit checksum wraps on a phone and can be compared by eye.
    { key: 'checksum', label: 'SHA-256', value: site.sha256.replace(/(.{8})(?=.)/g, '$1 ') },
  ];
}
