import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MACHINE_KIND_LABELS, MACHINE_KINDS, type Machine, type MachineInput, type MachineKind, machineBody } from '@shared/schemas/fleet';
import type { Observable } from 'rxjs';
import { zodValidator } from '../../../shared/forms/zod-validator';
import { problemOf } from '../control-problem';
import { FleetApi } from '../fleet-api';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';

export interface MachineFormData {
  /** The machine to edit; null to add one. */
  machine: Machine | null;
}

const shape = machineBody.shape;

/** Each key of the machine's API body and the box it is typed in, by its label. */
export const MACHINE_FIELDS: FormFields = {
  name: { control: 'name', label: 'Name' },
  kind: { control: 'kind', label: 'Kind' },
  powerHp: { control: 'powerHp', label: 'Power' },
  engineHours: { control: 'engineHours', label: 'Engine hours' },
  serviceIntervalHours: { control: 'serviceIntervalHours', label: 'Service interval' },
  hoursAtLastService: { control: 'hoursAtLastService', label: 'Hours at last service' },
  notes: { control: 'notes', label: 'Notes' },
};

/** Adds or edits a tractor or self-propelled machine; closes with the saved machine. */
@Component({
  selector: 'app-machine-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './machine-form.html',
  styleUrl: './machine-form.scss',
})
export class MachineForm {
  private readonly api = inject(FleetApi);
  private readonly dialogRef = inject<MatDialogRef<MachineForm, Machine>>(MatDialogRef);
  protected readonly data = inject<MachineFormData>(MAT_DIALOG_DATA);

  protected readonly kinds = MACHINE_KINDS.map((kind) => ({ kind, label: MACHINE_KIND_LABELS[kind] }));
  protected readonly problemOf = problemOf;

  protected readonly form = new FormGroup({
    name: new FormControl(this.data.machine?.name ?? '', {
      nonNullable: true,
      validators: [Validators.required, zodValidator(shape.name)],
    }),
    kind: new FormControl<MachineKind | null>(this.data.machine?.kind ?? null, { validators: [Validators.required] }),
    powerHp: new FormControl<number | null>(this.data.machine?.powerHp ?? null, {
      validators: [Validators.required, zodValidator(shape.powerHp)],
    }),
    engineHours: new FormControl<number | null>(this.data.machine?.engineHours ?? 0, {
      validators: [Validators.required, zodValidator(shape.engineHours)],
    }),
    serviceIntervalHours: new FormControl<number | null>(this.data.machine?.serviceIntervalHours ?? null, {
      validators: [zodValidator(shape.serviceIntervalHours)],
    }),
    hoursAtLastService: new FormControl<number | null>(this.data.machine?.hoursAtLastService ?? null, {
      validators: [zodValidator(shape.hoursAtLastService)],
    }),
    notes: new FormControl(this.data.machine?.notes ?? '', { nonNullable: true, validators: [zodValidator(shape.notes)] }),
  });
  private readonly submission = new FormSubmission(this.form, MACHINE_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  protected submit(): void {
    if (!this.submission.ready()) return;
    const v = this.form.getRawValue();
    const body: MachineInput = {
      name: v.name.trim(),
      kind: v.kind as MachineKind,
      powerHp: v.powerHp as number,
      engineHours: v.engineHours ?? 0,
      serviceIntervalHours: v.serviceIntervalHours,
      hoursAtLastService: v.hoursAtLastService,
      notes: v.notes.trim() || null,
    };
    const id = this.data.machine?.id;
    const save: Observable<Machine> = id ? this.api.updateMachine(id, body) : this.api.createMachine(body);
    this.submission.send(save, (machine) => this.dialogRef.close(machine));
  }
}
