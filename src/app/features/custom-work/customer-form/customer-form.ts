import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { formatAcres } from '@shared/figures';
import { type Customer, customerBody } from '@shared/schemas/customers';
import type { FieldSummary } from '@shared/schemas/fields';
import { type Observable, concat, of, switchMap, tap, toArray } from 'rxjs';
import { API } from '../../../core/http/api-paths';
import { messageOf } from '../../../core/http/api-error';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { zodValidator } from '../../../shared/forms/zod-validator';
import { problemOf } from '../../fleet/control-problem';
import { CustomWorkApi } from '../custom-work-api';
import { type FieldChoice, fieldChoices, fieldMarks } from '../field-marks';

export interface CustomerFormData {
  /** The customer to edit; null to add one. */
  customer: Customer | null;
  /** Every customer, to name a field that is another's now. */
  customers: readonly Customer[];
}

/** Each key of the customer's API body and the box it is typed in, by its label. */
export const CUSTOMER_FIELDS: FormFields = {
  name: { control: 'name', label: 'Name' },
  email: { control: 'email', label: 'E-mail' },
  address: { control: 'address', label: 'Address' },
};

const shape = customerBody.shape;

/**
 * Adds or edits a customer of custom work, and which of the farm's fields are theirs (a field
 * another customer has moves to this one). Closes with the customer as saved, fields and all.
 */
@Component({
  selector: 'app-customer-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatCheckboxModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './customer-form.html',
  styleUrl: './customer-form.scss',
})
export class CustomerForm {
  private readonly api = inject(CustomWorkApi);
  private readonly dialogRef = inject<MatDialogRef<CustomerForm, Customer>>(MatDialogRef);
  protected readonly data = inject<CustomerFormData>(MAT_DIALOG_DATA);
  protected readonly problemOf = problemOf;
  protected readonly formatAcres = formatAcres;

  protected readonly form = new FormGroup({
    name: new FormControl(this.data.customer?.name ?? '', {
      nonNullable: true,
      validators: [Validators.required, zodValidator(shape.name)],
    }),
    email: new FormControl(this.data.customer?.email ?? '', {
      nonNullable: true,
      validators: [Validators.required, zodValidator(shape.email)],
    }),
    address: new FormControl(this.data.customer?.address ?? '', { nonNullable: true, validators: [zodValidator(shape.address)] }),
  });
  private readonly submission = new FormSubmission(this.form, CUSTOMER_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  private readonly fields = signal<FieldSummary[] | null>(null);
  protected readonly fieldsError = signal<string | null>(null);
  /** The ids of the fields ticked as this customer's. */
  protected readonly chosen = signal<ReadonlySet<number>>(new Set(this.data.customer?.fields.map((f) => f.id) ?? []));
  protected readonly choices = computed<FieldChoice[] | null>(() => {
    const fields = this.fields();
    return fields ? fieldChoices(fields, this.data.customers, this.data.customer?.id ?? null) : null;
  });
  /** Once a new customer is saved, a second try (after a field could not be marked) changes it rather than adding another. */
  private savedId: number | null = this.data.customer?.id ?? null;
  private theirsNow: number[] = this.data.customer?.fields.map((f) => f.id) ?? [];

  constructor() {
    inject(HttpClient)
      .get<FieldSummary[]>(API.fields)
      .subscribe({ next: (f) => this.fields.set(f), error: (e: unknown) => this.fieldsError.set(messageOf(e)) });
  }

  protected toggle(id: number, on: boolean): void {
    const next = new Set(this.chosen());
    if (on) next.add(id);
    else next.delete(id);
    this.chosen.set(next);
  }

  protected submit(): void {
    if (!this.submission.ready()) return;
    const v = this.form.getRawValue();
    const body = { name: v.name.trim(), email: v.email.trim(), address: v.address.trim() || null };
    const id = this.savedId;
    const saved$: Observable<Customer> = id === null ? this.api.createCustomer(body) : this.api.updateCustomer(id, body);
    const all$ = saved$.pipe(
      tap((c) => (this.savedId = c.id)),
      switchMap((c) => {
        const marks = fieldMarks(c.id, this.theirsNow, [...this.chosen()]);
        if (!marks.length) return of(c);
        return concat(...marks.map((m) => this.api.setFieldCustomer(m.fieldId, m.customerId))).pipe(
          toArray(),
          switchMap(() => this.api.getCustomer(c.id)),
        );
      }),
    );
    this.submission.send(all$, (customer) => this.dialogRef.close(customer));
  }
}
