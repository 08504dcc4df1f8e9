import { httpResource } from '@angular/common/http';
import { CropPipe } from '../../../shared/units/crop-pipe';
import { ChangeDetectionStrategy, Component, computed, effect, inject, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import type { UnitSystem } from '@shared/schemas/auth';
import type { FieldSummary } from '@shared/schemas/fields';
import { AuthStore } from '../../../core/auth/auth-store';
import { messageOf } from '../../../core/http/api-error';
import { ColourLegend } from '../../../shared/map/colour-legend/colour-legend';
import { cropColour, cropLegend } from '../../../shared/map/crop-colours';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import type { MapField } from '../../../shared/map/map-types';
import { AreaPipe } from '../../../shared/units/area-pipe';
import { Units } from '../../../shared/units/units';
import { EXPORT_URL, FieldsApi, fieldsUrl } from '../fields-api';
import { seasonChoices } from '../seasons';

/** Every field of the farm: a sortable, filterable table and a map; the owner's way in to add fields. */
@Component({
  selector: 'app-fields-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    CropPipe,
    AreaPipe,
    ColourLegend,
    FieldMap,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './fields-page.html',
  styleUrl: './fields-page.scss',
})
export class FieldsPage {
  private readonly api = inject(FieldsApi);
  private readonly auth = inject(AuthStore);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  protected readonly units = inject(Units);

  protected readonly isOwner = this.auth.isOwner;
  protected readonly seasons = seasonChoices(this.auth.currentSeason());
  protected readonly season = signal(this.auth.currentSeason());
  protected readonly fields = httpResource<FieldSummary[]>(() => fieldsUrl(this.season()), { defaultValue: [] });
  protected readonly rows = computed(() => (this.fields.hasValue() ? this.fields.value() : []));
  protected readonly loadError = computed(() => {
    const error = this.fields.error();
    return error ? messageOf(error) : null;
  });
  /** Each field filled with the colour of its crop in the season shown. */
  protected readonly mapFields = computed<MapField[]>(() =>
    this.rows().map((f) => ({ id: f.id, name: f.name, boundary: f.boundary as MapField['boundary'], colour: cropColour(f.crop) })),
  );
  protected readonly legend = computed(() => cropLegend(this.rows().map((f) => f.crop)));
  protected readonly totalAcres = computed(() => this.rows().reduce((sum, f) => sum + f.acres, 0));
  protected readonly exportUrl = computed(() => `${EXPORT_URL}?season=${this.season()}`);
  protected readonly columns = ['name', 'acres', 'crop', 'hazards', 'lastOperation'];
  protected readonly copying = signal(false);
  protected readonly table = new MatTableDataSource<FieldSummary>([]);

  private readonly sort = viewChild(MatSort);
  private readonly paginator = viewChild(MatPaginator);

  constructor() {
    this.table.filterPredicate = (f, filter) => `${f.name} ${f.crop ?? ''}`.toLowerCase().includes(filter);
    this.table.sortingDataAccessor = (f, column) => {
      switch (column) {
        case 'acres':
          return f.acres;
        case 'crop':
          return f.crop ?? '';
        case 'hazards':
          return f.hazardCount;
        case 'lastOperation':
          return f.lastOperation?.date ?? '';
        default:
          return f.name.toLowerCase();
      }
    };
    effect(() => (this.table.data = this.rows()));
    effect(() => {
      const sort = this.sort();
      const paginator = this.paginator();
      if (sort) this.table.sort = sort;
      if (paginator) this.table.paginator = paginator;
    });
  }

  protected filter(value: string): void {
    this.table.filter = value.trim().toLowerCase();
    this.table.paginator?.firstPage();
  }

  protected open(id: number): void {
    void this.router.navigate(['/fields', id]);
  }

  protected copyLastSeason(): void {
    const to = this.season();
    this.copying.set(true);
    this.api.copyCrops(to - 1, to).subscribe({
      next: ({ copied }) => {
        this.copying.set(false);
        this.tell(
          copied === 0 ? `No crops to copy from ${to - 1}.` : `Copied ${copied} crop ${copied === 1 ? 'plan' : 'plans'} from ${to - 1}.`,
        );
        this.fields.reload();
      },
      error: (err: unknown) => {
        this.copying.set(false);
        this.tell(messageOf(err));
      },
    });
  }

  protected setUnits(units: UnitSystem): void {
    if (units === this.units.system()) return;
    this.api.setUnits(units).subscribe({
      next: () =>
        void this.auth.load().then(() => this.tell(units === 'metric' ? 'Showing hectares and metres.' : 'Showing acres and feet.')),
      error: (err: unknown) => this.tell(messageOf(err)),
    });
  }

  private tell(message: string): void {
    this.snackBar.open(message, 'Close', { duration: 6000 });
  }
}
