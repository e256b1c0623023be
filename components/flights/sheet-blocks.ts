/**
 * The leg sheet's lines as the pilot reads them: each line of the layout on its own card, and each run of spot
 * photos (the solver flies them as one tour between two lines of the layout) as one group, so a tour of many
 * one-photo hovers does not read as as many flight lines.
 */
import type { SheetLine } from '../../contracts/flights';

export type SheetBlock =
  | { kind: 'line'; line: SheetLine }
  /** `after`/`before`: the layout lines flown either side of the tour (null at the start or end of the flight). */
  | { kind: 'spots'; spots: SheetLine[]; after: number | null; before: number | null };

/** Lines in flying order, consecutive spot photos gathered into one block. */
export function sheetBlocks(lines: readonly SheetLine[]): SheetBlock[] {
  const out: SheetBlock[] = [];
  for (const line of lines) {
    const last = out[out.length - 1];
    if (line.kind !== 'spot') {
      if (last?.kind === 'spots') last.before = line.number;
      out.push({ kind: 'line', line });
    } else if (last?.kind === 'spots') last.spots.push(line);
    else out.push({ kind: 'spots', spots: [line], after: last?.kind === 'line' ? last.line.number : null, before: null });
  }
  return out;
}

/** "Lines 7–10" or "Line 7": the plan's own numbers of a run of consecutive lines. */
export function lineRunWords(lines: readonly Pick<SheetLine, 'number'>[]): string {
  const first = lines[0]?.number;
  const last = lines[lines.length - 1]?.number;
  if (first === undefined || last === undefined) return 'No lines';
  return first === last ? `Line ${first}` : `Lines ${first}–${last}`;
}

/** Where a tour of spot photos is flown, in words: "after line 6, before line 11". */
export function tourPlaceWords(block: Extract<SheetBlock, { kind: 'spots' }>): string {
  const after = block.after === null ? 'from the takeoff point' : `after line ${block.after}`;
  const before = block.before === null ? 'before the return' : `before line ${block.before}`;
  return `${after}, ${before}`;
}
