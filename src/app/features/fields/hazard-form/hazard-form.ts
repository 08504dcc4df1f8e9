import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { HAZARD_KINDS, HAZARD_LABELS } from '@shared/schemas/fields';
import type { Geometry } from 'geojson';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import type { HazardFeature, HazardProperties } from '../../../shared/map/map-types';
import { Units } from '../../../shared/units/units';
import { FieldsApi } from '../fields-api';

/** Largest clearance the API stores, metres. */
const MAX_CLEARANCE_M = 500;

/**
 * Each key of the hazard's API body and the box it is typed in, by its label. The shape is drawn
 * on the map (no box): a refusal of it shows in words above the form.
 */
export const HAZARD_FIELDS: FormFields = {
  kind: { control: 'kind', label: 'Kind' },
  clearanceM: { control: 'clearance', label: 'Clearance' },
  note: { control: 'note', label: 'Note' },
};

/**
 * Kind, clearance (typed in ft or m by the farm's units; sent in metres) and note of one hazard,
 * saved here through the shared form submission; `saved` tells the page once the server has it.
 */
@Component({
  selector: 'app-hazard-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './hazard-form.html',
  styleUrl: './hazard-form.scss',
})
export class HazardForm {
  private readonly api = inject(FieldsApi);
  protected readonly units = inject(Units);

  /** The field the hazard is on. */
  readonly fieldId = input.required<number>();
  /** The hazard being edited; null for a new one. */
  readonly hazard = input<HazardProperties | null>(null);
  /** What was drawn for a new hazard (null when editing one). */
  readonly geometry = input<Geometry | null>(null);
  /** What was drawn, for the heading ("point", "line", "area"). */
  readonly shape = input('');

  /** The server has the hazard as it answered. */
  readonly saved = output<HazardFeature>();
  readonly cancelled = output<void>();

  protected readonly kinds = HAZARD_KINDS.map((kind) => ({ kind, label: HAZARD_LABELS[kind] }));
  protected readonly maxClearance = computed(() => this.units.fromMetres(MAX_CLEARANCE_M));
  protected readonly form = new FormGroup({
    kind: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    clearance: new FormControl<number | null>(null, { validators: [Validators.required, Validators.min(0)] }),
    note: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(500)] }),
  });
  private readonly submission = new FormSubmission(this.form, HAZARD_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly blocked = this.submission.blocked;
  protected readonly error = this.submission.error;

  constructor() {
    effect(() => {
      const h = this.hazard();
      this.form.controls.clearance.setValidators([Validators.required, Validators.min(0), Validators.max(this.maxClearance())]);
      if (h) this.form.reset({ kind: h.kind, clearance: this.units.fromMetres(h.clearanceM), note: h.note ?? '' });
    });
  }

  protected submit(): void {
    if (!this.submission.ready()) return;
    const { kind, clearance, note } = this.form.getRawValue();
    const value = { kind, clearanceM: Math.min(MAX_CLEARANCE_M, this.units.toMetres(clearance ?? 0)), note: note.trim() || null };
    const hazard = this.hazard();
    const request = hazard
      ? this.api.updateHazard(this.fieldId(), hazard.id, value)
      : this.api.addHazard(this.fieldId(), { ...value, geometry: this.geometry() as Geometry });
    this.submission.send(request, (answer) => this.saved.emit(answer));
  }
}
