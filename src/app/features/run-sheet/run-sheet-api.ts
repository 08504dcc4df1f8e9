import { API } from '../../core/http/api-paths';

/**
 * A day's run sheet (read with httpResource; what is logged goes through the outbox, `outbox-store.ts`): the signed-in person's, or (for the owner) another member's. Without a day the
 * server picks the person's next day with work and says which it picked.
 */
export const runSheetUrl = (date: string | null, membershipId: number | null = null): string =>
  date ? API.runSheet(date, membershipId) : `/api/run-sheet${membershipId === null ? '' : `?membershipId=${membershipId}`}`;
