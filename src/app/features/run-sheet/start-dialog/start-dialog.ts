import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { RunSheetItem } from '@shared/schemas/run-sheet';
import { from } from 'rxjs';
import { startDefaults } from '../job-actions';
import { OutboxStore } from '../outbox-store';
import { retryMessage } from '../send-failure';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';

export interface JobDialogData {
  item: RunSheetItem;
  /** When the operator tapped the button (ISO 8601): the time logged, even if sending takes a while. */
  at: string;
}

/** Each key of a start's API body and the box it is typed in, by its label. */
export const START_FIELDS: FormFields = {
  engineHours: { control: 'engineHours', label: 'Engine hours at the start' },
  at: { control: 'at', label: 'Time of the tap' },
};

/** Start a job: the engine-hour meter reading, prefilled with the machine's last known reading; kept in the outbox, then sent. */
@Component({
  selector: 'app-start-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './start-dialog.html',
  styleUrl: '../job-dialog.scss',
})
export class StartDialog {
  private readonly outbox = inject(OutboxStore);
  private readonly ref = inject<MatDialogRef<StartDialog>>(MatDialogRef);
  protected readonly data = inject<JobDialogData>(MAT_DIALOG_DATA);
  /** The forecast's first no-go reason over the job's hours, said once more before starting; null when not no-go. */
  protected readonly noGo = (): string | null => {
    const v = this.data.item.weather?.verdict;
    return v?.verdict === 'no-go' ? (v.reasons[0] ?? 'see the forecast on the run sheet') : null;
  };

  protected readonly form = new FormGroup({
    engineHours: new FormControl<number | null>(startDefaults(this.data.item).engineHours, [
      Validators.required,
      Validators.min(0),
      Validators.max(200_000),
    ]),
  });
  private readonly submission = new FormSubmission(this.form, START_FIELDS, (err) => retryMessage(err, 'Start'));
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  protected submit(): void {
    if (!this.submission.ready()) return;
    // Written to the phone's outbox with the tap time; the dialog closes and sending follows.
    const action = { type: 'start' as const, engineHours: this.form.getRawValue().engineHours! };
    this.submission.send(from(this.outbox.tap(this.data.item.id, action, new Date(this.data.at))), (entry) => this.ref.close(entry));
  }
}
