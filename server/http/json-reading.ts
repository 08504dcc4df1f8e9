import { promisify } from 'node:util';
import { gzip } from 'node:zlib';
import type { Request, Response } from 'express';

const gzipAsync = promisify(gzip);

/** An answer computed once and kept: its JSON, the same gzip-compressed, and an ETag naming it. */
export interface JsonReading {
  json: Buffer;
  gzipped: Buffer;
  etag: string;
}

export async function jsonReading(value: unknown, etag: string): Promise<JsonReading> {
  const json = Buffer.from(JSON.stringify(value));
  return { json, gzipped: await gzipAsync(json), etag: `"${etag}"` };
}

/** Sends a kept reading: gzip to clients that accept it, 304 to a client that has it already. */
export function sendReading(req: Request, res: Response, reading: JsonReading): void {
  res.set({ ETag: reading.etag, Vary: 'Accept-Encoding' }).type('json');
  if (req.acceptsEncodings('gzip', 'identity') === 'gzip') res.set('Content-Encoding', 'gzip').send(reading.gzipped);
  else res.send(reading.json);
}
