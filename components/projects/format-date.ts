/** Dates as the lists show them ("3 Dec 2026"), in the viewer's time zone. */

/** An ISO timestamp as day, short month and year; the text itself when it is not a date. */
export function formatDay(iso: string | null | undefined): string {
  if (!iso) return '–';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
}

/** An ISO timestamp with the time of day ("3 Dec 2026, 14:05"). */
export function formatDayTime(iso: string | null | undefined): string {
  if (!iso) return '–';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return `${formatDay(iso)}, ${d.toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit' })}`;
}
