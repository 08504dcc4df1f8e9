// CSV as RFC 4180 writes it: CRLF between records, a field quoted when it holds a comma, a quote or
// a line break, quotes inside doubled. A UTF-8 byte order mark leads so spreadsheets read UTF-8.

/** A cell: text, a number (written with `decimals` places), or empty. */
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
  if (typeof v === 'number') return Number.isFinite(v) ? v.toFixed(decimals) : '';
  return text(v);
}

/**
 * The whole file: header row, then the records.
 * @param columns header names, with their units (acres_finished, hours_logged…)
 * @param rows one array of cells per record, in the order of `columns`
 * @param integerColumns indexes of columns that hold counts (written without decimals)
 * @example toCsv(['field', 'acres_finished'], [['North, "old"', 12.5]]) // '\uFEFFfield,acres_finished\r\n"North, ""old""",12.50\r\n'
 */
export function toCsv(columns: readonly string[], rows: readonly Cell[][], integerColumns: readonly number[] = []): string {
  const lines = [columns.map((c) => text(c)).join(',')];
  for (const r of rows) lines.push(r.map((v, i) => cell(v, integerColumns.includes(i) ? 0 : 2)).join(','));
  return BOM + lines.join('\r\n') + '\r\n';
}
