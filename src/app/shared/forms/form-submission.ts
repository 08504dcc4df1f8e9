import { ElementRef, Injector, afterNextRender, inject, signal } from '@angular/core';
import { type AbstractControl, FormArray, FormGroup } from '@angular/forms';
import type { Observable } from 'rxjs';
import { type FormFields, checkSentence, placeServerErrors, scrollToFirstProblem } from './field-labels';

/**
 * A form's own words for some failures (a poor connection on the run sheet); null lets the
 * refusal be placed on the boxes by the form's map.
 */
export type FailureMessage = (err: unknown) => string | null;

/**
 * One form's submission, the same everywhere: nothing is sent while a request runs or while the
 * form has problems; then every problem is marked, the message above the form names the boxes by
 * their labels, the first box in error is brought into view, and `blocked` stays true (the submit
 * button off) until they are fixed. A refusal from the server is placed the same way through the
 * form's map from body keys to boxes, so no key of the API body (widthM, headingDeg) reaches the
 * screen.
 *
 * Made in an injection context (a component's field), it finds the component's element to scroll.
 */
export class FormSubmission {
  readonly busy = signal(false);
  readonly error = signal<string | null>(null);
  /** True while a refused form still has problems: the submit button stays off until they are fixed. */
  readonly blocked = signal(false);

  private readonly host = inject(ElementRef, { optional: true })?.nativeElement as HTMLElement | undefined;
  private readonly injector = inject(Injector);
  /** Whether the message above the form is about the boxes (so fixing them clears it). */
  private aboutBoxes = false;
  private refused = false;
  /** Whether anything was typed since the server's refusal (its marks no longer block a new try). */
  private changedSinceRefusal = false;

  constructor(
    private readonly form: FormGroup,
    private readonly fields: FormFields,
    private readonly failure: FailureMessage = () => null,
  ) {
    form.statusChanges.subscribe(() => this.follow());
    form.valueChanges.subscribe(() => {
      this.changedSinceRefusal = true;
      this.follow();
    });
  }

  /** True when the form may be sent now; otherwise false, with the form's problems shown. */
  ready(): boolean {
    if (this.busy()) return false;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      this.refused = true;
      this.aboutBoxes = true;
      this.error.set(checkSentence(this.invalidLabels()));
      this.follow();
      this.showFirstProblem();
      return false;
    }
    return true;
  }

  /** Sends `request`; `done` gets the answer. */
  send<T>(request: Observable<T>, done: (answer: T) => void): void {
    this.busy.set(true);
    this.error.set(null);
    this.aboutBoxes = false;
    request.subscribe({
      next: (answer) => {
        this.busy.set(false);
        done(answer);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        const own = this.failure(err);
        if (own !== null) {
          this.error.set(own);
          return;
        }
        this.refuse(err);
      },
    });
  }

  /** Puts a refusal from the server on the boxes by the form's map, and names them above the form. */
  private refuse(err: unknown): void {
    const placed = placeServerErrors(err, this.fields);
    let marked = false;
    for (const [path, message] of Object.entries(placed.byControl)) {
      const control = this.form.get(path);
      if (!control) continue;
      control.setErrors({ ...(control.errors ?? {}), server: message });
      control.markAsTouched();
      marked = true;
    }
    this.error.set(placed.message);
    if (!marked) return;
    this.refused = true;
    this.changedSinceRefusal = false;
    this.aboutBoxes = true;
    this.follow();
    this.showFirstProblem();
  }

  /** Labels of the boxes in the map that have a problem now, each once, in the map's order. */
  private invalidLabels(): string[] {
    const labels: string[] = [];
    for (const { control, label } of Object.values(this.fields)) {
      if (this.form.get(control)?.invalid && !labels.includes(label)) labels.push(label);
    }
    return labels;
  }

  /** Keeps `blocked` (and a message about the boxes) in step with the form as problems are fixed. */
  private follow(): void {
    const invalid = this.form.invalid;
    // A server mark may be fixed in another box (a start time for an end time): once anything
    // changed, only the form's own checks keep the button off.
    this.blocked.set(this.refused && (this.changedSinceRefusal ? ownProblems(this.form) : invalid));
    if (!invalid && this.aboutBoxes) {
      this.aboutBoxes = false;
      this.error.set(null);
    }
  }

  /** After the boxes are marked, brings the first one in error into view. */
  private showFirstProblem(): void {
    const host = this.host;
    if (!host) return;
    afterNextRender(() => scrollToFirstProblem(host), { injector: this.injector });
  }
}

/** Whether a control or any control inside it has a problem of the form's own (not a server mark). */
function ownProblems(control: AbstractControl): boolean {
  if (Object.keys(control.errors ?? {}).some((key) => key !== 'server')) return true;
  if (control instanceof FormGroup || control instanceof FormArray) return Object.values(control.controls).some(ownProblems);
  return false;
}
