/** Attachment sizes in binary units for the outbox ("48.2 KiB"). */

/** Bytes as B, KiB or MiB, one decimal above 1 KiB; a dash for nonsense. */
export function formatBytesShort(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return '–';
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} KiB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MiB`;
}
