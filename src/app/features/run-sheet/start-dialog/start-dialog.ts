import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { RunSheetItem } from '@shared/schemas/run-sheet';
import { startDefaults } from '../job-actions';
import { RunSheetApi } from '../run-sheet-api';
import { sendFailure } from '../send-failure';
import { FormSubmission } from '../../../shared/forms/form-submission';

export interface JobDialogData {
  item: RunSheetItem;
  /** When the operator tapped the button (ISO 8601): the time logged, even if sending takes a while. */
  at: string;
}

/** Start a job: the engine-hour meter reading, prefilled with the machine's last known reading. */
@Component({
  selector: 'app-start-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './start-dialog.html',
  styleUrl: '../job-dialog.scss',
})
export class StartDialog {
  private readonly api = inject(RunSheetApi);
  private readonly ref = inject<MatDialogRef<StartDialog, RunSheetItem>>(MatDialogRef);
  protected readonly data = inject<JobDialogData>(MAT_DIALOG_DATA);

  protected readonly form = new FormGroup({
    engineHours: new FormControl<number | null>(startDefaults(this.data.item).engineHours, [
      Validators.required,
      Validators.min(0),
      Validators.max(200_000),
    ]),
  });
  private readonly submission = new FormSubmission(this.form, (err, form) => sendFailure(err, 'Start', form));
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;

  protected submit(): void {
    if (!this.submission.ready()) return;
    this.submission.send(
      this.api.event(this.data.item.id, { type: 'start', engineHours: this.form.getRawValue().engineHours!, at: this.data.at }),
      (item) => this.ref.close(item),
    );
  }
}
