// CSV as RFC 4180 writes it: CRLF between records, a field quoted when it holds a comma, a quote or
// a line break, quotes inside doubled. A UTF-8 byte order mark leads so spreadsheets read UTF-8.
// Numbers are written by shared/figures.ts `csvNumber`: the screen's digits and rounding, without
// thousands grouping, so a spreadsheet reads numbers that equal what the screen shows.
import { csvNumber } from '../../shared/figures';

/** A cell: text, a number (written with its column's decimals), or empty. */
export type Cell = string | number | null | undefined;

export const BOM = '\uFEFF';

/**
 * Text that a spreadsheet would run as a formula (= + - @, tab, carriage return first) gets a
 * leading apostrophe (OWASP "CSV Injection"); numbers are written as numbers and never touched.
 */
function text(s: string): string {
  const safe = /^[=+\-@\t\r]/.test(s) ? `'${s}` : s;
  return /[",\r\n]/.test(safe) ? `"${safe.replaceAll('"', '""')}"` : safe;
}

function cell(v: Cell, decimals: number): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return csvNumber(v, decimals);
  return text(v);
}

/**
 * The whole file: header row, then the records.
 * @param columns header names, with their units (acres_finished, hours_logged…)
 * @param rows one array of cells per record, in the order of `columns`
 * @param decimals each column's decimals for numbers, the same as the screen shows them
 *   (shared/figures.ts FIGURE_DECIMALS); a text column's entry is not used
 * @example toCsv(['field', 'acres_finished'], [['North, "old"', 12.46]], [0, 1]) // BOM + 'field,acres_finished\r\n"North, ""old""",12.5\r\n'
 */
export function toCsv(columns: readonly string[], rows: readonly Cell[][], decimals: readonly number[]): string {
  if (decimals.length !== columns.length) throw new Error(`toCsv: ${columns.length} columns but ${decimals.length} decimals`);
  const lines = [columns.map((c) => text(c)).join(',')];
  for (const r of rows) lines.push(r.map((v, i) => cell(v, decimals[i])).join(','));
  return BOM + lines.join('\r\n') + '\r\n';
}
