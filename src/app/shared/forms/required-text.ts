import type { AbstractControl, ValidationErrors } from '@angular/forms';

/**
 * `Validators.required` for a text the server trims: spaces alone are no name, so the form stops
 * them as empty (the same `required` error) instead of sending what the server refuses.
 */
export function requiredText(control: AbstractControl): ValidationErrors | null {
  const v: unknown = control.value;
  return v === null || v === undefined || (typeof v === 'string' && v.trim() === '') ? { required: true } : null;
}
