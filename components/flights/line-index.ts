/** The leg sheet's line index: one short entry per line, and the anchor each entry scrolls to. */
import { Platform } from 'react-native';
import type { LegSheet } from '../../contracts/flights';
import { formatCount, formatLength } from '../projects/units';
import { lineRunWords, sheetBlocks } from './sheet-blocks';

type LineIndexEntry = {
  number: number;
  /** "Line 3", or "4 spot photos" for a tour of them */
  title: string;
  /** "2 legs · 41 photos", or "Lines 7–10" */
  counts: string;
  /** "starts 62 m above takeoff": the height the pilot sets first, with its reference ("at 35–70 m above takeoff" for spots). */
  start: string;
  /** The id of the line's card, as the web page carries it. */
  anchorId: string;
  /** line-index-N, or line-index-spots-N for a tour of spot photos (N its first line). */
  testID: string;
};

const plural = (n: number, one: string, many: string) => `${formatCount(n)} ${n === 1 ? one : many}`;

/** The element id of line `n`'s card (React Native Web turns `nativeID` into the DOM id). */
export const lineAnchorId = (n: number) => `sheet-line-${n}`;

/** One entry per line of the layout, and one per tour of spot photos (as the sheet groups them). */
export function lineIndexEntries(sheet: Pick<LegSheet, 'lines' | 'units'>): LineIndexEntry[] {
  return sheetBlocks(sheet.lines).map((b) => {
    if (b.kind === 'spots') {
      const first = b.spots[0]!.number;
      const heights = b.spots.flatMap((s) => (s.legs[0] ? [s.legs[0].altitudeAboveTakeoffM.start] : []));
      const lo = heights.length ? formatLength(Math.min(...heights), sheet.units) : null;
      const hi = heights.length ? formatLength(Math.max(...heights), sheet.units) : null;
      return {
        number: first,
        title: plural(b.spots.length, 'spot photo', 'spot photos'),
        counts: lineRunWords(b.spots),
        start: lo === null ? 'no legs' : lo === hi ? `at ${lo} above takeoff` : `at ${lo} to ${hi} above takeoff`,
        anchorId: lineAnchorId(first),
        testID: `line-index-spots-${first}`,
      };
    }
    const line = b.line;
    const first = line.legs[0];
    return {
      number: line.number,
      title: `Line ${line.number}${line.set ? ` · set ${line.set}` : ''}`,
      counts: `${plural(line.legs.length, 'leg', 'legs')} · ${plural(line.photoCount, 'photo', 'photos')}`,
      start: first ? `starts ${formatLength(first.altitudeAboveTakeoffM.start, sheet.units)} above takeoff` : 'no legs',
      anchorId: lineAnchorId(line.number),
      testID: `line-index-${line.number}`,
    };
  });
}

/**
 * Bring a line's card to the top of the screen's scroll area and move keyboard focus to it, so a screen reader
 * continues from there too. Web only: the native app has no DOM (and the sheet is read in the browser).
 */
export function scrollToLine(anchorId: string): void {
  if (Platform.OS !== 'web' || typeof document === 'undefined') return;
  const el = document.getElementById(anchorId);
  if (!el) return;
  el.scrollIntoView({ block: 'start', behavior: 'auto' });
  if (!el.hasAttribute('tabindex')) el.setAttribute('tabindex', '-1');
  el.focus({ preventScroll: true });
}
