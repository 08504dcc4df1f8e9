import type { FormGroup } from '@angular/forms';
import { ApiError } from '../../core/http/api-error';

/**
 * Puts the server's per-field messages on the matching controls (as the `server` error, shown by
 * `<mat-error>`) and returns the message for the whole form, or null when every message found a
 * control. `aliases` maps a server path to a control path when the form nests it differently.
 */
export function applyServerErrors(form: FormGroup, error: unknown, aliases: Record<string, string> = {}): string | null {
  if (!(error instanceof ApiError)) return 'Something went wrong. Try again.';
  const entries = Object.entries(error.fields);
  let unplaced = entries.length === 0;
  for (const [path, message] of entries) {
    const control = form.get(aliases[path] ?? path);
    if (control) {
      control.setErrors({ ...(control.errors ?? {}), server: message });
      control.markAsTouched();
    } else {
      unplaced = true;
    }
  }
  return unplaced ? error.message : null;
}
