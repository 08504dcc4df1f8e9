import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, untracked } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { type CostSettingsAnswer, hourlyCostBody } from '@shared/schemas/costs';
import { API } from '../../../core/http/api-paths';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { amountValidator, boxProblem, centsOf, dollarsText } from '../cost-amounts';

/** The hourly cost's API body key and its box (one box per row: the row's name says whose cost it is). */
export const HOURLY_COST_FIELDS: FormFields = {
  hourlyCents: { control: 'hourly', label: 'Hourly cost' },
};

/** Whose hourly cost a row holds. */
export type HourlyCostKind = 'machine' | 'person';

/**
 * One machine's or person's hourly cost, typed in dollars and sent as whole cents (an empty box
 * clears it); a small form of its own, sent through the shared form submission, so a refusal
 * shows under this row's box.
 */
@Component({
  selector: 'app-hourly-cost-row',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, ReactiveFormsModule],
  templateUrl: './hourly-cost-row.html',
  styleUrl: './hourly-cost-row.scss',
})
export class HourlyCostRow {
  private readonly http = inject(HttpClient);

  readonly kind = input.required<HourlyCostKind>();
  readonly itemId = input.required<number>();
  readonly name = input.required<string>();
  /** What is saved now, whole cents; null when not set. */
  readonly cents = input<number | null>(null);
  readonly canEdit = input(false);
  /** The server took the new cost: every cost as it now stands. */
  readonly saved = output<CostSettingsAnswer>();

  protected readonly form = new FormGroup({
    hourly: new FormControl('', {
      nonNullable: true,
      validators: [amountValidator(centsOf, hourlyCostBody.shape.hourlyCents, 'Type the hourly cost in dollars and cents, such as 95.50')],
    }),
  });
  private readonly submission = new FormSubmission(this.form, HOURLY_COST_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly blocked = this.submission.blocked;
  protected readonly error = this.submission.error;
  /** The box's name (`machine-7`), also what the page's tests find it by. */
  protected readonly boxName = computed(() => `${this.kind()}-${this.itemId()}`);
  protected readonly boxId = computed(() => `hourly-cost-${this.boxName()}`);
  protected readonly boxProblem = boxProblem;

  constructor() {
    // Shows what is saved, again after each save of this row (another row's save leaves it alone).
    effect(() => {
      const cents = this.cents();
      untracked(() => this.form.reset({ hourly: dollarsText(cents) }));
    });
  }

  protected save(): void {
    if (!this.submission.ready()) return;
    const hourlyCents = centsOf(this.form.controls.hourly.value) ?? null;
    const id = this.itemId();
    const url = this.kind() === 'machine' ? API.machineCost(id) : API.personCost(id);
    this.submission.send(this.http.put<CostSettingsAnswer>(url, { hourlyCents }), (answer) => {
      this.form.markAsPristine();
      this.saved.emit(answer);
    });
  }
}
