/**
 * What is wrong with an analysed plan and where, for the top of the results: photos off target by status, the
 * stretches where the GSD band or the height limit is not held by reason, and each kind of line warning, each
 * naming its lines; plan-wide warnings once each. Pure, so it is tested without React.
 */
import type { ResultOverview } from '../../contracts/result-parts';
import { statusLooks } from './station-status';
import type { StationStatus } from '../../contracts/station-status';
import { lineLengthWords, unmetByReasonWords } from '../../terrain/unmet-words';

interface AttentionItem {
  key: string;
  /** What is wrong, in words. */
  title: string;
  /** Flight line numbers (1-based, as on the leg sheet) where it is; empty for plan-wide items. */
  lines: number[];
  /** The status whose marker shape stands beside it (photos only). */
  status?: Exclude<StationStatus, 'meets'>;
}

/** The standing cautions, shown once by FlightCautions, never as findings. */
export const standingWarningCodes = new Set(['bare-earth', 'local-rules', 'wind']);
/** Plan-wide warnings this summary says in its own items (so no warning is said twice). */
const summarisedCodes = new Set(['band-not-held', 'stations-flagged']);

/** Kinds of line warning, in words (each line's own sentence is shown with its chart). */
const lineWarningWords: Record<string, string> = {
  'short-leg': 'Legs shorter than the shortest-leg setting',
  'ground-unknown': 'Ground samples with no elevation data (heights carried over from neighbours)',
};

/** Line numbers as short runs: [1, 2, 3, 5] → "lines 1–3, 5"; [4] → "line 4". */
export function lineList(numbers: readonly number[]): string {
  const ns = [...new Set(numbers)].sort((a, b) => a - b);
  const runs: string[] = [];
  for (let i = 0; i < ns.length; ) {
    let j = i;
    while (j + 1 < ns.length && ns[j + 1] === ns[j] + 1) j++;
    runs.push(j === i ? String(ns[i]) : j === i + 1 ? `${ns[i]}, ${ns[j]}` : `${ns[i]}–${ns[j]}`);
    i = j + 1;
  }
  return `${ns.length === 1 ? 'line' : 'lines'} ${runs.join(', ')}`;
}

const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en-GB')} ${n === 1 ? one : many}`;

/** The findings of a plan result, worst first; an empty list when nothing is wrong. */
export function attentionItems(result: Pick<ResultOverview, 'lines' | 'warnings'>): AttentionItem[] {
  const out: AttentionItem[] = [];
  // photos off target, by their worst status (the same scheme as the map's markers)
  const byStatus = new Map<StationStatus, { count: number; lines: Set<number> }>();
  for (const l of result.lines) {
    for (const st of ['unknown', 'height', 'gsd', 'overlap'] as const) {
      const count = l.digest.statusCounts[st] ?? 0;
      if (count === 0) continue;
      const e = byStatus.get(st) ?? { count: 0, lines: new Set<number>() };
      e.count += count;
      e.lines.add(l.index + 1);
      byStatus.set(st, e);
    }
  }
  for (const st of ['unknown', 'height', 'gsd', 'overlap'] as const) {
    const e = byStatus.get(st);
    // the legend beside the map says what each status means; here the count and the lines
    if (e) out.push({ key: `photos-${st}`, title: `${statusLooks[st].label}: ${plural(e.count, 'photo')}.`, lines: [...e.lines], status: st });
  }
  // stretches off the band, by reason
  const byReason = new Map<string, { m: number; lines: Set<number> }>();
  for (const l of result.lines) {
    for (const u of l.unmet) {
      const e = byReason.get(u.reason) ?? { m: 0, lines: new Set<number>() };
      e.m += u.endM - u.startM;
      e.lines.add(l.index + 1);
      byReason.set(u.reason, e);
    }
  }
  // one item: the total, then each reason with its length, largest first
  if (byReason.size > 0) {
    const total = [...byReason.values()].reduce((t, e) => t + e.m, 0);
    const reasons = unmetByReasonWords(new Map([...byReason].map(([r, e]) => [r, e.m])));
    out.push({ key: 'unmet', title: `GSD band or height limit not held over ${lineLengthWords(total)} of line: ${reasons}.`, lines: [...new Set([...byReason.values()].flatMap((e) => [...e.lines]))] });
  }
  // line warnings, by kind
  const byCode = new Map<string, Set<number>>();
  for (const l of result.lines) for (const w of l.warnings) byCode.set(w.code, (byCode.get(w.code) ?? new Set<number>()).add(l.index + 1));
  for (const [code, lines] of byCode) out.push({ key: `line-${code}`, title: `${lineWarningWords[code] ?? 'Line warnings'}.`, lines: [...lines] });
  // plan-wide warnings not said above, once each
  const lineMessages = new Set(result.lines.flatMap((l) => l.warnings.map((w) => w.message)));
  for (const w of result.warnings) {
    if (standingWarningCodes.has(w.code) || summarisedCodes.has(w.code) || lineMessages.has(w.message)) continue;
    out.push({ key: `plan-${w.code}-${out.length}`, title: w.message, lines: [] });
  }
  return out;
}
