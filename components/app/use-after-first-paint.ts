/**
 * False for a screen's first drawing, true just after the browser has painted it: long screens draw what the user
 * needs first (the leg sheet's first line), and the rest in a second pass that no longer delays it. On the pilot's
 * reload from the device the whole sheet took about 0.5 s to draw; its first line alone a fraction of that.
 */
import { useEffect, useState } from 'react';

/** A hidden tab gets no animation frames; the rest is drawn after this long all the same. */
const latestMs = 200;

export function useAfterFirstPaint(): boolean {
  const [after, setAfter] = useState(false);
  useEffect(() => {
    if (after) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    // An animation frame runs just before the next paint; a timeout queued from it runs once that paint is done.
    const frame = requestAnimationFrame(() => {
      timer = setTimeout(() => setAfter(true), 0);
    });
    const fallback = setTimeout(() => setAfter(true), latestMs);
    return () => {
      cancelAnimationFrame(frame);
      clearTimeout(fallback);
      if (timer) clearTimeout(timer);
    };
  }, [after]);
  return after;
}
