/**
 * A tax rate typed in per cent ("5", "7.25", "7,25 %") as whole basis points (1 % = 100 basis
 * points), or null when it is not a rate with at most two decimals. Exact: no binary fractions.
 *
 * @example basisPointsOf('7.25') // 725
 */
export function basisPointsOf(text: string): number | null {
  const t = text.trim().replace(/\s*%$/, '').replace(',', '.');
  if (!/^\d{1,3}(\.\d{1,2})?$/.test(t)) return null;
  const [whole, part = ''] = t.split('.');
  return Number(whole) * 100 + Number(part.padEnd(2, '0'));
}

/** Basis points as the per cent the owner reads and types: 725 → "7.25", 500 → "5". */
export function percentText(basisPoints: number): string {
  const whole = Math.trunc(basisPoints / 100);
  const part = String(basisPoints % 100)
    .padStart(2, '0')
    .replace(/0+$/, '');
  return part ? `${whole}.${part}` : String(whole);
}
