import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, untracked } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import type { RateUnit } from '@shared/custom-rates';
import { formatMoney } from '@shared/money';
import { OPERATION_INFO } from '@shared/operations';
import { type RateCard, rateBody } from '@shared/schemas/rate-card';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { amountValidator, boxProblem, centsOf, dollarsText } from '../../members/cost-amounts';
import { CustomWorkApi } from '../custom-work-api';

/** The rate's API body keys and their boxes (one row per operation: the row says which). */
export const RATE_FIELDS: FormFields = {
  unit: { control: 'unit', label: 'Charged per' },
  rateCents: { control: 'rate', label: 'Rate' },
};

export type RateCardRow = RateCard['rates'][number];

/** "$5.00 per acre". */
export const rateText = (cents: number, unit: RateUnit): string => `${formatMoney(cents)} per ${unit}`;

/**
 * One operation of the rate card: the rate charged now (the owner's own, or the published default
 * with where it comes from), which the owner may change or put back to the default. Dollars are
 * typed and sent as whole cents, checked first with the route's own schema.
 */
@Component({
  selector: 'app-rate-row',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, ReactiveFormsModule],
  templateUrl: './rate-row.html',
  styleUrl: './rate-row.scss',
})
export class RateRow {
  private readonly api = inject(CustomWorkApi);

  readonly rate = input.required<RateCardRow>();
  readonly canEdit = input(false);
  /** The server took the change: the whole card as it now stands. */
  readonly saved = output<RateCard>();

  protected readonly label = computed(() => OPERATION_INFO[this.rate().operation].label);
  protected readonly defaultText = computed(() => rateText(this.rate().default.rateCents, this.rate().default.unit));
  protected readonly nowText = computed(() => rateText(this.rate().rateCents, this.rate().unit));
  protected readonly boxId = computed(() => `rate-${this.rate().operation}`);
  protected readonly boxProblem = boxProblem;

  protected readonly form = new FormGroup({
    unit: new FormControl<RateUnit>('acre', { nonNullable: true }),
    rate: new FormControl('', {
      nonNullable: true,
      validators: [amountValidator(centsOf, rateBody.shape.rateCents, 'Type the rate in dollars and cents, such as 5.50')],
    }),
  });
  private readonly submission = new FormSubmission(this.form, RATE_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly blocked = this.submission.blocked;
  protected readonly error = this.submission.error;

  constructor() {
    effect(() => {
      const r = this.rate();
      untracked(() => this.form.reset({ unit: r.unit, rate: dollarsText(r.rateCents) }));
    });
  }

  protected save(): void {
    if (!this.submission.ready()) return;
    const v = this.form.getRawValue();
    const rateCents = centsOf(v.rate);
    this.submission.send(this.api.setRate(this.rate().operation, { unit: v.unit, rateCents: rateCents ?? Number.NaN }), (card) =>
      this.saved.emit(card),
    );
  }

  protected reset(): void {
    this.submission.send(this.api.resetRate(this.rate().operation), (card) => this.saved.emit(card));
  }
}
