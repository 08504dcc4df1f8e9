import { promisify } from 'node:util';
import { gzip } from 'node:zlib';
import { LRUCache } from 'lru-cache';
import type { Db } from '../db/knex';
import { readBoard, type ReadBoardOptions } from './board.read';

const gzipAsync = promisify(gzip);

export interface BoardReading {
  /** The board as UTF-8 JSON, ready to send. */
  json: Buffer;
  /** The same, gzip-compressed, for clients that accept it (every browser does). */
  gzipped: Buffer;
  /** Names this reading for HTTP caches: the farm, the day and the farm's revision. */
  etag: string;
}

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
        const json = Buffer.from(JSON.stringify(await readBoard(this.db, context.farmId, context.day, publicUrl, options)));
        return { json, gzipped: await gzipAsync(json), etag: `"board-${key.replaceAll('|', '-')}"` };
      },
    });
  }

  /** `revision` must have been read before the board's data: the principal's is. */
  async read(farmId: number, day: string, revision: string): Promise<BoardReading> {
    const reading = await this.readings.fetch(`${farmId}|${day}|${revision}`, { context: { farmId, day } });
    return reading!;
  }
}
