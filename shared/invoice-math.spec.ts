// Hand-worked examples of the invoice rule (line = quantity × rate, rounded once, a half away from
// zero; tax on the subtotal, rounded once). Each expected figure is worked out in the comment.
import { divRoundHalfAway, invoiceTotals, lineAmountCents, taxCents } from './invoice-math';

describe('invoice arithmetic', () => {
  it('when acres times the rate is whole, then the amount is exact', () => {
    // 118.5 ac × 1782 ¢/ac = 211,167 ¢ (by hand).
    expect(lineAmountCents(118.5, 1782)).toBe(211_167);
  });
  it('when the product ends in a half cent or more, then it rounds up; less, down', () => {
    // 40.125 × 1175 = 47,146.875 → 47,147; 0.0002 × 2500 = 0.5 → 1 (half away from zero);
    // 0.0001 × 4999 = 0.4999 → 0.
    expect(lineAmountCents(40.125, 1175)).toBe(47_147);
    expect(lineAmountCents(0.0002, 2500)).toBe(1);
    expect(lineAmountCents(0.0001, 4999)).toBe(0);
  });
  it('when a binary fraction would mislead, then the exact decimal decides', () => {
    // 1.005 h × 100 ¢/h = 100.5 ¢ exactly → 101 ¢, though 1.005 × 100 in floating point is 100.49999…
    expect(1.005 * 100).toBeLessThan(100.5);
    expect(lineAmountCents(1.005, 100)).toBe(101);
  });
  it('when tax is added, then it is rounded once on the subtotal', () => {
    // Lines 211,167 + 47,147 = 258,314 ¢; 5 % (500 bp) = 12,915.7 → 12,916; total 271,230 ¢.
    expect(invoiceTotals([211_167, 47_147], 500)).toEqual({ subtotalCents: 258_314, taxCents: 12_916, totalCents: 271_230 });
    // Half away from zero on negatives (credit notes): −0.5 → −1.
    expect(divRoundHalfAway(-5n, 10n)).toBe(-1n);
    expect(taxCents(-258_314, 500)).toBe(-12_916);
  });
});
