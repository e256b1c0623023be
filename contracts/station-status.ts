/** How a station stands against the targets: one status per photo, worst first, shared by the server's result parts and the screens. */
import type { z } from 'zod';
import type { planStationSchema } from './plan-result';

type StationFlags = Pick<z.infer<typeof planStationSchema>, 'flags'>;

/** Our status scheme, worst first: a station takes the first status any of its flags calls for. */
export const stationStatuses = ['unknown', 'height', 'gsd', 'overlap', 'meets'] as const;
export type StationStatus = (typeof stationStatuses)[number];

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
export function stationStatus(station: StationFlags): StationStatus {
  let worst = stationStatuses.length - 1;
  for (const f of station.flags) {
    const s = statusOfFlag[f.code] ?? 'unknown';
    worst = Math.min(worst, stationStatuses.indexOf(s));
  }
  return stationStatuses[worst];
}

/** How many stations have each status. */
export function countStatuses(stations: ReadonlyArray<StationFlags>): Record<StationStatus, number> {
  const out: Record<StationStatus, number> = { unknown: 0, height: 0, gsd: 0, overlap: 0, meets: 0 };
  for (const s of stations) out[stationStatus(s)]++;
  return out;
}
