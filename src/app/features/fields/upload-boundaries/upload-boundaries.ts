import { HttpEventType, httpResource, type HttpEvent } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { importProblems, type FieldSummary, type ImportPreview } from '@shared/schemas/fields';
import { formatFileSize } from '@shared/file-size';
import type { Observable } from 'rxjs';
import { ApiError, messageOf } from '../../../core/http/api-error';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import type { MapField } from '../../../shared/map/map-types';
import { AreaPipe } from '../../../shared/units/area-pipe';
import { FIELD_NAME_MAX } from '@shared/field-names';
import { LIMIT_TEXT, MAX_UPLOAD_BYTES } from '@shared/limits';
import { AuthStore } from '../../../core/auth/auth-store';
import { Units } from '../../../shared/units/units';
import { FieldsApi, fieldsUrl } from '../fields-api';
import {
  farmNameSet,
  type ImportRow,
  rename,
  rowsFromPreview,
  selectionOf,
  selectionProblems,
  setAllTicked,
  setTicked,
} from '../import-selection';
import { overlapWarning } from '../overlap-warning';

/** Largest file the server takes, bytes (it answers 413 above). */
export { MAX_UPLOAD_BYTES };

const isPolygonal = (g: unknown): g is MapField['boundary'] =>
  typeof g === 'object' && g !== null && ['Polygon', 'MultiPolygon'].includes((g as { type?: string }).type ?? '');

/**
 * Upload boundaries from a GeoJSON, KML, KMZ or zipped shapefile: the server previews the file
 * (nothing saved), the owner ticks and names the fields to keep, then the same file goes up again
 * with that selection and is saved all at once, or not at all.
 */
@Component({
  selector: 'app-upload-boundaries',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    AreaPipe,
    FieldMap,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    RouterLink,
  ],
  templateUrl: './upload-boundaries.html',
  styleUrl: './upload-boundaries.scss',
})
export class UploadBoundaries {
  /** Longest field name (shared/field-names). */
  protected readonly nameMax = FIELD_NAME_MAX;
  /** The server's budgets for boundary files, in plain words. */
  protected readonly limits = LIMIT_TEXT.upload;
  private readonly api = inject(FieldsApi);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  private readonly units = inject(Units);
  private readonly auth = inject(AuthStore);
  /** File sizes as every screen says them ("274 bytes", "2.4 MB"). */
  protected readonly fileSize = formatFileSize;

  /** The farm's fields: a name typed in the preview is checked against them at once. */
  private readonly farmFields = httpResource<FieldSummary[]>(() => fieldsUrl(this.auth.currentSeason()), { defaultValue: [] });
  private readonly farmNames = computed(() => farmNameSet((this.farmFields.hasValue() ? this.farmFields.value() : []).map((f) => f.name)));

  protected readonly file = signal<File | null>(null);
  protected readonly preview = signal<ImportPreview | null>(null);
  protected readonly rows = signal<ImportRow[]>([]);
  /** Upload progress in percent; null when not sending. */
  protected readonly progress = signal<number | null>(null);
  protected readonly sending = signal<'preview' | 'save' | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly serverProblems = signal<string[]>([]);
  protected readonly triedSave = signal(false);

  protected readonly chosen = computed(() => selectionOf(this.rows()));
  protected readonly problems = computed(() => selectionProblems(this.rows()));
  protected readonly allTicked = computed(() => {
    const tickable = this.rows().filter((r) => r.tickable);
    return tickable.length > 0 && tickable.every((r) => r.ticked);
  });
  protected readonly someTicked = computed(() => this.rows().some((r) => r.ticked) && !this.allTicked());
  /** Every area found, so the map shows where the file lies: rows that cannot be saved drawn quieter. */
  protected readonly mapFields = computed<MapField[]>(() =>
    this.rows()
      .filter((r) => isPolygonal(r.geometry))
      .map((r) => ({
        id: r.index,
        name: r.name || `Feature ${r.index + 1}`,
        boundary: r.geometry as MapField['boundary'],
        muted: !r.ticked,
      })),
  );

  /** The overlap warning of a row, in the farm's units; null when it overlaps no field. */
  protected overlapOf(row: ImportRow): string | null {
    return overlapWarning(row.overlaps, (acres) => this.units.area(acres));
  }

  protected choose(input: HTMLInputElement): void {
    const file = input.files?.[0] ?? null;
    if (!file) return;
    this.error.set(null);
    this.serverProblems.set([]);
    if (file.size > MAX_UPLOAD_BYTES) {
      this.error.set(`${file.name} is ${formatFileSize(file.size)}; files up to ${formatFileSize(MAX_UPLOAD_BYTES)} can be uploaded.`);
      return;
    }
    this.file.set(file);
    this.preview.set(null);
    this.rows.set([]);
    this.runPreview(null);
  }

  protected changeNameAttribute(attribute: string): void {
    this.runPreview(attribute);
  }

  protected tick(index: number, ticked: boolean): void {
    this.rows.update((rows) => setTicked(rows, index, ticked));
  }

  protected tickAll(ticked: boolean): void {
    this.rows.update((rows) => setAllTicked(rows, ticked));
  }

  protected rename(index: number, name: string): void {
    this.rows.update((rows) => rename(rows, index, name, this.farmNames()));
  }

  protected save(): void {
    const file = this.file();
    if (!file || this.sending()) return;
    this.triedSave.set(true);
    if (this.problems().length) return;
    this.error.set(null);
    this.serverProblems.set([]);
    this.send('save', this.api.saveImport(file, this.preview()?.nameAttribute ?? null, this.chosen()), (result) => {
      const names = result.saved.map((s) => s.name).join(', ');
      this.snackBar.open(`Saved ${result.saved.length} ${result.saved.length === 1 ? 'field' : 'fields'}: ${names}.`, 'Close', {
        duration: 8000,
      });
      void this.router.navigateByUrl('/fields');
    });
  }

  private runPreview(nameAttribute: string | null): void {
    const file = this.file();
    if (!file) return;
    this.error.set(null);
    this.serverProblems.set([]);
    this.send('preview', this.api.previewImport(file, nameAttribute), (preview) => {
      this.preview.set(preview);
      this.rows.update((previous) => rowsFromPreview(preview, previous));
      this.triedSave.set(false);
    });
  }

  private send<T>(kind: 'preview' | 'save', request: Observable<HttpEvent<T>>, done: (body: T) => void): void {
    this.sending.set(kind);
    this.progress.set(0);
    request.subscribe({
      next: (event) => {
        if (event.type === HttpEventType.UploadProgress) {
          this.progress.set(event.total ? Math.round((100 * event.loaded) / event.total) : null);
        } else if (event.type === HttpEventType.Response) {
          this.sending.set(null);
          this.progress.set(null);
          if (event.body) done(event.body);
        }
      },
      error: (err: unknown) => {
        this.sending.set(null);
        this.progress.set(null);
        this.error.set(messageOf(err));
        this.serverProblems.set(err instanceof ApiError ? problemsOf(err) : []);
      },
    });
  }
}

/** The messages of the coded problems a 422 `import_refused` carries beside its message. */
function problemsOf(error: ApiError): string[] {
  const parsed = importProblems.safeParse(error.details['problems']);
  return parsed.success ? parsed.data.map((p) => p.message) : [];
}
