import { FIELD_NAME_MAX } from '@shared/field-names';
import { CropPipe } from '../../../shared/units/crop-pipe';
import { httpResource } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  Injector,
  afterNextRender,
  computed,
  effect,
  inject,
  input,
  signal,
  viewChild,
} from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import type { Geometry } from 'geojson';
import type * as L from 'leaflet';
import { type Observable, filter, switchMap } from 'rxjs';
import { AuthStore } from '../../../core/auth/auth-store';
import { messageOf } from '../../../core/http/api-error';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { FIELD_FORM_FIELDS } from '../field-form-fields';
import { type DrawnShape, drawShape, stopDrawing } from '../../../shared/map/draw-shape';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { HazardLegend } from '../../../shared/map/hazard-legend/hazard-legend';
import type { HazardFeature, MapField } from '../../../shared/map/map-types';
import { ConfirmDialog, type ConfirmDialogData } from '../../../shared/ui/confirm-dialog/confirm-dialog';
import { AreaPipe } from '../../../shared/units/area-pipe';
import { BoundaryEditor } from '../boundary-editor/boundary-editor';
import { measureBoundary } from '../boundary-measure';
import { CropPlans } from '../crop-plans/crop-plans';
import type { BoundaryOverlap, FieldDetail } from '@shared/schemas/fields';
import { Units } from '../../../shared/units/units';
import { overlapWarning } from '../overlap-warning';
import { type Boundary, FieldsApi, fieldUrl } from '../fields-api';
import { HazardForm } from '../hazard-form/hazard-form';
import { HazardList } from '../hazard-list/hazard-list';
import { HAZARD_LABELS, type HazardKind } from '@shared/schemas/fields';
import { requiredText } from '../../../shared/forms/required-text';

const SHAPE_NAMES: Record<DrawnShape, string> = { Marker: 'point', Line: 'line', Polygon: 'area' };
/** The drawing tool that makes a geometry of each type again. */
const SHAPE_OF: Record<string, DrawnShape> = {
  Point: 'Marker',
  MultiPoint: 'Marker',
  LineString: 'Line',
  MultiLineString: 'Line',
  Polygon: 'Polygon',
  MultiPolygon: 'Polygon',
};

/** Hazard being added (drawn geometry) or edited (existing feature). */
interface HazardEdit {
  hazard: HazardFeature | null;
  geometry: Geometry | null;
  shape: string;
}

/**
 * One field: its map with hazards and clearance zones, acres, crop plan, hazards and notes. The
 * owner edits everything here; operators and viewers read it with no edit controls at all.
 */
@Component({
  selector: 'app-field-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    CropPipe,
    AreaPipe,
    BoundaryEditor,
    CropPlans,
    FieldMap,
    HazardForm,
    HazardLegend,
    HazardList,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './field-page.html',
  styleUrl: './field-page.scss',
})
export class FieldPage {
  private readonly api = inject(FieldsApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  private readonly units = inject(Units);
  private readonly injector = inject(Injector);

  /** The `:id` route parameter. */
  readonly id = input.required<string>();

  private readonly auth = inject(AuthStore);
  protected readonly isOwner = this.auth.isOwner;
  protected readonly season = this.auth.currentSeason();
  protected readonly field = httpResource<FieldDetail>(() => fieldUrl(Number(this.id()), this.season));
  protected readonly detail = computed(() => (this.field.hasValue() ? this.field.value() : null));
  protected readonly loadError = computed(() => {
    const error = this.field.error();
    return error ? messageOf(error) : null;
  });
  protected readonly mapFields = computed<MapField[]>(() => {
    const f = this.detail();
    return f ? [{ id: f.id, name: f.name, boundary: f.boundary }] : [];
  });
  protected readonly hazards = computed(() => this.detail()?.hazards.features ?? []);
  protected readonly hazardKinds = computed(() => [...new Set(this.hazards().map((h) => h.properties.kind))]);

  protected readonly editingBoundary = signal(false);
  protected readonly draft = signal<Boundary | null>(null);
  protected readonly draftMeasure = computed(() => measureBoundary(this.draft(), this.detail()?.name));
  protected readonly drawing = signal<DrawnShape | null>(null);
  protected readonly hazardEdit = signal<HazardEdit | null>(null);
  protected readonly highlighted = signal<number | null>(null);
  protected readonly busy = signal(false);
  protected readonly boundaryError = signal<string | null>(null);
  protected readonly hazardError = signal<string | null>(null);
  /**
   * The farm's fields this one's boundary overlaps, as last saved here (or by New field, which
   * passes them in the navigation's state): a warning that stays until the boundary is saved again.
   */
  protected readonly overlaps = signal<BoundaryOverlap[]>(
    (inject(Router).currentNavigation()?.extras.state?.['overlaps'] as BoundaryOverlap[] | undefined) ?? [],
  );
  protected readonly overlapNote = computed(() => overlapWarning(this.overlaps(), (acres) => this.units.area(acres)));
  private readonly hazardPanel = viewChild('hazardPanel', { read: ElementRef<HTMLElement> });
  private readonly markPoint = viewChild('markPoint', { read: ElementRef<HTMLElement> });

  protected readonly details = new FormGroup({
    name: new FormControl('', { nonNullable: true, validators: [requiredText, Validators.maxLength(FIELD_NAME_MAX)] }),
    notes: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(2000)] }),
  });
  private readonly detailsSubmission = new FormSubmission(this.details, FIELD_FORM_FIELDS);
  protected readonly detailsError = this.detailsSubmission.error;
  protected readonly detailsBusy = this.detailsSubmission.busy;
  protected readonly detailsBlocked = this.detailsSubmission.blocked;

  private map: L.Map | null = null;

  constructor() {
    // Fill the owner's form from what is saved, but never over what they are typing.
    effect(() => {
      const f = this.detail();
      if (f && !this.details.dirty) this.details.reset({ name: f.name, notes: f.notes ?? '' });
    });
  }

  protected mapReady(map: L.Map): void {
    this.map = map;
  }

  protected showHazard(id: number): void {
    this.highlighted.set(id);
    document.getElementById(`hazard-${id}`)?.scrollIntoView({ block: 'nearest' });
  }

  // Boundary

  protected editBoundary(): void {
    this.stopHazardDrawing();
    this.boundaryError.set(null);
    this.draft.set(this.detail()?.boundary ?? null);
    this.editingBoundary.set(true);
  }

  protected cancelBoundary(): void {
    this.editingBoundary.set(false);
    this.boundaryError.set(null);
  }

  protected saveBoundary(): void {
    const f = this.detail();
    const boundary = this.draft();
    if (!f || this.busy()) return;
    if (!boundary) {
      this.boundaryError.set('The field needs a boundary: draw at least one part before saving.');
      return;
    }
    this.write(this.api.update(f.id, { boundary }), this.boundaryError, (saved) => {
      this.editingBoundary.set(false);
      this.overlaps.set(saved.overlaps ?? []);
      this.tell(saved.overlaps?.length ? 'Boundary saved, with an overlap: see the warning above the map.' : 'Boundary saved.');
    });
  }

  // Hazards

  protected startHazard(shape: DrawnShape): void {
    const map = this.map;
    if (!map) return;
    this.hazardError.set(null);
    this.hazardEdit.set(null);
    this.drawing.set(shape);
    void drawShape(map, shape).then((geometry) => {
      this.drawing.set(null);
      if (geometry) this.hazardEdit.set({ hazard: null, geometry, shape: SHAPE_NAMES[shape] });
    });
  }

  /** The hazard being drawn again, while its new shape is drawn. */
  protected readonly redrawing = signal<HazardFeature | null>(null);

  protected redrawHazard(hazard: HazardFeature): void {
    const map = this.map;
    const f = this.detail();
    if (!map || !f) return;
    const shape = SHAPE_OF[hazard.geometry.type];
    this.hazardError.set(null);
    this.hazardEdit.set(null);
    this.drawing.set(shape);
    this.redrawing.set(hazard);
    map.getContainer().scrollIntoView({ block: 'nearest' });
    void drawShape(map, shape).then((geometry) => {
      this.drawing.set(null);
      this.redrawing.set(null);
      if (geometry)
        this.write(this.api.updateHazard(f.id, hazard.properties.id, { geometry }), this.hazardError, () =>
          this.tell(`The ${this.hazardLabel(hazard)} was redrawn.`),
        );
    });
  }

  protected hazardLabel(hazard: HazardFeature): string {
    return (HAZARD_LABELS[hazard.properties.kind as HazardKind] ?? hazard.properties.kind).toLowerCase();
  }

  protected stopHazardDrawing(): void {
    if (this.map && this.drawing()) stopDrawing(this.map);
  }

  protected editHazard(hazard: HazardFeature): void {
    this.hazardError.set(null);
    this.hazardEdit.set({ hazard, geometry: null, shape: '' });
    // The form opens beside the map; from the list below, bring it (and the map) into view.
    afterNextRender(() => this.hazardPanel()?.nativeElement.scrollIntoView?.({ block: 'nearest' }), { injector: this.injector });
  }

  /** The hazard form saved it: show it, and get ready for the next one without moving the page. */
  protected hazardSaved(edit: HazardEdit): void {
    this.field.reload();
    this.hazardEdit.set(null);
    this.tell(edit.hazard ? 'Hazard saved.' : 'Hazard added.');
    afterNextRender(() => this.markPoint()?.nativeElement.focus({ preventScroll: true }), { injector: this.injector });
  }

  protected confirmHazard(hazard: HazardFeature): void {
    const f = this.detail();
    if (f)
      this.write(this.api.updateHazard(f.id, hazard.properties.id, { status: 'confirmed' }), this.hazardError, () =>
        this.tell('Hazard confirmed.'),
      );
  }

  protected removeHazard(hazard: HazardFeature): void {
    const f = this.detail();
    if (!f) return;
    this.ask(
      { title: 'Remove this hazard?', message: 'It will no longer show on maps, pass plans or run sheets.', confirm: 'Remove' },
      () => this.api.removeHazard(f.id, hazard.properties.id),
    ).subscribe({
      next: () => {
        this.field.reload();
        this.tell('Hazard removed.');
      },
      error: (err: unknown) => this.tell(messageOf(err)),
    });
  }

  // Name, notes, crops, the field itself

  protected saveDetails(): void {
    const f = this.detail();
    if (!f || this.busy() || !this.detailsSubmission.ready()) return;
    const { name, notes } = this.details.getRawValue();
    this.detailsSubmission.send(this.api.update(f.id, { name: name.trim(), notes: notes.trim() || null }), () => {
      this.details.markAsPristine();
      this.field.reload();
      this.tell('Details saved.');
    });
  }

  protected cropsChanged(): void {
    this.field.reload();
    this.tell('Crop plan saved.');
  }

  protected deleteField(): void {
    const f = this.detail();
    if (!f) return;
    const data: ConfirmDialogData = {
      title: `Delete ${f.name}?`,
      message: `${f.name}, its boundary, hazards and crop plans will be deleted. This cannot be undone.`,
      confirm: 'Delete field',
    };
    this.ask(data, () => this.api.remove(f.id)).subscribe({
      next: () => {
        this.tell(`${f.name} was deleted.`);
        void this.router.navigateByUrl('/fields');
      },
      error: (err: unknown) => this.tell(messageOf(err)),
    });
  }

  private ask<T>(data: ConfirmDialogData, then: () => Observable<T>): Observable<T> {
    return this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, autoFocus: 'dialog' })
      .afterClosed()
      .pipe(
        filter((yes) => yes === true),
        switchMap(then),
      );
  }

  /** Sends a change, reloads the field on success, and shows the server's message on failure. */
  private write<T>(request: Observable<T>, error: ReturnType<typeof signal<string | null>>, done: (value: T) => void): void {
    this.busy.set(true);
    error.set(null);
    request.subscribe({
      next: (value) => {
        this.busy.set(false);
        this.field.reload();
        done(value);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        error.set(messageOf(err));
      },
    });
  }

  private tell(message: string): void {
    this.snackBar.open(message, 'Close', { duration: 6000 });
  }
}
