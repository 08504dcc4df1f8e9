// The arithmetic of an invoice, in whole cents, with the one rounding rule of shared/money.ts:
//   line amount = quantity (acres or hours, at most 4 decimals as stored) × rate (cents per acre
//                 or per hour), rounded once to the cent, a half cent away from zero;
//   subtotal    = the sum of the rounded line amounts (nothing else is rounded);
//   tax         = subtotal × tax rate (basis points, 1 bp = 0.01 %) ÷ 10,000, rounded once the same way;
//   total       = subtotal + tax.
// The arithmetic is exact (BigInt): no binary fraction ever decides a half cent.
import { roundCents } from './money';

/** A quantity as whole ten-thousandths (numeric(12,4) as stored): 118.5 → 1_185_000n. */
export function tenThousandths(quantity: number): bigint {
  if (!Number.isFinite(quantity)) throw new Error('quantity must be a finite number');
  return BigInt(Math.round(quantity * 10_000));
}

/** n ÷ d rounded to the nearest integer, a half away from zero; d > 0. */
export function divRoundHalfAway(n: bigint, d: bigint): bigint {
  const neg = n < 0n;
  const a = neg ? -n : n;
  const q = (2n * a + d) / (2n * d);
  return neg ? -q : q;
}

/**
 * One line's amount in cents.
 * @param quantity acres or hours (at most 4 decimals count)
 * @param rateCents whole cents per acre or per hour
 * @example lineAmountCents(118.5, 1782) // 211167 (118.5 × 1782 = 211,167 exactly)
 * @example lineAmountCents(40.125, 1175) // 47147 (47,146.875 → 47,147)
 */
export function lineAmountCents(quantity: number, rateCents: number): number {
  return roundCents(Number(divRoundHalfAway(tenThousandths(quantity) * BigInt(rateCents), 10_000n)));
}

/**
 * Tax on a subtotal.
 * @param subtotalCents whole cents
 * @param basisPoints the tax rate in hundredths of a percent (500 = 5 %)
 * @example taxCents(258314, 500) // 12916 (12,915.7 → 12,916)
 */
export function taxCents(subtotalCents: number, basisPoints: number): number {
  return roundCents(Number(divRoundHalfAway(BigInt(subtotalCents) * BigInt(basisPoints), 10_000n)));
}

/** Subtotal, tax and total of lines already rounded. */
export function invoiceTotals(
  lineCents: readonly number[],
  basisPoints: number,
): { subtotalCents: number; taxCents: number; totalCents: number } {
  const subtotalCents = lineCents.reduce((s, c) => s + c, 0);
  const tax = taxCents(subtotalCents, basisPoints);
  return { subtotalCents, taxCents: tax, totalCents: subtotalCents + tax };
}
