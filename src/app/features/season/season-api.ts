import type { SeasonTable as TableName } from '@shared/schemas/season';

export const SEASON_INDEX_URL = '/api/season';
export const summaryUrl = (year: number) => `/api/season/${year}/summary`;
export const csvUrl = (year: number, table: TableName) => `/api/season/${year}/export/${table}.csv`;

/** A year from the address (`?year=2026`), or null when it is not one the API would take. */
export function yearParam(value: string | null | undefined): number | null {
  if (!value || !/^\d{4}$/.test(value)) return null;
  const year = Number(value);
  return year >= 1990 && year <= 2100 ? year : null;
}
