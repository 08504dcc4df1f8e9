import { formatFileSize } from './file-size';

// Units: 1 kB = 1,024 bytes here, as the upload limits are stated (shared/limits.ts); the binary
// multiples are IEC 80000-13's KiB/MiB, shown with the everyday kB/MB names (common practice, no published source).
describe('file sizes', () => {
  it('when a file is under 1 kB, then its size is in bytes, never "0 kB"', () => {
    expect(formatFileSize(274)).toBe('274 bytes');
    expect(formatFileSize(1)).toBe('1 byte');
    expect(formatFileSize(0)).toBe('0 bytes');
    expect(formatFileSize(1023)).toBe('1023 bytes');
  });

  it('when a file is larger, then kB, MB and GB show one decimal under 10 and whole numbers above', () => {
    expect(formatFileSize(1024)).toBe('1.0 kB');
    expect(formatFileSize(1536)).toBe('1.5 kB');
    expect(formatFileSize(274 * 1024)).toBe('274 kB');
    expect(formatFileSize(2.4 * 1024 * 1024)).toBe('2.4 MB');
    expect(formatFileSize(10 * 1024 * 1024)).toBe('10 MB');
    expect(formatFileSize(1.2 * 1024 ** 3)).toBe('1.2 GB');
  });

  it('when a size would round to 1,024 of a unit, then the next unit is used', () => {
    expect(formatFileSize(1024 * 1024 - 1)).toBe('1.0 MB');
    expect(formatFileSize(9.96 * 1024)).toBe('10 kB');
  });
});
