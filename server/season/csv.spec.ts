import { BOM, toCsv } from './csv';

// RFC 4180 §2 (the CSV format: CRLF records, quoting rules) and OWASP "CSV Injection" (formula prefixes).
describe('toCsv', () => {
  it('when cells hold commas, quotes or line breaks, then they are quoted with quotes doubled (RFC 4180 §2.5–2.7)', () => {
    const csv = toCsv(['name', 'note'], [['North, "old"', 'line one\nline two']], [0, 0]);
    expect(csv).toBe(`${BOM}name,note\r\n"North, ""old""","line one\nline two"\r\n`);
  });

  it('when numbers are written, then each column has its own decimals without grouping, and nulls are empty', () => {
    // Rounding as shared/figures.ts states it: half away from zero of the written decimal (2.005 → 2.01,
    // where toFixed(2) gives 2.00 from the binary 2.004 999…).
    expect(
      toCsv(
        ['a', 'b', 'n'],
        [
          [1, 2.005, 3],
          [null, 0.1 + 0.2, 0],
          [1234.56, 1234.5, 1234],
        ],
        [1, 2, 0],
      ),
    ).toBe(`${BOM}a,b,n\r\n1.0,2.01,3\r\n,0.30,0\r\n1234.6,1234.50,1234\r\n`);
  });

  it('when the decimals do not match the columns, then the writer refuses (a programming error, not data)', () => {
    expect(() => toCsv(['a', 'b'], [[1, 2]], [1])).toThrow('2 columns but 1 decimals');
  });

  it('when text starts like a formula, then an apostrophe defuses it; negative numbers stay numbers', () => {
    expect(
      toCsv(
        ['x', 'y'],
        [
          ['=SUM(A1)', -2],
          ['@cmd', 5],
          ['+1', 1],
        ],
        [0, 2],
      ),
    ).toBe(`${BOM}x,y\r\n'=SUM(A1),-2.00\r\n'@cmd,5.00\r\n'+1,1.00\r\n`);
  });
});
