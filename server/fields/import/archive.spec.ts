import { Readable } from 'node:stream';
import zlib from 'node:zlib';
import { readBounded } from './archive';
import { formatFileSize } from '../../../shared/file-size';

const MiB = 1024 * 1024;

/** `count` megabytes of zeros, made one chunk at a time (never held whole). */
function zeros(count: number): Readable {
  let left = count;
  return new Readable({
    read() {
      this.push(left-- > 0 ? Buffer.alloc(MiB) : null);
    },
  });
}

describe('readBounded (the second guard, behind the listed sizes)', () => {
  it('when an inflating stream runs past the room left, then it is destroyed at the cap and refused', async () => {
    // 512 MB of zeros deflated and inflated again by zlib, as a lying zip entry would be.
    const inflate = zlib.createInflateRaw();
    zeros(512).pipe(zlib.createDeflateRaw()).pipe(inflate);
    let delivered = 0;
    inflate.on('data', (b: Buffer) => (delivered += b.length));
    await expect(readBounded(inflate, 8 * MiB, () => new Error('over budget'))).rejects.toThrow('over budget');
    expect(inflate.destroyed).toBe(true);
    // It stopped within a chunk or so of the cap, not after the whole 512 MB.
    expect(delivered).toBeGreaterThan(8 * MiB);
    expect(delivered).toBeLessThan(9 * MiB);
  });

  it('when the data fits, then all of it comes back in order', async () => {
    const data = Buffer.from(Array.from({ length: 100_000 }, (_, i) => i % 251));
    const out = await readBounded(Readable.from([data.subarray(0, 40_000), data.subarray(40_000)]), data.length, () => new Error('no'));
    expect(out.equals(data)).toBe(true);
  });

  it('when exactly the room arrives, then it is accepted; one byte more is refused', async () => {
    await expect(readBounded(Readable.from([Buffer.alloc(10)]), 10, () => new Error('over'))).resolves.toHaveLength(10);
    await expect(readBounded(Readable.from([Buffer.alloc(11)]), 10, () => new Error('over'))).rejects.toThrow('over');
  });

  it('when the stream fails, then the failure is passed on', async () => {
    const s = new Readable({ read() {} });
    const p = readBounded(s, 10, () => new Error('over'));
    s.destroy(new Error('invalid stored block lengths'));
    await expect(p).rejects.toThrow('invalid stored block lengths');
  });
});

describe('sizes in the import messages (the shared formatFileSize)', () => {
  it('when sizes are shown, then MB below a gibibyte and GB to one decimal above (1 GB = 1024³ bytes here)', () => {
    expect(formatFileSize(64 * MiB)).toBe('64 MB');
    expect(formatFileSize(200 * MiB)).toBe('200 MB');
    expect(formatFileSize(Math.round(1.2 * 1024 ** 3))).toBe('1.2 GB');
    // A small file is not "1 MB" (the import messages had their own formatter that said so).
    expect(formatFileSize(274)).toBe('274 bytes');
  });
});
