// Zips and KMZs read within the upload's budget. The central directory is read first and the
// archive is refused before anything is inflated when it lists too many files or too many bytes;
// then only the files asked for are inflated, each counted as it comes, so an archive whose
// listed sizes lie is stopped at the budget too. Nothing is kept once the caller lets go.
import type { Readable } from 'node:stream';
import yauzl from 'yauzl';
import { formatFileSize } from '../../../shared/file-size';
import { MAX_ARCHIVE_ENTRIES, MAX_UNPACKED_BYTES } from '../../../shared/limits';
import { AppError } from '../../http/errors';

/** What the archive is called in messages ("zip", "KMZ") and what to say when it cannot be opened. */
export interface ArchiveKind {
  label: string;
  damaged: string;
}

export interface Archive {
  /** The archive's files by name (no directories, no `__MACOSX/` resource forks). */
  readonly files: string[];
  /** Inflates one file, counted against the bytes left in the upload's unpacked budget. */
  read(name: string): Promise<Buffer>;
}

const overBudget = (kind: ArchiveKind, what: string) =>
  new AppError(
    413,
    'too_large',
    `The ${kind.label} unpacks to ${what}; Furlong reads at most ${formatFileSize(MAX_UNPACKED_BYTES)} of unpacked files per upload`,
  );

/**
 * Reads a stream into one buffer, destroying it as soon as more than `room` bytes have come:
 * the second guard after yauzl's own check of each file against its listed size.
 */
export function readBounded(stream: Readable, room: number, tooBig: () => Error): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let got = 0;
    let done = false;
    const finish = (err: Error | null) => {
      if (done) return;
      done = true;
      stream.removeAllListeners('data');
      if (err) {
        chunks.length = 0;
        // yauzl's streams release their inflater on destroy(); our listener stays for late errors.
        stream.on('error', () => undefined);
        stream.destroy();
        reject(err);
      } else resolve(Buffer.concat(chunks, got));
    };
    stream.on('data', (chunk: Buffer) => {
      got += chunk.length;
      if (got > room) return finish(tooBig());
      chunks.push(chunk);
    });
    stream.once('end', () => finish(null));
    stream.once('error', (err: Error) => finish(err));
  });
}

function damagedBy(kind: ArchiveKind, name: string, err: Error): AppError {
  if (err instanceof AppError) return err;
  const msg = err.message ?? '';
  if (/too many bytes|too few bytes/i.test(msg)) {
    return new AppError(
      422,
      'bad_file',
      `The ${kind.label} is damaged: ${name} unpacks to a different size than the ${kind.label} lists for it`,
    );
  }
  if (/encrypted/i.test(msg))
    return new AppError(422, 'bad_file', `${name} in the ${kind.label} is password-protected; zip it again without a password`);
  if (/compression method/i.test(msg)) {
    return new AppError(
      422,
      'bad_file',
      `${name} in the ${kind.label} is packed with a compression method Furlong cannot read; zip it again with ordinary compression`,
    );
  }
  return new AppError(422, 'bad_file', kind.damaged);
}

function open(buffer: Buffer): Promise<yauzl.ZipFile> {
  return new Promise((resolve, reject) =>
    yauzl.fromBuffer(buffer, { lazyEntries: true, validateEntrySizes: true, decodeStrings: true }, (err, zip) =>
      err ? reject(err) : resolve(zip),
    ),
  );
}

/** Every entry of the central directory, refusing as soon as there are more than the budget allows. */
function listEntries(zip: yauzl.ZipFile, kind: ArchiveKind): Promise<yauzl.Entry[]> {
  return new Promise((resolve, reject) => {
    const entries: yauzl.Entry[] = [];
    zip.on('entry', (entry: yauzl.Entry) => {
      entries.push(entry);
      zip.readEntry();
    });
    zip.once('end', () => resolve(entries));
    zip.once('error', () => reject(new AppError(422, 'bad_file', kind.damaged)));
    zip.readEntry();
  });
}

/**
 * Opens a zip held in memory. Refuses (before inflating anything) an archive of more than
 * MAX_ARCHIVE_ENTRIES files or whose listed sizes add up to more than MAX_UNPACKED_BYTES.
 */
export async function openArchive(buffer: Buffer, kind: ArchiveKind): Promise<Archive> {
  let zip: yauzl.ZipFile;
  try {
    zip = await open(buffer);
  } catch {
    throw new AppError(422, 'bad_file', kind.damaged);
  }
  // The end record's count comes before any entry is read: a zip claiming millions stops here.
  if (zip.entryCount > MAX_ARCHIVE_ENTRIES) {
    throw new AppError(
      422,
      'file_too_complex',
      `The ${kind.label} holds ${zip.entryCount.toLocaleString('en-US')} files; Furlong reads at most ${MAX_ARCHIVE_ENTRIES.toLocaleString('en-US')} files in one upload`,
    );
  }
  const entries = await listEntries(zip, kind);
  const listed = entries.reduce((sum, e) => sum + e.uncompressedSize, 0);
  if (listed > MAX_UNPACKED_BYTES) throw overBudget(kind, formatFileSize(listed));

  const byName = new Map<string, yauzl.Entry>();
  for (const e of entries) {
    if (e.fileName.endsWith('/') || e.fileName.startsWith('__MACOSX/')) continue;
    byName.set(e.fileName, e);
  }
  let inflated = 0;
  return {
    files: [...byName.keys()],
    async read(name: string): Promise<Buffer> {
      const entry = byName.get(name);
      if (!entry) throw new AppError(422, 'bad_file', `The ${kind.label} has no file ${name}`);
      try {
        const stream = await new Promise<Readable>((resolve, reject) =>
          zip.openReadStream(entry, (err, s) => (err ? reject(err) : resolve(s))),
        );
        const data = await readBounded(stream, MAX_UNPACKED_BYTES - inflated, () =>
          overBudget(kind, `more than ${formatFileSize(MAX_UNPACKED_BYTES)}`),
        );
        inflated += data.length;
        return data;
      } catch (err) {
        throw damagedBy(kind, name, err as Error);
      }
    },
  };
}
