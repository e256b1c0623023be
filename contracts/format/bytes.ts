/** Byte counts in words, for screens and for messages: the one formatter of sizes. */

/**
 * `binary` (default): B, KiB, MiB, GiB or TiB with one decimal above 1 KiB ("1.5 MiB", as file managers show
 * sizes); `limit`: "512 MB", "256 KB" or "900 bytes" with a trailing ".0" dropped, for upload limits stated in
 * UPLOAD_LIMIT_MB (1 MB = 2^20 bytes). A dash for a negative or non-finite count.
 */
export function formatBytes(bytes: number, style: 'binary' | 'limit' = 'binary'): string {
  if (!Number.isFinite(bytes) || bytes < 0) return '–';
  if (style === 'limit') {
    if (bytes >= 2 ** 20) return `${+(bytes / 2 ** 20).toFixed(1)} MB`;
    if (bytes >= 1024) return `${+(bytes / 1024).toFixed(1)} KB`;
    return `${bytes} bytes`;
  }
  if (bytes < 1024) return `${bytes} B`;
  const units = ['KiB', 'MiB', 'GiB', 'TiB'];
  let v = bytes / 1024;
  let i = 0;
  while (v >= 1024 && i < units.length - 1) {
    v /= 1024;
    i++;
  }
  return `${v.toFixed(1)} ${units[i]}`;
}
