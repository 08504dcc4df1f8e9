import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import { centsToDecimal, parseDollars } from '@shared/money';
import type { ZodType } from 'zod';

/** Dollars as the owner types them, from whole cents ("95.50"); empty for none. */
export const dollarsText = (cents: number | null): string => (cents === null ? '' : centsToDecimal(cents));

/** Dollars typed ("95.50", "$1,200") as whole cents; null for an empty box; undefined when it is not an amount. */
export function centsOf(text: string): number | null | undefined {
  const t = text.trim();
  if (t === '') return null;
  return parseDollars(t) ?? undefined;
}

/** Gallons per acre typed ("0.35"); null for an empty box; undefined when it is not a number. */
export function gallonsOf(text: string): number | null | undefined {
  const t = text.trim();
  if (t === '') return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : undefined;
}

/**
 * A box where an amount is typed as text: `read` turns the text into what the API takes, and the
 * shared schema of that key checks it, so the box says what the server would before anything is
 * sent. Text that is not an amount gets `format` (how to write it).
 */
export function amountValidator(read: (text: string) => number | null | undefined, schema: ZodType, format: string): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const value = read(String(control.value ?? ''));
    if (value === undefined) return { format };
    const result = schema.safeParse(value);
    return result.success ? null : { schema: result.error.issues[0]?.message ?? 'Check this entry' };
  };
}

/** The message to show under a box once it is touched: its own check's words, else the server's. */
export function boxProblem(control: AbstractControl): string | null {
  if (!control.touched || !control.errors) return null;
  for (const key of ['format', 'schema', 'server']) if (typeof control.errors[key] === 'string') return control.errors[key] as string;
  return 'Check this entry';
}
