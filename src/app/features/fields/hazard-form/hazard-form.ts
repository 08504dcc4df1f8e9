import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { HAZARD_KINDS, HAZARD_LABELS } from '@shared/schemas/fields';
import type { HazardProperties } from '../../../shared/map/map-types';
import { Units } from '../../../shared/units/units';

/** Largest clearance the API stores, metres. */
const MAX_CLEARANCE_M = 500;

export interface HazardFormValue {
  kind: string;
  /** Metres, converted from what was typed in the farm's unit. */
  clearanceM: number;
  note: string | null;
}

/** Kind, clearance (typed in ft or m by the farm's units; sent in metres) and note of one hazard. */
@Component({
  selector: 'app-hazard-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './hazard-form.html',
  styleUrl: './hazard-form.scss',
})
export class HazardForm {
  protected readonly units = inject(Units);

  /** The hazard being edited; null for a new one. */
  readonly hazard = input<HazardProperties | null>(null);
  /** What was drawn, for the heading ("point", "line", "area"). */
  readonly shape = input('');
  readonly busy = input(false);
  readonly error = input<string | null>(null);

  readonly saved = output<HazardFormValue>();
  readonly cancelled = output<void>();

  protected readonly kinds = HAZARD_KINDS.map((kind) => ({ kind, label: HAZARD_LABELS[kind] }));
  protected readonly maxClearance = computed(() => this.units.fromMetres(MAX_CLEARANCE_M));
  protected readonly form = new FormGroup({
    kind: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    clearance: new FormControl<number | null>(null, { validators: [Validators.required, Validators.min(0)] }),
    note: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(500)] }),
  });

  constructor() {
    effect(() => {
      const h = this.hazard();
      this.form.controls.clearance.setValidators([Validators.required, Validators.min(0), Validators.max(this.maxClearance())]);
      if (h) this.form.reset({ kind: h.kind, clearance: this.units.fromMetres(h.clearanceM), note: h.note ?? '' });
    });
  }

  protected submit(): void {
    if (this.busy()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { kind, clearance, note } = this.form.getRawValue();
    this.saved.emit({ kind, clearanceM: Math.min(MAX_CLEARANCE_M, this.units.toMetres(clearance ?? 0)), note: note.trim() || null });
  }
}
