import { BOM, toCsv } from './csv';

// RFC 4180 §2 (the CSV format: CRLF records, quoting rules) and OWASP "CSV Injection" (formula prefixes).
describe('toCsv', () => {
  it('when cells hold commas, quotes or line breaks, then they are quoted with quotes doubled (RFC 4180 §2.5–2.7)', () => {
    const csv = toCsv(['name', 'note'], [['North, "old"', 'line one\nline two']]);
    expect(csv).toBe(`${BOM}name,note\r\n"North, ""old""","line one\nline two"\r\n`);
  });

  it('when numbers are written, then they have two decimals, or none in a count column, and nulls are empty', () => {
    expect(
      toCsv(
        ['a', 'b', 'n'],
        [
          [1, 2.005, 3],
          [null, 0.1 + 0.2, 0],
        ],
        [2],
      ),
    ).toBe(`${BOM}a,b,n\r\n1.00,2.00,3\r\n,0.30,0\r\n`);
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
      ),
    ).toBe(`${BOM}x,y\r\n'=SUM(A1),-2.00\r\n'@cmd,5.00\r\n'+1,1.00\r\n`);
  });
});
