/** The table of flight lines: one row of figures per line, and sorting by any column (unknown values last). */
import type { PlanLine } from '../../terrain/plan';
import { stationStatus, stationStatuses, type StationStatus } from './station-status';

export interface LineRow {
  index: number;
  /** Position in the flying order, 1 first. */
  number: number;
  lengthM: number;
  photos: number;
  gsdMinCm: number | null;
  gsdMedianCm: number | null;
  gsdMaxCm: number | null;
  forwardOverlapMin: number | null;
  sideOverlapMin: number | null;
  /** The same under the mission's attitude envelope (null without one: as planned only). */
  forwardOverlapGuaranteedMin: number | null;
  sideOverlapGuaranteedMin: number | null;
  aglMinM: number | null;
  legs: number;
  /** Stations that miss a target. */
  flagged: number;
  /** The worst station status on the line ('meets' when none misses a target). */
  worst: StationStatus;
  /** Line warnings and unmet stretches, in words. */
  warnings: string[];
}

export type LineSortKey = Exclude<keyof LineRow, 'index' | 'warnings' | 'worst'> | 'warningCount';

function median(sorted: number[]): number | null {
  if (sorted.length === 0) return null;
  const m = sorted.length >> 1;
  return sorted.length % 2 ? sorted[m] : (sorted[m - 1] + sorted[m]) / 2;
}

function minOf(values: Array<number | null>): number | null {
  let m = Infinity;
  for (const v of values) if (v !== null && v < m) m = v;
  return m === Infinity ? null : m;
}

/** One row per line, figures over its stations (null where no station had a value). */
export function lineRows(lines: readonly PlanLine[]): LineRow[] {
  return lines.map((line) => {
    const gsd = line.stations.map((s) => s.gsdCm).filter((v): v is number => v !== null).sort((a, b) => a - b);
    return {
      index: line.index,
      number: line.index + 1,
      lengthM: line.lengthM,
      photos: line.stations.length,
      gsdMinCm: gsd.length ? gsd[0] : null,
      gsdMedianCm: median(gsd),
      gsdMaxCm: gsd.length ? gsd[gsd.length - 1] : null,
      forwardOverlapMin: minOf(line.stations.map((s) => s.forwardOverlap)),
      sideOverlapMin: minOf(line.stations.map((s) => s.sideOverlap)),
      forwardOverlapGuaranteedMin: minOf(line.stations.map((s) => s.forwardOverlapGuaranteed ?? null)),
      sideOverlapGuaranteedMin: minOf(line.stations.map((s) => s.sideOverlapGuaranteed ?? null)),
      // the legs flown between photos too, as the report counts them
      aglMinM: minOf([...line.stations.map((s) => s.aglM), ...line.legs.map((g) => g.aglMinM)]),
      legs: line.legs.length,
      flagged: line.stations.filter((s) => stationStatus(s) !== 'meets').length,
      worst: line.stations.reduce<StationStatus>((w, s) => {
        const st = stationStatus(s);
        return stationStatuses.indexOf(st) < stationStatuses.indexOf(w) ? st : w;
      }, 'meets'),
      warnings: [...line.warnings.map((w) => w.message), ...line.unmet.map((u) => u.message)],
    };
  });
}

function value(row: LineRow, key: LineSortKey): number | null {
  return key === 'warningCount' ? row.warnings.length : row[key];
}

/** Rows sorted by `key` (ties by flying order); rows without a value go last in either direction. Does not mutate. */
export function sortLineRows(rows: readonly LineRow[], key: LineSortKey, dir: 'asc' | 'desc'): LineRow[] {
  const sign = dir === 'asc' ? 1 : -1;
  return [...rows].sort((a, b) => {
    const va = value(a, key);
    const vb = value(b, key);
    if (va === null && vb === null) return a.number - b.number;
    if (va === null) return 1;
    if (vb === null) return -1;
    return va === vb ? a.number - b.number : (va - vb) * sign;
  });
}
