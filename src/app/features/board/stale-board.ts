import type { Board, BoardChange } from '@shared/schemas/board';
import { ApiError } from '../../core/http/api-error';
import { farmTime } from '@shared/farm-time';

export interface StaleBoard {
  message: string;
  changes: BoardChange[];
  current: Board;
}

/** The board and its changes from a 409 `stale_board`, or null for any other failure. */
export function staleBoardOf(error: unknown): StaleBoard | null {
  if (!(error instanceof ApiError) || error.status !== 409 || error.code !== 'stale_board') return null;
  const current = error.details['current'] as Board | undefined;
  if (!current || typeof current.version !== 'number' || !Array.isArray(current.assignments)) return null;
  const changes = Array.isArray(error.details['changes']) ? (error.details['changes'] as BoardChange[]) : [];
  return { message: error.message, changes, current };
}

/**
 * One line per change, in plain words, at the farm's clock (`timeZone`):
 * "14:05 Ingrid Sorensen: Moved North Quarter harrowing to Ada".
 */
export function describeChanges(changes: readonly BoardChange[], timeZone: string | undefined): string[] {
  return [...changes].sort((a, b) => a.version - b.version).map((c) => `${farmTime(c.at, timeZone)} ${c.by}: ${c.summary}`);
}
