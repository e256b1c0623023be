/** How a station stands against the targets: one status per photo, with a colour, a marker shape and words for each. */
import type { PlanStation } from '../../terrain/plan';

/** Our status scheme, worst first: a station takes the first status any of its flags calls for. */
export const stationStatuses = ['unknown', 'height', 'gsd', 'overlap', 'meets'] as const;
export type StationStatus = (typeof stationStatuses)[number];

/** Marker shapes: the status reads from the shape alone, so colour is never the only cue. */
export type MarkerShape = 'circle' | 'square' | 'triangle' | 'diamond' | 'cross';

interface StatusLook {
  label: string;
  /** One sentence for the legend. */
  meaning: string;
  shape: MarkerShape;
  /**
   * Fill colour. Hues from the Okabe–Ito palette (M. Okabe and K. Ito, "Color Universal Design", 2008), chosen
   * because they stay apart for the common colour-vision deficiencies; every marker also has an ink outline.
   */
  color: string;
}

export const statusLooks: Record<StationStatus, StatusLook> = {
  meets: { label: 'Meets targets', meaning: 'GSD in the band, overlaps at or above target, height within limits.', shape: 'circle', color: '#0072B2' },
  overlap: { label: 'Overlap short', meaning: 'Forward or side overlap below the target over this ground, as planned or under the attitude envelope.', shape: 'square', color: '#E69F00' },
  gsd: { label: 'GSD off band', meaning: 'GSD coarser or finer than the tolerance band allows.', shape: 'triangle', color: '#D55E00' },
  height: { label: 'Height limit', meaning: 'Below the clearance or above the maximum height above ground.', shape: 'diamond', color: '#CC79A7' },
  unknown: { label: 'No ground data', meaning: 'Nodata or off the grid under the photo: nothing could be checked.', shape: 'cross', color: '#000000' },
};

const statusOfFlag: Record<string, StationStatus> = {
  'ground-unknown': 'unknown',
  'footprint-off-grid': 'unknown',
  'below-clearance': 'height',
  'above-max-agl': 'height',
  'gsd-coarse': 'gsd',
  'gsd-fine': 'gsd',
  'forward-overlap-low': 'overlap',
  'side-overlap-low': 'overlap',
  'forward-overlap-envelope': 'overlap',
  'side-overlap-envelope': 'overlap',
};

/** The worst status among the station's flags ('meets' with none; an unknown flag code counts as 'unknown'). */
export function stationStatus(station: Pick<PlanStation, 'flags'>): StationStatus {
  let worst = stationStatuses.length - 1;
  for (const f of station.flags) {
    const s = statusOfFlag[f.code] ?? 'unknown';
    worst = Math.min(worst, stationStatuses.indexOf(s));
  }
  return stationStatuses[worst];
}

/** How many stations have each status. */
export function countStatuses(stations: ReadonlyArray<Pick<PlanStation, 'flags'>>): Record<StationStatus, number> {
  const out: Record<StationStatus, number> = { unknown: 0, height: 0, gsd: 0, overlap: 0, meets: 0 };
  for (const s of stations) out[stationStatus(s)]++;
  return out;
}
