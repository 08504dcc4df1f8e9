import { centsToDecimal, formatMoney, parseDollars, roundCents } from './money';

describe('money', () => {
  // The rule: to the cent, a half cent away from zero, as PostgreSQL's round(numeric) does
  // (PostgreSQL manual, "Mathematical Functions and Operators", from memory: round(42.5) is 43, round(-42.5) is -43).
  it.each([
    [42.5, 43],
    [-42.5, -43],
    [42.4999, 42],
    [0.5, 1],
    [-0.4, 0],
    [1234, 1234],
  ])('when %p cents are rounded, then they become %p', (cents, want) => {
    expect(roundCents(cents)).toBe(want);
  });

  it('when whole cents are formatted, then they show as dollars and cents with thousands grouped and are not rounded again', () => {
    // Worked by hand: 123456 ¢ = $1,234.56; 5 ¢ = $0.05; 100000000 ¢ = $1,000,000.00.
    expect(formatMoney(123456)).toBe('$1,234.56');
    expect(formatMoney(5)).toBe('$0.05');
    expect(formatMoney(0)).toBe('$0.00');
    expect(formatMoney(100_000_000)).toBe('$1,000,000.00');
    expect(formatMoney(-1200)).toBe('−$12.00');
  });

  it('when a fraction of a cent is formatted, then it is rounded once by the money rule', () => {
    expect(formatMoney(1234.5)).toBe('$12.35');
    expect(formatMoney(1234.49)).toBe('$12.34');
  });

  it('when cents go to a spreadsheet, then they are a plain decimal number', () => {
    expect(centsToDecimal(123456)).toBe('1234.56');
    expect(centsToDecimal(7)).toBe('0.07');
  });

  it('when a person types dollars, then they become whole cents, and anything else is refused', () => {
    expect(parseDollars('3.85')).toBe(385);
    expect(parseDollars('$1,200')).toBe(120000);
    expect(parseDollars(' 95.5 ')).toBe(9550);
    for (const bad of ['', 'abc', '1.234', '-3', '1e3']) expect(parseDollars(bad)).toBeNull();
  });
});
