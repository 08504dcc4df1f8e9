import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { CALL_OFF_REASONS } from '@shared/schemas/jobs';
import type { RunSheetItem } from '@shared/schemas/run-sheet';
import { RunSheetApi } from '../run-sheet-api';
import { sendFailure } from '../send-failure';
import type { JobDialogData } from '../start-dialog/start-dialog';
import { FormSubmission } from '../../../shared/forms/form-submission';

type Reason = (typeof CALL_OFF_REASONS)[number];
const REASON_LABELS: Record<Reason, string> = { weather: 'Weather', breakdown: 'Breakdown', other: 'Other' };

/** Call a job off: why (weather, breakdown, other) and a note, needed for "other". */
@Component({
  selector: 'app-call-off-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, MatRadioModule, ReactiveFormsModule],
  templateUrl: './call-off-dialog.html',
  styleUrl: '../job-dialog.scss',
})
export class CallOffDialog {
  private readonly api = inject(RunSheetApi);
  private readonly ref = inject<MatDialogRef<CallOffDialog, RunSheetItem>>(MatDialogRef);
  protected readonly data = inject<JobDialogData>(MAT_DIALOG_DATA);

  protected readonly reasons = CALL_OFF_REASONS.map((value) => ({ value, label: REASON_LABELS[value] }));
  protected readonly form = new FormGroup({
    reason: new FormControl<Reason | null>(null, Validators.required),
    note: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(1000)] }),
  });
  private readonly submission = new FormSubmission(this.form, (err, form) => sendFailure(err, 'Call off', form));
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;

  protected submit(): void {
    const v = this.form.getRawValue();
    if (v.reason === 'other' && !v.note.trim()) this.form.controls.note.setErrors({ required: true });
    if (!this.submission.ready()) return;
    this.submission.send(
      this.api.event(this.data.item.id, {
        type: 'call-off',
        reason: v.reason!,
        ...(v.note.trim() ? { note: v.note.trim() } : {}),
        at: this.data.at,
      }),
      (item) => this.ref.close(item),
    );
  }
}
