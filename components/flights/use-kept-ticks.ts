/**
 * The pre-flight checklist's ticks, kept on the device for the rest of the day: a reload or a dropped signal on
 * site keeps what the pilot already checked, but a list ticked on another day starts empty again (the wind, the
 * site and the aircraft have to be checked afresh).
 */
import { useEffect, useState } from 'react';

const keyOf = (versionId: string) => `loftline.checklist.${versionId}`;
/** The device's calendar day, as the pilot on site counts days. */
const today = () => new Date().toLocaleDateString('en-CA');

function storage(): Storage | null {
  try {
    return typeof window !== 'undefined' && window.localStorage ? window.localStorage : null;
  } catch {
    return null;
  }
}

export function useKeptTicks(versionId: string) {
  const [done, setDone] = useState<ReadonlySet<string>>(new Set());
  const [loaded, setLoaded] = useState(false);
  // Read after mount: storage does not exist while the page is pre-rendered.
  useEffect(() => {
    try {
      const kept = JSON.parse(storage()?.getItem(keyOf(versionId)) ?? 'null') as { day?: string; ids?: unknown } | null;
      if (kept?.day === today() && Array.isArray(kept.ids)) setDone(new Set(kept.ids.filter((x): x is string => typeof x === 'string')));
    } catch {
      storage()?.removeItem(keyOf(versionId));
    }
    setLoaded(true);
  }, [versionId]);
  useEffect(() => {
    if (!loaded) return;
    try {
      storage()?.setItem(keyOf(versionId), JSON.stringify({ day: today(), ids: [...done] }));
    } catch {
      // storage full or refused: the ticks last as long as the page
    }
  }, [done, loaded, versionId]);
  const toggle = (id: string) =>
    setDone((prev) => {
      const next = new Set(prev);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  return { done, toggle, clear: () => setDone(new Set()) };
}
