/** The as-flown check in the crew's words: missed triggers as runs of stations per line, lines off track. */
import type { AsFlownDoc } from './as-flown';

/** [{line 5, station 12}, {5, 13}, {5, 14}, {9, 3}] → ["line 5, stations 12–14", "line 9, station 3"]. */
export function missedRuns(missed: AsFlownDoc['matching']['missed']): string[] {
  const sorted = [...missed].sort((a, b) => a.line - b.line || a.station - b.station);
  const out: string[] = [];
  let i = 0;
  while (i < sorted.length) {
    let j = i;
    while (j + 1 < sorted.length && sorted[j + 1].line === sorted[i].line && sorted[j + 1].station === sorted[j].station + 1) j++;
    const a = sorted[i], b = sorted[j];
    out.push(a.station === b.station ? `line ${a.line}, station ${a.station}` : `line ${a.line}, stations ${a.station}–${b.station}`);
    i = j + 1;
  }
  return out;
}

/** Lines flown off track, with how far across at worst: ["line 3 (up to 7.2 m across)"]. */
export function offTrackLines(lines: AsFlownDoc['matching']['lines']): string[] {
  return lines.filter((l) => l.offTrack).map((l) => `line ${l.line}${l.crossTrackMaxAbsM === null ? '' : ` (up to ${l.crossTrackMaxAbsM.toFixed(1)} m across)`}`);
}
