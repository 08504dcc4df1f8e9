import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { type AbstractControl, FormControl, FormGroup, ReactiveFormsModule, type ValidationErrors, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { formatPower } from '@shared/figures';
import { OPERATION_INFO, OPERATIONS, type Operation } from '@shared/operations';
import type { ImplementKind } from '@shared/plan/implement-defaults';
import {
  IMPLEMENT_KIND_LABELS,
  IMPLEMENT_KINDS,
  type Implement,
  type ImplementInput,
  MACHINE_KIND_LABELS,
  type Machine,
  implementBody,
} from '@shared/schemas/fleet';
import { type Observable, startWith } from 'rxjs';
import type { FormFields } from '../../../shared/forms/field-labels';
import { zodValidator } from '../../../shared/forms/zod-validator';
import { Units } from '../../../shared/units/units';
import { problemOf } from '../control-problem';
import { FleetApi } from '../fleet-api';
import { cautionsFor } from '../cautions';
import { ImplementCautions } from '../implement-cautions/implement-cautions';
import { metresToWidth, widthToMetres } from '../widths';
import { FormSubmission } from '../../../shared/forms/form-submission';

export interface ImplementFormData {
  /** The implement to edit; null to add one. */
  implement: Implement | null;
  /** The farm's machines, to choose which may pull or carry it. */
  machines: readonly Machine[];
}

/** Widest working and transport widths the API stores, metres (see implementBody). */
const MAX_WIDTH_M = 60;
const MAX_TRANSPORT_M = 20;

const shape = implementBody.shape;
const positive = (c: AbstractControl): ValidationErrors | null =>
  typeof c.value === 'number' && !(c.value > 0) ? { positive: true } : null;
const someOperation = (c: AbstractControl): ValidationErrors | null => ((c.value as Operation[]).length ? null : { none: true });

/** Which operations an implement of this kind can do. */
export function operationsFor(kind: ImplementKind | null): Operation[] {
  return kind ? OPERATIONS.filter((op) => OPERATION_INFO[op].implementKinds.includes(kind)) : [];
}

/** Each key of the implement's API body and the box it is typed in, by its label. */
export const IMPLEMENT_FIELDS: FormFields = {
  name: { control: 'name', label: 'Name' },
  kind: { control: 'kind', label: 'Kind' },
  widthM: { control: 'width', label: 'Working width' },
  transportWidthM: { control: 'transportWidth', label: 'Transport width' },
  operations: { control: 'operations', label: 'Operations it does' },
  machineIds: { control: 'machineIds', label: 'Machines that pull or carry it' },
  minPowerHp: { control: 'minPowerHp', label: 'Minimum power' },
  notes: { control: 'notes', label: 'Notes' },
};

/**
 * Adds or edits an implement. Widths are typed in the farm's unit (ft or m) and sent in metres;
 * an unchanged width is sent back exactly as stored, so editing a name never nudges a width.
 */
@Component({
  selector: 'app-implement-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ImplementCautions,
    MatButtonModule,
    MatCheckboxModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  templateUrl: './implement-form.html',
  styleUrl: './implement-form.scss',
})
export class ImplementForm {
  private readonly api = inject(FleetApi);
  private readonly dialogRef = inject<MatDialogRef<ImplementForm, Implement>>(MatDialogRef);
  protected readonly data = inject<ImplementFormData>(MAT_DIALOG_DATA);
  protected readonly units = inject(Units);

  private readonly system = this.units.system();
  private readonly initial = this.data.implement;
  private readonly initialWidth = this.initial ? metresToWidth(this.initial.widthM, this.system) : null;
  private readonly initialTransport =
    this.initial?.transportWidthM != null ? metresToWidth(this.initial.transportWidthM, this.system) : null;

  protected readonly unit = this.units.lengthUnit();
  protected readonly maxWidth = Math.floor(metresToWidth(MAX_WIDTH_M, this.system) * 10) / 10;
  protected readonly maxTransport = Math.floor(metresToWidth(MAX_TRANSPORT_M, this.system) * 10) / 10;
  protected readonly kinds = IMPLEMENT_KINDS.map((kind) => ({ kind, label: IMPLEMENT_KIND_LABELS[kind] }));
  protected readonly machines = this.data.machines.map((m) => ({
    id: m.id,
    label: `${m.name} (${MACHINE_KIND_LABELS[m.kind] ?? m.kind}, ${formatPower(m.powerHp)})`,
  }));
  protected readonly problemOf = problemOf;

  protected readonly form = new FormGroup({
    name: new FormControl(this.initial?.name ?? '', { nonNullable: true, validators: [Validators.required, zodValidator(shape.name)] }),
    kind: new FormControl<ImplementKind | null>(this.initial?.kind ?? null, { validators: [Validators.required] }),
    width: new FormControl<number | null>(this.initialWidth, {
      validators: [Validators.required, positive, Validators.max(this.maxWidth)],
    }),
    transportWidth: new FormControl<number | null>(this.initialTransport, { validators: [positive, Validators.max(this.maxTransport)] }),
    operations: new FormControl<Operation[]>(this.initial?.operations ?? [], { nonNullable: true, validators: [someOperation] }),
    machineIds: new FormControl<number[]>(this.initial?.machineIds ?? [], { nonNullable: true }),
    minPowerHp: new FormControl<number | null>(this.initial?.minPowerHp ?? null, { validators: [zodValidator(shape.minPowerHp)] }),
    notes: new FormControl(this.initial?.notes ?? '', { nonNullable: true, validators: [zodValidator(shape.notes)] }),
  });
  private readonly submission = new FormSubmission(this.form, IMPLEMENT_FIELDS);
  protected readonly blocked = this.submission.blocked;
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;

  private readonly kind = toSignal(this.form.controls.kind.valueChanges.pipe(startWith(this.form.controls.kind.value)), {
    requireSync: true,
  });
  private readonly widths = toSignal(this.form.valueChanges.pipe(startWith(this.form.getRawValue())), { requireSync: true });
  private readonly chosen = toSignal(this.form.controls.operations.valueChanges.pipe(startWith(this.form.controls.operations.value)), {
    requireSync: true,
  });

  /** The operations this kind can do, as checkboxes. */
  protected readonly operations = computed(() =>
    operationsFor(this.kind()).map((op) => ({ op, label: OPERATION_INFO[op].label, checked: this.chosen().includes(op) })),
  );
  /** Road and power-line cautions for the widths as typed. */
  protected readonly cautions = computed(() => {
    const { width, transportWidth } = this.widths();
    const toM = (v: number | null | undefined) => (typeof v === 'number' && v > 0 ? widthToMetres(v, this.system) : null);
    return cautionsFor({ widthM: toM(width), transportWidthM: toM(transportWidth) }).map((text) => ({ text }));
  });

  constructor() {
    // A kind keeps only the operations it can do; a kind that does one thing gets it ticked.
    this.form.controls.kind.valueChanges.subscribe((kind) => {
      const allowed = operationsFor(kind);
      const kept = this.form.controls.operations.value.filter((op) => allowed.includes(op));
      this.form.controls.operations.setValue(kept.length === 0 && allowed.length === 1 ? allowed : kept);
    });
  }

  protected toggle(op: Operation, checked: boolean): void {
    const control = this.form.controls.operations;
    const next = checked ? [...control.value.filter((o) => o !== op), op] : control.value.filter((o) => o !== op);
    control.setValue(OPERATIONS.filter((o) => next.includes(o)));
    control.markAsTouched();
  }

  protected submit(): void {
    if (!this.submission.ready()) return;
    const body = this.body();
    const id = this.initial?.id;
    const save: Observable<Implement> = id ? this.api.updateImplement(id, body) : this.api.createImplement(body);
    this.submission.send(save, (implement) => this.dialogRef.close(implement));
  }

  /** The request body, widths in metres. */
  private body(): ImplementInput {
    const v = this.form.getRawValue();
    const width = v.width as number;
    const transport = v.transportWidth;
    return {
      name: v.name.trim(),
      kind: v.kind as ImplementKind,
      widthM: this.initial && width === this.initialWidth ? this.initial.widthM : widthToMetres(width, this.system),
      transportWidthM:
        transport === null
          ? null
          : this.initial && transport === this.initialTransport
            ? this.initial.transportWidthM
            : widthToMetres(transport, this.system),
      operations: v.operations,
      machineIds: v.machineIds,
      minPowerHp: v.minPowerHp,
      notes: v.notes.trim() || null,
    };
  }
}
