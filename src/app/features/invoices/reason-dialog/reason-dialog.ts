import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { invoiceVoidBody, type InvoiceDetail } from '@shared/schemas/invoices';
import type { Observable } from 'rxjs';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { zodValidator } from '../../../shared/forms/zod-validator';
import { problemOf } from '../../fleet/control-problem';

/** The one key of the void and credit bodies and its box. */
export const REASON_FIELDS: FormFields = {
  reason: { control: 'reason', label: 'Reason' },
};

export interface ReasonDialogData {
  title: string;
  message: string;
  confirm: string;
  /** Sends the reason; the dialog closes with the answer. */
  act: (reason: string) => Observable<InvoiceDetail>;
}

/** Asks why an invoice is voided or credited, sends it, and closes with the server's answer. */
@Component({
  selector: 'app-reason-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  template: `
    <h2 mat-dialog-title id="reason-title">{{ data.title }}</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate aria-labelledby="reason-title">
      <mat-dialog-content>
        <p>{{ data.message }}</p>
        @if (error(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="reason">
          <mat-label>Reason</mat-label>
          <textarea matInput formControlName="reason" rows="2" required></textarea>
          <mat-error>{{ problemOf(form.controls.reason, { required: 'Say why' }) }}</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy() || blocked()">{{ data.confirm }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .reason {
      width: 100%;
    }
    .form-error {
      color: var(--mat-sys-error);
    }
  `,
})
export class ReasonDialog {
  protected readonly data = inject<ReasonDialogData>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<ReasonDialog, InvoiceDetail>>(MatDialogRef);
  protected readonly problemOf = problemOf;
  protected readonly form = new FormGroup({
    reason: new FormControl('', { nonNullable: true, validators: [Validators.required, zodValidator(invoiceVoidBody.shape.reason)] }),
  });
  private readonly submission = new FormSubmission(this.form, REASON_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  protected submit(): void {
    if (!this.submission.ready()) return;
    this.submission.send(this.data.act(this.form.controls.reason.value.trim()), (answer) => this.dialogRef.close(answer));
  }
}
