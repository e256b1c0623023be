/** The compliance report's figures as label/value pairs, in the order the screen and the PDF print them. */
import type { ComplianceReport, ReportLine, StationStats } from '../../contracts/reports';
import { formatCount, formatDuration, formatGsd, formatLength, formatPercent } from '../projects/units';

export type Figure = { key: string; label: string; value: string };

/** Degrees from true north as a three-digit bearing ("094° true"), a dash when unknown. */
export function formatHeading(deg: number | null | undefined): string {
  if (deg === null || deg === undefined || !Number.isFinite(deg)) return '–';
  const d = ((Math.round(deg) % 360) + 360) % 360;
  return `${String(d).padStart(3, '0')}° true`;
}

/** The station figures every line and the whole plan share. */
function statsFigures(s: StationStats): Figure[] {
  return [
    // figures against a target are rounded toward failing (contracts/target-rounding.ts)
    { key: 'share', label: 'Stations meeting the GSD target', value: formatPercent(s.shareMeetingGsd, 1, 'min') },
    { key: 'gsd-min', label: 'GSD min', value: formatGsd(s.gsdCm.min, 2, 'min') },
    { key: 'gsd-p5', label: 'GSD 5th percentile', value: formatGsd(s.gsdCm.p5) },
    { key: 'gsd-median', label: 'GSD median', value: formatGsd(s.gsdCm.median) },
    { key: 'gsd-max', label: 'GSD max', value: formatGsd(s.gsdCm.max, 2, 'max') },
    { key: 'forward-min', label: 'Forward overlap min', value: formatPercent(s.forwardOverlapMin, 1, 'min') },
    { key: 'side-min', label: 'Side overlap min', value: formatPercent(s.sideOverlapMin, 1, 'min') },
    { key: 'agl-min', label: 'Height above ground min', value: formatLength(s.aglMinM, 'metric', 1, 'min') },
    { key: 'agl-max', label: 'Height above ground max', value: formatLength(s.aglMaxM, 'metric', 1, 'max') },
    {
      key: 'known',
      label: 'Stations with known ground',
      value: `${formatCount(s.knownCount)} of ${formatCount(s.stationCount)}`,
    },
  ];
}

/** Overall: the plan's size first, then the station figures. */
export function overallFigures(o: ComplianceReport['overall']): Figure[] {
  return [
    { key: 'lines', label: 'Flight lines', value: formatCount(o.lineCount) },
    { key: 'photos', label: 'Photos', value: formatCount(o.photoCount) },
    { key: 'time', label: 'Flight time', value: formatDuration(o.flightTimeS) },
    ...statsFigures(o),
  ];
}

const slash = (values: Array<string>) => values.join(' / ');
const bare = (s: string) => s.replace(/ (cm|%|m)$/, '');

/** One line, compact (fifteen lines must stay readable): related figures share a cell, GSD as min / p5 / median / max. */
export function lineFigures(l: ReportLine): Figure[] {
  const legs = `${formatCount(l.legCount)} ${l.legCount === 1 ? 'leg' : 'legs'}`;
  return [
    { key: 'line', label: 'Length · heading · legs', value: `${formatLength(l.lengthM, 'metric')} · ${formatHeading(l.headingDeg)} · ${legs}` },
    { key: 'share', label: 'Stations meeting the GSD target', value: formatPercent(l.shareMeetingGsd, 1, 'min') },
    {
      key: 'gsd',
      label: 'GSD min / p5 / median / max',
      value: `${slash([formatGsd(l.gsdCm.min, 2, 'min'), formatGsd(l.gsdCm.p5), formatGsd(l.gsdCm.median), formatGsd(l.gsdCm.max, 2, 'max')].map(bare))} cm`,
    },
    { key: 'overlap', label: 'Overlap min, forward / side', value: `${slash([l.forwardOverlapMin, l.sideOverlapMin].map((v) => bare(formatPercent(v, 1, 'min'))))} %` },
    { key: 'agl', label: 'Height above ground', value: `${bare(formatLength(l.aglMinM, 'metric', 1, 'min'))} – ${formatLength(l.aglMaxM, 'metric', 1, 'max')}` },
    { key: 'known', label: 'Stations with known ground', value: `${formatCount(l.knownCount)} of ${formatCount(l.stationCount)}` },
  ];
}

/** The spec as the client stated it. */
export function specFigures(spec: ComplianceReport['spec']): Figure[] {
  return [
    { key: 'target', label: 'Target GSD', value: `${formatGsd(spec.targetGsdCm)} ± ${formatPercent(spec.gsdTolerance)}` },
    { key: 'band', label: 'Accepted GSD band', value: `${formatGsd(spec.gsdBandCm[0])} – ${formatGsd(spec.gsdBandCm[1])}` },
    { key: 'forward', label: 'Forward overlap', value: formatPercent(spec.forwardOverlap) },
    { key: 'side', label: 'Side overlap', value: formatPercent(spec.sideOverlap) },
    { key: 'clearance', label: 'Clearance above ground', value: formatLength(spec.clearanceM, 'metric') },
    { key: 'obstacles', label: 'Obstacle allowance', value: formatLength(spec.obstacleAllowanceM, 'metric') },
    { key: 'max-agl', label: 'Height limit above ground', value: formatLength(spec.maxAglM, 'metric') },
    { key: 'mode', label: 'Altitude mode', value: spec.altitudeMode },
  ];
}

/** The elevation grid the analysis used. */
export function demFigures(dem: ComplianceReport['dem']): Figure[] {
  const [lo, hi] = dem.elevationRangeM;
  const res = `${dem.resolution[0].toLocaleString('en-GB', { maximumFractionDigits: 3 })} × ${dem.resolution[1].toLocaleString('en-GB', { maximumFractionDigits: 3 })} ${dem.resolutionUnit}`;
  return [
    { key: 'site', label: 'Elevation grid', value: dem.siteName },
    { key: 'file', label: 'File', value: dem.fileName },
    { key: 'crs', label: 'Coordinate system', value: dem.crs.epsg ? `${dem.crs.name} (EPSG:${dem.crs.epsg})` : dem.crs.name },
    { key: 'resolution', label: 'Resolution', value: res },
    { key: 'datum', label: 'Vertical datum', value: dem.verticalDatum },
    { key: 'surface', label: 'Surface', value: dem.surfaceKind === 'bare-earth' ? 'Bare earth (no trees, masts or buildings)' : 'Surface model (includes what stands on the ground)' },
    { key: 'range', label: 'Elevation range', value: lo === null || hi === null ? '–' : `${formatLength(lo, 'metric', 1)} – ${formatLength(hi, 'metric', 1)}` },
  ];
}

/** "2–4 cm" for an advisory accuracy range, or a dash. */
export function formatRangeCm(r: readonly [number, number] | null): string {
  if (!r) return '–';
  return `${r[0].toLocaleString('en-GB', { maximumFractionDigits: 1 })}–${r[1].toLocaleString('en-GB', { maximumFractionDigits: 1 })} cm`;
}
