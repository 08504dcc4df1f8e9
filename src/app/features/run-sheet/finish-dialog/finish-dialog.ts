import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { FIGURE_DECIMALS, figure, formatEngineHours } from '@shared/figures';
import { roundTo } from '@shared/round';
import { acresToHa, haToAcres } from '@shared/units';
import { Units } from '../../../shared/units/units';
import { finishDefaults } from '../job-actions';
import { OutboxStore } from '../outbox-store';
import { retryMessage } from '../send-failure';
import type { JobDialogData } from '../start-dialog/start-dialog';
import { from } from 'rxjs';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';

/** Each key of a finish's API body and the box it is typed in, by its label. */
export const FINISH_FIELDS: FormFields = {
  acres: { control: 'acres', label: 'Area done' },
  engineHours: { control: 'engineHours', label: 'Engine hours at the end' },
  note: { control: 'note', label: 'Note' },
  at: { control: 'at', label: 'Time of the tap' },
};

/** Finish a job: area done (acres, or hectares on a metric farm) and the engine-hour meter at the end. */
@Component({
  selector: 'app-finish-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './finish-dialog.html',
  styleUrl: '../job-dialog.scss',
})
export class FinishDialog {
  private readonly outbox = inject(OutboxStore);
  private readonly ref = inject<MatDialogRef<FinishDialog>>(MatDialogRef);
  private readonly units = inject(Units);
  protected readonly data = inject<JobDialogData>(MAT_DIALOG_DATA);

  protected readonly metric = computed(() => this.units.system() === 'metric');
  protected readonly areaLabel = computed(() => (this.metric() ? 'Hectares done' : 'Acres done'));
  protected readonly areaUnit = computed(() => (this.metric() ? 'ha' : 'ac'));
  protected readonly planned = this.units.area(this.data.item.acresPlanned);

  private readonly defaults = finishDefaults(this.data.item);
  protected readonly form = new FormGroup({
    acres: new FormControl<number | null>(this.metric() ? roundTo(acresToHa(this.defaults.acres), 2) : this.defaults.acres, [
      Validators.required,
      Validators.min(0.01),
      Validators.max(100_000),
    ]),
    engineHours: new FormControl<number | null>(this.defaults.engineHours, [
      Validators.required,
      Validators.min(0),
      Validators.max(200_000),
    ]),
    note: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(1000)] }),
  });
  private readonly endReading = toSignal(this.form.controls.engineHours.valueChanges, { initialValue: this.defaults.engineHours });
  /** The engine hours this job ran as typed: the end reading less the start reading (what the log will show). */
  protected readonly meterHint = computed(() => {
    const start = this.data.item.log.engineHoursStart!;
    const end = this.endReading();
    if (typeof end !== 'number' || end < start) return `At the start: ${formatEngineHours(start)}`;
    return `At the start: ${formatEngineHours(start)} · ${figure(end - start, FIGURE_DECIMALS.hours)} engine hours on this job`;
  });
  private readonly submission = new FormSubmission(this.form, FINISH_FIELDS, (err) => retryMessage(err, 'Finish'));
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  protected submit(): void {
    if (!this.submission.ready()) return;
    const v = this.form.getRawValue();
    const acres = this.metric() ? roundTo(haToAcres(v.acres!), 2) : v.acres!;
    const action = { type: 'finish' as const, acres, engineHours: v.engineHours!, ...(v.note.trim() ? { note: v.note.trim() } : {}) };
    // Written to the phone's outbox with the tap time; the dialog closes and sending follows.
    this.submission.send(from(this.outbox.tap(this.data.item.id, action, new Date(this.data.at))), (entry) => this.ref.close(entry));
  }
}
