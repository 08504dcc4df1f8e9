import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { type InvoiceDetail, invoiceDraftBody } from '@shared/schemas/invoices';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { zodValidator } from '../../../shared/forms/zod-validator';
import { problemOf } from '../../fleet/control-problem';
import { InvoicesApi } from '../invoices-api';

export interface DraftInvoiceData {
  customers: ReadonlyArray<{ id: number; name: string }>;
  /** The farm's today, YYYY-MM-DD: the period ends there and starts on the first of its month. */
  today: string;
}

/** Each key of the draft's API body and its box. */
export const DRAFT_INVOICE_FIELDS: FormFields = {
  customerId: { control: 'customerId', label: 'Customer' },
  from: { control: 'from', label: 'From' },
  to: { control: 'to', label: 'To' },
  note: { control: 'note', label: 'Note' },
};

const shape = invoiceDraftBody.shape;

/**
 * Drafts an invoice for a customer's finished work over a period (days inclusive). The server
 * makes one line per job at the rate card's rates; closes with the draft.
 */
@Component({
  selector: 'app-draft-invoice',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './draft-invoice.html',
  styles: `
    .grid {
      display: grid;
      grid-template-columns: repeat(2, minmax(0, 1fr));
      gap: 1rem 0.75rem;
      padding-top: 0.5rem;
    }
    .wide {
      grid-column: 1 / -1;
    }
    .form-error {
      color: var(--mat-sys-error);
    }
    @media (max-width: 30rem) {
      .grid {
        grid-template-columns: minmax(0, 1fr);
      }
    }
  `,
})
export class DraftInvoice {
  private readonly api = inject(InvoicesApi);
  private readonly dialogRef = inject<MatDialogRef<DraftInvoice, InvoiceDetail>>(MatDialogRef);
  protected readonly data = inject<DraftInvoiceData>(MAT_DIALOG_DATA);
  protected readonly problemOf = problemOf;

  protected readonly form = new FormGroup({
    customerId: new FormControl<number | null>(this.data.customers.length === 1 ? this.data.customers[0].id : null, {
      validators: [Validators.required],
    }),
    from: new FormControl(`${this.data.today.slice(0, 8)}01`, {
      nonNullable: true,
      validators: [Validators.required, zodValidator(shape.from)],
    }),
    to: new FormControl(this.data.today, { nonNullable: true, validators: [Validators.required, zodValidator(shape.to)] }),
    note: new FormControl('', { nonNullable: true }),
  });
  private readonly submission = new FormSubmission(this.form, DRAFT_INVOICE_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  protected submit(): void {
    if (!this.submission.ready()) return;
    const v = this.form.getRawValue();
    const body = { customerId: v.customerId as number, from: v.from, to: v.to, note: v.note.trim() || null };
    this.submission.send(this.api.draft(body), (invoice) => this.dialogRef.close(invoice));
  }
}
