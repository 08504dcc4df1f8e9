import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import { formatLatLon } from '@shared/figures';
import { PROBLEM_KINDS } from '@shared/schemas/jobs';
import type { ProblemInput } from '@shared/schemas/run-sheet';
import { HAZARD_KINDS, HAZARD_LABELS, type HazardKind } from '@shared/schemas/fields';
import type * as L from 'leaflet';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import type { HazardFeature, MapField } from '../../../shared/map/map-types';
import { Units } from '../../../shared/units/units';
import { OutboxStore } from '../outbox-store';
import { retryMessage } from '../send-failure';
import type { JobDialogData } from '../start-dialog/start-dialog';
import { from } from 'rxjs';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';

type ProblemKind = (typeof PROBLEM_KINDS)[number];
const KIND_LABELS: Record<ProblemKind, string> = { breakdown: 'Breakdown', hazard: 'A new hazard', other: 'Something else' };
/** A new hazard's clearance until the operator says otherwise, metres (about 50 ft). */
const DEFAULT_CLEARANCE_M = 15;

/** Each key of a problem report's API body and the box it is typed in, by its label. */
export const PROBLEM_FIELDS: FormFields = {
  kind: { control: 'kind', label: 'What is it?' },
  note: { control: 'note', label: 'What happened' },
  geometry: { control: 'geometry', label: 'Place on the map' },
  hazardKind: { control: 'hazardKind', label: 'Kind of hazard' },
  clearanceM: { control: 'clearance', label: 'Clearance' },
  pause: { control: 'pause', label: 'Pause the job' },
};

/**
 * Report a problem on a job: a breakdown (pauses the job unless unticked), a new hazard marked on
 * the map (tap, or the phone's own position) with its kind and clearance, or anything else.
 */
@Component({
  selector: 'app-problem-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FieldMap,
    MatButtonModule,
    MatCheckboxModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatRadioModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  templateUrl: './problem-dialog.html',
  styleUrls: ['../job-dialog.scss', './problem-dialog.scss'],
})
export class ProblemDialog {
  private readonly outbox = inject(OutboxStore);
  private readonly ref = inject<MatDialogRef<ProblemDialog>>(MatDialogRef);
  protected readonly units = inject(Units);
  protected readonly data = inject<JobDialogData>(MAT_DIALOG_DATA);

  protected readonly kinds = PROBLEM_KINDS.map((value) => ({ value, label: KIND_LABELS[value] }));
  protected readonly hazardKinds = HAZARD_KINDS.map((value: HazardKind) => ({ value, label: HAZARD_LABELS[value] }));
  protected readonly mapFields: MapField[] = [
    { id: this.data.item.field.id, name: this.data.item.field.name, boundary: this.data.item.field.boundary },
  ];
  protected readonly hazards = this.data.item.field.hazards.features as HazardFeature[];
  protected readonly canPause = this.data.item.state === 'underway';

  protected readonly form = new FormGroup({
    kind: new FormControl<ProblemKind>('breakdown', { nonNullable: true }),
    note: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(1000)] }),
    hazardKind: new FormControl<HazardKind>('rock', { nonNullable: true }),
    clearance: new FormControl<number | null>(this.units.fromMetres(DEFAULT_CLEARANCE_M), [Validators.min(0)]),
    pause: new FormControl(true, { nonNullable: true }),
  });
  private readonly submission = new FormSubmission(this.form, PROBLEM_FIELDS, (err) => retryMessage(err, 'Send report'));
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;
  protected readonly kind = toSignal(this.form.controls.kind.valueChanges, { initialValue: this.form.controls.kind.value });
  /** The hazard's place, [lon, lat]. */
  protected readonly point = signal<[number, number] | null>(null);
  protected readonly pointText = computed(() => {
    const p = this.point();
    return p ? `Marked at ${formatLatLon(p[0], p[1])}` : 'Not marked yet: tap the map where it is.';
  });
  protected readonly locating = signal(false);
  protected readonly canLocate = typeof navigator !== 'undefined' && !!navigator.geolocation;

  protected mapReady(map: L.Map): void {
    map.on('click', (e: L.LeafletMouseEvent) => this.mark(e.latlng.lng, e.latlng.lat));
  }

  protected locate(): void {
    this.locating.set(true);
    navigator.geolocation.getCurrentPosition(
      (pos) => {
        this.locating.set(false);
        this.mark(pos.coords.longitude, pos.coords.latitude);
      },
      () => {
        this.locating.set(false);
        this.error.set('The phone did not give its position: tap the map instead.');
      },
      { enableHighAccuracy: true, timeout: 15_000 },
    );
  }

  /** The map draws the point (FieldMap's `mark`) and keeps the field's name off it. */
  private mark(lon: number, lat: number): void {
    this.point.set([lon, lat]);
  }

  protected submit(): void {
    if (!this.submission.ready()) return;
    const v = this.form.getRawValue();
    const body: ProblemInput = { kind: v.kind, note: v.note.trim() };
    if (v.kind === 'hazard') {
      const point = this.point();
      if (point) body.geometry = { type: 'Point', coordinates: point };
      body.hazardKind = v.hazardKind;
      if (v.clearance != null) body.clearanceM = this.units.toMetres(v.clearance);
    }
    if (v.kind === 'breakdown') body.pause = this.canPause && v.pause;
    // Written to the phone's outbox with the tap time; the dialog closes and sending follows.
    const report = from(this.outbox.tap(this.data.item.id, { type: 'problem', ...body }, new Date(this.data.at)));
    this.submission.send(report, (entry) => this.ref.close(entry));
  }
}
