import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { CURRENCIES, type InvoiceSettings, invoiceSettingsBody } from '@shared/schemas/invoices';
import { API } from '../../../core/http/api-paths';
import { messageOf } from '../../../core/http/api-error';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { zodValidator } from '../../../shared/forms/zod-validator';
import { problemOf } from '../../fleet/control-problem';
import { InvoicesApi } from '../invoices-api';
import { basisPointsOf, percentText } from './tax-rate';

/** Each key of the invoice settings body and its box (the rate is typed in per cent, sent in basis points). */
export const TAX_SETTINGS_FIELDS: FormFields = {
  taxName: { control: 'taxName', label: 'Tax name' },
  taxBasisPoints: { control: 'taxPercent', label: 'Tax rate' },
  currency: { control: 'currency', label: 'Currency' },
};

/**
 * The tax line new drafts get (a name such as "Sales tax" and a rate; none when the rate is 0) and
 * the currency they are in. A draft keeps what it was made with; the owner changes this, viewers read it.
 */
@Component({
  selector: 'app-tax-settings',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './tax-settings.html',
  styles: `
    form {
      display: flex;
      flex-wrap: wrap;
      align-items: flex-start;
      gap: 0.75rem;
    }
    .form-error {
      color: var(--mat-sys-error);
      flex-basis: 100%;
      margin: 0;
    }
    .saved {
      flex-basis: 100%;
      margin: 0;
    }
  `,
})
export class TaxSettings {
  private readonly api = inject(InvoicesApi);
  readonly canEdit = input(false);
  protected readonly currencies = CURRENCIES;
  protected readonly problemOf = problemOf;
  protected readonly loadError = signal<string | null>(null);
  protected readonly saved = signal<string | null>(null);
  protected readonly loaded = signal(false);

  protected readonly form = new FormGroup({
    taxName: new FormControl('', { nonNullable: true, validators: [zodValidator(invoiceSettingsBody.shape.taxName)] }),
    taxPercent: new FormControl('', {
      nonNullable: true,
      validators: [
        Validators.required,
        (c) => {
          const bp = basisPointsOf(String(c.value));
          if (bp === null) return { schema: 'Type the rate in per cent, such as 5 or 7.25' };
          const r = invoiceSettingsBody.shape.taxBasisPoints.safeParse(bp);
          return r.success ? null : { schema: r.error.issues[0]?.message ?? 'Check this entry' };
        },
      ],
    }),
    currency: new FormControl<(typeof CURRENCIES)[number]>('usd', { nonNullable: true }),
  });
  private readonly submission = new FormSubmission(this.form, TAX_SETTINGS_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  constructor() {
    inject(HttpClient)
      .get<InvoiceSettings>(API.invoiceSettings)
      .subscribe({ next: (s) => this.show(s), error: (e: unknown) => this.loadError.set(messageOf(e)) });
  }

  protected submit(): void {
    if (!this.submission.ready()) return;
    const v = this.form.getRawValue();
    const body: InvoiceSettings = {
      taxName: v.taxName.trim() || null,
      taxBasisPoints: basisPointsOf(v.taxPercent) ?? 0,
      currency: v.currency,
    };
    this.saved.set(null);
    this.submission.send(this.api.saveSettings(body), (s) => {
      this.show(s);
      this.saved.set('Saved: new drafts get this tax line.');
    });
  }

  private show(s: InvoiceSettings): void {
    this.loaded.set(true);
    this.form.reset({ taxName: s.taxName ?? '', taxPercent: percentText(s.taxBasisPoints), currency: s.currency });
    if (!this.canEdit()) this.form.disable();
  }
}
