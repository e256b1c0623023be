/** The table of flight lines: one row of figures per line, and sorting by any column (unknown values last). */
import type { OverviewLine } from '../../contracts/result-parts';
import type { StationStatus } from '../../contracts/station-status';

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

/** One row per line, from the figures the overview carries over its stations (null where no station had a value). */
export function lineRows(lines: readonly OverviewLine[]): LineRow[] {
  return lines.map((line) => {
    const d = line.digest;
    return {
      index: line.index,
      number: line.index + 1,
      lengthM: line.lengthM,
      photos: d.photos,
      gsdMinCm: d.gsdMinCm,
      gsdMedianCm: d.gsdMedianCm,
      gsdMaxCm: d.gsdMaxCm,
      forwardOverlapMin: d.forwardOverlapMin,
      sideOverlapMin: d.sideOverlapMin,
      forwardOverlapGuaranteedMin: d.forwardOverlapGuaranteedMin,
      sideOverlapGuaranteedMin: d.sideOverlapGuaranteedMin,
      aglMinM: d.aglMinM,
      legs: line.legs.length,
      flagged: d.flagged,
      worst: d.worst,
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
