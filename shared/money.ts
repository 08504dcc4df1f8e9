// Money on Furlong is whole cents (integers) wherever it is stored. A figure made from rates and
// quantities (engine hours × a machine's hourly cost, acres × gallons per acre × a fuel price) is
// summed exactly and rounded ONCE, to the cent, by the rule below; nothing adds rounded parts. The
// season report rounds each of its money figures in SQL (PostgreSQL's round() on numeric rounds
// half away from zero, the same rule), and the screens and CSV show those cents as they are.

/**
 * The rounding rule for money: to the nearest whole cent, a half cent away from zero
 * (2.5 → 3, −2.5 → −3), as PostgreSQL's `round(numeric)` does. Whole cents pass unchanged, so a
 * figure already rounded is never rounded again.
 *
 * @example roundCents(1234.5) // 1235
 */
export function roundCents(cents: number): number {
  const r = Math.sign(cents) * Math.round(Math.abs(cents));
  return r === 0 ? 0 : r;
}

/**
 * Cents as dollars and cents for people: "$1,234.56", "−$12.00". Non-whole cents are rounded by
 * `roundCents` first (the one rounding, when the figure was not rounded before).
 *
 * @example formatMoney(123456) // "$1,234.56"
 */
export function formatMoney(cents: number): string {
  const whole = roundCents(cents);
  const abs = Math.abs(whole);
  const dollars = Math.trunc(abs / 100).toLocaleString('en-US');
  const rest = String(abs % 100).padStart(2, '0');
  return `${whole < 0 ? '−' : ''}$${dollars}.${rest}`;
}

/** Cents as a plain decimal number of dollars for a spreadsheet (CSV): 123456 → "1234.56", no symbol, no grouping. */
export function centsToDecimal(cents: number): string {
  const whole = roundCents(cents);
  const abs = Math.abs(whole);
  return `${whole < 0 ? '-' : ''}${Math.trunc(abs / 100)}.${String(abs % 100).padStart(2, '0')}`;
}

/** Dollars typed by a person ("3.85", "1,200") as whole cents, or null when it is not an amount. */
export function parseDollars(text: string): number | null {
  const t = text.trim().replace(/^\$/, '').replace(/,/g, '');
  if (!/^\d+(\.\d{1,2})?$/.test(t)) return null;
  const [d, c = ''] = t.split('.');
  return Number(d) * 100 + Number(c.padEnd(2, '0'));
}
