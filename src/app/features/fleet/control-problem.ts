import type { AbstractControl } from '@angular/forms';

/**
 * The one message to show under a form control: the first of `messages` whose error key is set,
 * else the shared schema's message, else the server's, else a plain fallback. Null when valid.
 */
export function problemOf(control: AbstractControl, messages: Record<string, string> = {}): string | null {
  const errors = control.errors;
  if (!errors) return null;
  for (const [key, message] of Object.entries(messages)) if (errors[key]) return message;
  for (const key of ['schema', 'server']) if (typeof errors[key] === 'string') return errors[key] as string;
  return 'Check this entry';
}
