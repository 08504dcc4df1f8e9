import { LRUCache } from 'lru-cache';
import type { Db } from '../db/knex';
import { jsonReading, type JsonReading } from '../http/json-reading';
import { readBoard, type ReadBoardOptions } from './board.read';

/** The board as JSON and gzip, named for HTTP caches by the farm, the day and the farm's revision. */
export type BoardReading = JsonReading;

/**
 * The work board, computed once per farm revision and day and then served from memory. A board
 * takes a dozen queries to build; whether it is still current is known from the farm's revision,
 * which comes with the signed-in principal. Requests that arrive while the same board is being
 * built wait for that one reading.
 */
export class BoardCache {
  private readonly readings: LRUCache<string, BoardReading, { farmId: number; day: string }>;

  constructor(
    private readonly db: Db,
    publicUrl: string,
    maxBytes = 32 * 1024 * 1024,
    options: Pick<ReadBoardOptions, 'onWeatherError'> = {},
  ) {
    this.readings = new LRUCache({
      maxSize: maxBytes,
      sizeCalculation: (r) => r.json.length + r.gzipped.length,
      fetchMethod: async (key, _stale, { context }) => {
        const board = await readBoard(this.db, context.farmId, context.day, publicUrl, options);
        return jsonReading(board, `board-${key.replaceAll('|', '-')}`);
      },
    });
  }

  /** `revision` must have been read before the board's data: the principal's is. */
  async read(farmId: number, day: string, revision: string): Promise<BoardReading> {
    const reading = await this.readings.fetch(`${farmId}|${day}|${revision}`, { context: { farmId, day } });
    return reading!;
  }
}
