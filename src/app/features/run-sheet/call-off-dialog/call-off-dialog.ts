import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { CALL_OFF_REASONS } from '@shared/schemas/jobs';
import { OutboxStore } from '../outbox-store';
import { retryMessage } from '../send-failure';
import type { JobDialogData } from '../start-dialog/start-dialog';
import { from } from 'rxjs';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';

type Reason = (typeof CALL_OFF_REASONS)[number];
const REASON_LABELS: Record<Reason, string> = { weather: 'Weather', breakdown: 'Breakdown', other: 'Other' };

/** Each key of a call-off's API body and the box it is typed in, by its label. */
export const CALL_OFF_FIELDS: FormFields = {
  reason: { control: 'reason', label: 'Why is it called off?' },
  note: { control: 'note', label: 'Note' },
  at: { control: 'at', label: 'Time of the tap' },
};

/** Call a job off: why (weather, breakdown, other) and a note, needed for "other". */
@Component({
  selector: 'app-call-off-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, MatRadioModule, ReactiveFormsModule],
  templateUrl: './call-off-dialog.html',
  styleUrl: '../job-dialog.scss',
})
export class CallOffDialog {
  private readonly outbox = inject(OutboxStore);
  private readonly ref = inject<MatDialogRef<CallOffDialog>>(MatDialogRef);
  protected readonly data = inject<JobDialogData>(MAT_DIALOG_DATA);

  protected readonly reasons = CALL_OFF_REASONS.map((value) => ({ value, label: REASON_LABELS[value] }));
  protected readonly form = new FormGroup({
    reason: new FormControl<Reason | null>(null, Validators.required),
    note: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(1000)] }),
  });
  private readonly submission = new FormSubmission(this.form, CALL_OFF_FIELDS, (err) => retryMessage(err, 'Call off'));
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  protected submit(): void {
    const v = this.form.getRawValue();
    if (v.reason === 'other' && !v.note.trim()) this.form.controls.note.setErrors({ required: true });
    if (!this.submission.ready()) return;
    const action = { type: 'call-off' as const, reason: v.reason!, ...(v.note.trim() ? { note: v.note.trim() } : {}) };
    // Written to the phone's outbox with the tap time; the dialog closes and sending follows.
    this.submission.send(from(this.outbox.tap(this.data.item.id, action, new Date(this.data.at))), (entry) => this.ref.close(entry));
  }
}
