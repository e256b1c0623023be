/** The leg sheet's line index: one short entry per line, and the anchor each entry scrolls to. */
import { Platform } from 'react-native';
import type { LegSheet } from '../../contracts/flights';
import { formatCount, formatLength } from '../projects/units';

type LineIndexEntry = {
  number: number;
  /** "Line 3" */
  title: string;
  /** "2 legs · 41 photos" */
  counts: string;
  /** "starts 62 m above takeoff": the height the pilot sets first, with its reference. */
  start: string;
  /** The id of the line's card, as the web page carries it. */
  anchorId: string;
};

/** The element id of line `n`'s card (React Native Web turns `nativeID` into the DOM id). */
export const lineAnchorId = (n: number) => `sheet-line-${n}`;

export function lineIndexEntries(sheet: Pick<LegSheet, 'lines' | 'units'>): LineIndexEntry[] {
  return sheet.lines.map((line) => {
    const first = line.legs[0];
    return {
      number: line.number,
      title: `Line ${line.number}`,
      counts: `${formatCount(line.legs.length)} ${line.legs.length === 1 ? 'leg' : 'legs'} · ${formatCount(line.photoCount)} photos`,
      start: first ? `starts ${formatLength(first.altitudeAboveTakeoffM.start, sheet.units)} above takeoff` : 'no legs',
      anchorId: lineAnchorId(line.number),
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
