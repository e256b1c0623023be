/** State of the results view: which line is shown, how the table is sorted, and the overview's shapes. */
import { useMemo, useState } from 'react';
import type { ResultOverview } from '../../contracts/result-parts';
import { stationStatuses, type StationStatus } from '../../contracts/station-status';
import type { ImageGeoref } from '../map/image-georef';
import { lineRows, sortLineRows, type LineSortKey } from './line-rows';
import { nearestLine, overviewShapes, overviewView } from './overview-shapes';

/** Taps this close (image pixels) to a line select it. */
const tapReachPx = 12;

/** The line shown first: the one with the most photos off target (ties: flying order), where a planner looks first. */
function firstLineToShow(result: ResultOverview): number | null {
  const rows = lineRows(result.lines);
  if (rows.length === 0) return null;
  return sortLineRows(rows, 'flagged', 'desc')[0].index;
}

export function useResultsView(result: ResultOverview, area: number[][][] | null, georef: ImageGeoref) {
  const [sortKey, setSortKey] = useState<LineSortKey>('number');
  const [sortDir, setSortDir] = useState<'asc' | 'desc'>('asc');
  const [selected, setSelected] = useState<number | null>(() => firstLineToShow(result));
  /** How many times a person chose a line (the screen brings the chart into view on each). */
  const [chooseCount, setChooseCount] = useState(0);
  const choose = (index: number) => {
    setSelected(index);
    setChooseCount((n) => n + 1);
  };
  const rows = useMemo(() => lineRows(result.lines), [result]);
  const sorted = useMemo(() => sortLineRows(rows, sortKey, sortDir), [rows, sortKey, sortDir]);
  const counts = useMemo(() => {
    const out = Object.fromEntries(stationStatuses.map((st) => [st, 0])) as Record<StationStatus, number>;
    for (const l of result.lines) for (const st of stationStatuses) out[st] += l.digest.statusCounts[st] ?? 0;
    return out;
  }, [result]);
  const shapes = useMemo(() => overviewShapes(result, area, georef, selected), [result, area, georef, selected]);
  const view = useMemo(() => overviewView(result, area, georef), [result, area, georef]);
  const onSort = (key: LineSortKey) => {
    if (key === sortKey) setSortDir(sortDir === 'asc' ? 'desc' : 'asc');
    else {
      setSortKey(key);
      setSortDir(key === 'number' ? 'asc' : 'desc');
    }
  };
  const onMapTap = (xPx: number, yPx: number) => {
    const hit = nearestLine(result, georef, [xPx, yPx], tapReachPx * ((view[2] - view[0]) / 600));
    if (hit !== null) choose(hit);
  };
  const selectedLine = result.lines.find((l) => l.index === selected) ?? null;
  return { rows: sorted, sortKey, sortDir, onSort, selected, setSelected, choose, chooseCount, selectedLine, counts, shapes, view, onMapTap };
}
