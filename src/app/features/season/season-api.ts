import type { SeasonTable as TableName } from '@shared/schemas/season';
import { API } from '../../core/http/api-paths';

export const SEASON_INDEX_URL = API.seasons;
export const summaryUrl = API.seasonSummary;
export const csvUrl = (year: number, table: TableName) => API.seasonCsv(year, table);

/** A year from the address (`?year=2026`), or null when it is not one the API would take. */
export function yearParam(value: string | null | undefined): number | null {
  if (!value || !/^\d{4}$/.test(value)) return null;
  const year = Number(value);
  return year >= 1990 && year <= 2100 ? year : null;
}
