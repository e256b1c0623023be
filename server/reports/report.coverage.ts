/**
 * The coverage run in the compliance report: the spec checked in every ground cell, one requirement per item
 * (met only when the whole area meets it), and why a version has no run. A refused run is an unmet requirement
 * with its reason, never a silent pass.
 */
import { storedCoverageSchema, type StoredCoverage } from '../../contracts/coverage';
import { areaWords, basisWords, itemTitle, shareWords, specWords } from '../../contracts/coverage-words';
import type { ReportCoverage, SpecCheck } from '../../contracts/reports';

/** Most patches the report lists. */
const REPORT_PATCHES = 10;

function stored(raw: unknown): StoredCoverage | null {
  if (raw === null || raw === undefined) return null;
  return storedCoverageSchema.parse(raw);
}

/** The report's coverage section. */
export function reportCoverage(raw: unknown): ReportCoverage {
  const c = stored(raw);
  const empty = { spec: null, cellM: null, areaM2: null, items: [], shareAll: null, patchCount: 0, patches: [] };
  if (!c) return { state: 'none', note: 'This version was analysed before Loftline checked the spec in every ground cell; run the plan again for a version with its coverage.', ...empty };
  if (c.state === 'refused') return { state: 'refused', note: `The coverage run was refused: ${c.reason}`, ...empty };
  const d = c.document;
  return {
    state: 'ready',
    note: basisWords(d.envelope),
    spec: specWords(d.spec),
    cellM: d.raster.cellM,
    areaM2: d.compliance.areaM2,
    items: d.compliance.items.map((it) => ({ item: it.item, title: itemTitle(it.item, d.spec), share: it.share, failingAreaM2: it.failingAreaM2 })),
    shareAll: d.compliance.shareAll,
    patchCount: d.patchCount,
    patches: d.patches.slice(0, REPORT_PATCHES).map((p) => ({ message: p.message, areaM2: p.areaM2, lon: p.centroid.lon, lat: p.centroid.lat })),
  };
}

/** One requirement per spec item over every cell; a refused run is one unmet requirement naming why. */
export function coverageChecks(raw: unknown): SpecCheck[] {
  const c = stored(raw);
  if (!c) return [];
  if (c.state === 'refused') {
    return [{ key: 'cells', label: 'Spec in every ground cell', required: 'the coverage of every ground cell computed', achieved: `not computed: ${c.reason}`, pass: false }];
  }
  const d = c.document;
  const basis = d.envelope ? `guaranteed under ±${d.envelope.rollDeg}° roll, ±${d.envelope.pitchDeg}° pitch` : 'at the planned attitude';
  return d.compliance.items.map((it) => ({
    key: `cells-${it.item}`,
    label: `Every ground cell: ${itemTitle(it.item, d.spec)}`,
    required: `100 % of the area (${d.raster.cellM} m cells, ${basis})`,
    achieved: `${shareWords(it.share)} of the area${it.failingAreaM2 > 0 ? `; ${areaWords(it.failingAreaM2)} short` : ''}`,
    pass: it.share >= 1,
  }));
}
