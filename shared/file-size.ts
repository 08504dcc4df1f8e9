import { figure } from './figures';

/**
 * A file size as a farmer reads it, the one formatter for every screen and message: whole bytes
 * under 1 kB ("274 bytes"), then kB, MB and GB of 1,024 of the unit below (as the upload limits
 * are stated), one decimal under 10 ("2.4 MB") and whole numbers above ("64 MB").
 *
 * @example formatFileSize(274) // "274 bytes"
 * @example formatFileSize(10 * 1024 * 1024) // "10 MB"
 */
export function formatFileSize(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return 'unknown size';
  if (bytes < 1024) return `${Math.round(bytes)} ${Math.round(bytes) === 1 ? 'byte' : 'bytes'}`;
  const units = ['kB', 'MB', 'GB', 'TB'];
  let value = bytes / 1024;
  let i = 0;
  // Move up a unit when the value would round to 1,024 of this one ("1,024 kB" reads as "1.0 MB").
  while (i < units.length - 1 && Math.round(value) >= 1024) {
    value /= 1024;
    i++;
  }
  const shown = figure(value, value < 9.95 ? 1 : 0);
  return `${shown} ${units[i]}`;
}
