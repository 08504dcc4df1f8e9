import { signal } from '@angular/core';
import type { FormGroup } from '@angular/forms';
import type { Observable } from 'rxjs';
import { applyServerErrors } from './server-errors';

/** Turns a failed request into the message shown above the form (field messages go on the form). */
export type FailureMessage = (err: unknown, form: FormGroup) => string | null;

/**
 * One form's submission, the same everywhere: nothing is sent while a request runs or while the
 * form has problems (they are shown instead); while it runs the form is busy; a refusal puts the
 * server's field messages on the controls and its message above the form.
 */
export class FormSubmission {
  readonly busy = signal(false);
  readonly error = signal<string | null>(null);

  constructor(
    private readonly form: FormGroup,
    private readonly failure: FailureMessage = (err, f) => applyServerErrors(f, err),
  ) {}

  /** True when the form may be sent now; otherwise false, with the form's problems shown. */
  ready(): boolean {
    if (this.busy()) return false;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return false;
    }
    return true;
  }

  /** Sends `request`; `done` gets the answer. */
  send<T>(request: Observable<T>, done: (answer: T) => void): void {
    this.busy.set(true);
    this.error.set(null);
    request.subscribe({
      next: (answer) => {
        this.busy.set(false);
        done(answer);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.error.set(this.failure(err, this.form));
      },
    });
  }
}
