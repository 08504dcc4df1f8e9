import { FIELD_NAME_MAX } from '@shared/field-names';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import type { FieldSummary } from '@shared/schemas/fields';
import { FormSubmission } from '../../../shared/forms/form-submission';
import type { MapField } from '../../../shared/map/map-types';
import { AreaPipe } from '../../../shared/units/area-pipe';
import { BoundaryEditor } from '../boundary-editor/boundary-editor';
import { measureBoundary } from '../boundary-measure';
import { type Boundary, FieldsApi, fieldsUrl } from '../fields-api';
import { FIELD_FORM_FIELDS } from '../field-form-fields';
import { AuthStore } from '../../../core/auth/auth-store';
import { requiredText } from '../../../shared/forms/required-text';

/** The owner draws a new field (parts and holes), sees its acres live, names it and saves it. */
@Component({
  selector: 'app-new-field',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaPipe, BoundaryEditor, MatButtonModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule, RouterLink],
  templateUrl: './new-field.html',
  styleUrl: './new-field.scss',
})
export class NewField {
  /** Longest field name (shared/field-names). */
  protected readonly nameMax = FIELD_NAME_MAX;
  private readonly api = inject(FieldsApi);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  private readonly auth = inject(AuthStore);

  protected readonly form = new FormGroup({
    name: new FormControl('', { nonNullable: true, validators: [requiredText, Validators.maxLength(FIELD_NAME_MAX)] }),
    notes: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(2000)] }),
  });
  private readonly name = toSignal(this.form.controls.name.valueChanges, { initialValue: '' });

  /** The other fields of the farm, drawn dashed so the new one can be placed beside them. */
  private readonly existing = httpResource<FieldSummary[]>(() => fieldsUrl(this.auth.currentSeason()), { defaultValue: [] });
  protected readonly context = computed<MapField[]>(() =>
    (this.existing.hasValue() ? this.existing.value() : []).map((f) => ({
      id: f.id,
      name: f.name,
      boundary: f.boundary as MapField['boundary'],
      muted: true,
    })),
  );

  protected readonly boundary = signal<Boundary | null>(null);
  protected readonly measure = computed(() => measureBoundary(this.boundary(), this.name()));
  protected readonly partCount = computed(() => {
    const b = this.boundary();
    return b === null ? 0 : b.type === 'Polygon' ? 1 : b.coordinates.length;
  });
  protected readonly holeCount = computed(() => {
    const b = this.boundary();
    if (!b) return 0;
    const parts = b.type === 'Polygon' ? [b.coordinates] : b.coordinates;
    return parts.reduce((n, rings) => n + rings.length - 1, 0);
  });
  private readonly submission = new FormSubmission(this.form, FIELD_FORM_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  protected drawn(boundary: Boundary | null): void {
    this.boundary.set(boundary);
    this.error.set(null);
  }

  protected save(): void {
    if (!this.submission.ready()) return;
    const boundary = this.boundary();
    if (!boundary) {
      this.error.set('Draw the boundary on the map first: choose “Draw a part” and click its corners.');
      return;
    }
    const { name, notes } = this.form.getRawValue();
    this.submission.send(this.api.create({ name: name.trim(), boundary, ...(notes.trim() ? { notes: notes.trim() } : {}) }), (field) => {
      const overlaps = field.overlaps ?? [];
      this.snackBar.open(
        overlaps.length ? `${field.name} saved. It overlaps other fields: see the warning above its map.` : `${field.name} saved.`,
        'Close',
        { duration: 6000 },
      );
      // The field's page shows the overlap warning (a warning: the field is saved as drawn).
      void this.router.navigate(['/fields', field.id], { state: { overlaps } });
    });
  }
}
