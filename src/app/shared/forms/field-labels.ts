import type { ErrorStateMatcher } from '@angular/material/core';
import type { ZodType } from 'zod';
import { ApiError } from '../../core/http/api-error';

/** Where one key of an API body shows on a form: the control it is typed in and that box's label. */
export interface FormField {
  /** The control's name in the form (a FormGroup path, or the form's own box name). */
  control: string;
  /** The box's label as the person reads it ("Working width"). */
  label: string;
}

/**
 * A form's map from the keys of its API body (and so of an error body's `fields`) to its boxes.
 * Every key the server may name must be here: then no internal name (widthM, headingDeg) ever
 * reaches the screen, and a spec can check the map against the body's zod schema.
 */
export type FormFields = Readonly<Record<string, FormField>>;

/** Problems per control, and the one message for above the form (null when none). */
export interface PlacedProblems {
  byControl: Record<string, string>;
  message: string | null;
}

const GENERIC = 'Something went wrong. Try again.';

/**
 * The box an error body's key goes to: the key itself (`seeding.soilMinC.canola`), else its first
 * segment, the body key it sits in (`hazards.features.0` → `hazards`).
 */
export const fieldFor = (path: string, fields: FormFields): FormField | undefined => fields[path] ?? fields[path.split('.')[0]];

/**
 * One sentence naming the boxes by their labels: "Check Working width: …" for one, "Check Working
 * width and Heading." for several. Messages whose key no box takes keep their words without the key.
 */
function sentence(problems: Array<{ label: string | null; message: string }>): string | null {
  if (!problems.length) return null;
  if (problems.length === 1) {
    const [p] = problems;
    return p.label ? `Check ${p.label}: ${p.message}` : p.message;
  }
  const labels = [...new Set(problems.map((p) => p.label).filter((l): l is string => !!l))];
  const loose = problems.filter((p) => !p.label).map((p) => p.message);
  return [checkSentence(labels), ...loose].filter(Boolean).join(' ');
}

/**
 * "Check Working width." / "Check Name and Working width." for boxes that have problems; null for none.
 *
 * @example checkSentence(['Name', 'Kind', 'Working width']) // 'Check Name, Kind and Working width.'
 */
export function checkSentence(labels: readonly string[]): string | null {
  if (!labels.length) return null;
  return `Check ${labels.length > 1 ? `${labels.slice(0, -1).join(', ')} and ${labels.at(-1)}` : labels[0]}.`;
}

/**
 * Places a refusal from the API on a form: each message of the error body's `fields` goes to the
 * control its key maps to, and the message above the form names those boxes by their labels. The
 * server's own message is used only when it names no field (it may carry a key, "widthM: …").
 *
 * @param error what the request failed with (an ApiError from the interceptor, or anything)
 * @param fields the form's map from body keys to boxes
 * @example placeServerErrors(err, PASS_PLAN_FIELDS) // { byControl: { width: '…' }, message: 'Check Working width: …' }
 */
export function placeServerErrors(error: unknown, fields: FormFields): PlacedProblems {
  if (!(error instanceof ApiError)) return { byControl: {}, message: GENERIC };
  const entries = Object.entries(error.fields ?? {});
  if (!entries.length) return { byControl: {}, message: error.message };
  return place(entries, fields);
}

function place(entries: Array<[string, string]>, fields: FormFields): PlacedProblems {
  const byControl: Record<string, string> = {};
  const problems: Array<{ label: string | null; message: string }> = [];
  for (const [path, message] of entries) {
    const field = fieldFor(path, fields);
    if (field && !(field.control in byControl)) byControl[field.control] = message;
    problems.push({ label: field?.label ?? null, message });
  }
  return { byControl, message: sentence(problems) };
}

/**
 * The same problems the server would name, found before sending: the body is checked with the
 * shared zod schema the route uses, and each issue goes to its box.
 *
 * @example schemaProblems(planSettings, body, PASS_PLAN_FIELDS).byControl.heading // 'Enter a heading from 0 to 179°'
 */
export function schemaProblems(schema: ZodType, body: unknown, fields: FormFields): PlacedProblems {
  const result = schema.safeParse(body);
  if (result.success) return { byControl: {}, message: null };
  return place(
    result.error.issues.map((i) => [i.path.join('.') || '_', i.message]),
    fields,
  );
}

/**
 * An ErrorStateMatcher that marks a box while it has a problem, as it is typed (not only once
 * touched), for forms whose problems come from a signal rather than the control's validators.
 *
 * @example <input matInput [errorStateMatcher]="matcher(() => problems()['heading'])" />
 */
export function problemMatcher(problem: () => string | null | undefined): ErrorStateMatcher {
  return { isErrorState: () => !!problem() };
}

/**
 * A box in error: one marked `aria-invalid="true"`, or the input of a Material field shown in
 * error (Material leaves `aria-invalid` off an empty required input, so a box left blank carries
 * only the field's class).
 */
const PROBLEM_BOX = [
  '[aria-invalid="true"]',
  '.mat-form-field-invalid input',
  '.mat-form-field-invalid textarea',
  '.mat-form-field-invalid mat-select',
].join(', ');

/**
 * Scrolls the first box in error inside `root` (in page order) into view and puts the cursor in it.
 *
 * @returns true when a box in error was found
 */
export function scrollToFirstProblem(root: HTMLElement): boolean {
  const box = root.querySelector<HTMLElement>(PROBLEM_BOX);
  if (!box) return false;
  box.scrollIntoView?.({ block: 'center', behavior: 'smooth' });
  box.focus({ preventScroll: true });
  return true;
}
