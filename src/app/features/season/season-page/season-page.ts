import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { Router } from '@angular/router';
import { OPERATION_INFO } from '@shared/operations';
import { seasonIndex, seasonSummary, type SeasonTable as TableName } from '@shared/schemas/season';
import { AuthStore } from '../../../core/auth/auth-store';
import { messageOf } from '../../../core/http/api-error';
import { Units } from '../../../shared/units/units';
import { CompareChart } from '../compare-chart/compare-chart';
import { PrintStyles } from '../print-styles/print-styles';
import { SEASON_INDEX_URL, csvUrl, summaryUrl, yearParam } from '../season-api';
import {
  activeOperations,
  areaIn,
  areaUnit,
  compareTable,
  fieldsTable,
  formatCell,
  machinesTable,
  measuredTable,
  operationsTable,
  peopleTable,
  weatherTable,
  weekCharts,
} from '../season-shaping';
import { SeasonTable } from '../season-table/season-table';
import { WeekChart } from '../week-chart/week-chart';

/**
 * What the season added up to: progress and weekly work per operation, planned against actual
 * hours, the days lost to weather, and the work per field, person and machine; another season beside it; CSV and print.
 * Read-only: the owner corrects logs on the work board.
 */
@Component({
  selector: 'app-season-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    CompareChart,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    PrintStyles,
    SeasonTable,
    WeekChart,
  ],
  templateUrl: './season-page.html',
  styleUrl: './season-page.scss',
})
export class SeasonPage {
  /** `?year=` and `?compare=` in the address, so a season (and a print of it) can be linked. */
  readonly year = input<string>();
  readonly compare = input<string>();

  private readonly router = inject(Router);
  private readonly auth = inject(AuthStore);
  protected readonly units = inject(Units);

  protected readonly farmName = computed(() => this.auth.farm()?.name ?? '');
  protected readonly index = httpResource(() => SEASON_INDEX_URL, { parse: seasonIndex.parse });
  protected readonly season = computed(() => yearParam(this.year()) ?? (this.index.hasValue() ? this.index.value().latestWorked : null));
  protected readonly compareYear = computed(() => {
    const y = yearParam(this.compare());
    return y !== null && y !== this.season() ? y : null;
  });
  protected readonly choices = computed(() => {
    const years = new Set(this.index.hasValue() ? this.index.value().seasons.map((s) => s.year) : []);
    for (const y of [this.season(), this.compareYear()]) if (y !== null) years.add(y);
    return [...years].sort((a, b) => b - a);
  });

  protected readonly summary = httpResource(() => (this.season() === null ? undefined : summaryUrl(this.season()!)), {
    parse: seasonSummary.parse,
  });
  protected readonly other = httpResource(() => (this.compareYear() === null ? undefined : summaryUrl(this.compareYear()!)), {
    parse: seasonSummary.parse,
  });
  protected readonly data = computed(() => (this.summary.hasValue() ? this.summary.value() : null));
  protected readonly loadError = computed(() => {
    const e = this.index.error() ?? this.summary.error() ?? this.other.error();
    return e ? messageOf(e) : null;
  });

  protected readonly unit = computed(() => areaUnit(this.units.system()));
  protected readonly progress = computed(() => {
    const s = this.data();
    if (!s) return [];
    const system = this.units.system();
    const charts = weekCharts(s.weekly, system);
    const active = new Set(activeOperations(s));
    return s.operations
      .filter((o) => active.has(o.operation))
      .map((o) => ({
        ...o,
        label: OPERATION_INFO[o.operation].label,
        percent: formatCell(o.progress, 'percent'),
        planned: formatCell(areaIn(o.acresPlanned, system), 'area'),
        finished: formatCell(areaIn(o.acresFinished, system), 'area'),
        chart: charts.find((c) => c.operation === o.operation) ?? null,
      }));
  });
  protected readonly headline = computed(() => {
    const s = this.data();
    if (!s) return null;
    const t = s.totals;
    const system = this.units.system();
    return {
      area: `${formatCell(areaIn(t.acresFinished, system), 'area')} ${this.unit()}`,
      hours: `${formatCell(t.hoursLogged, 'hours')} h`,
      rate: t.acresPerHour === null ? '—' : `${formatCell(areaIn(t.acresPerHour, system), 'rate')} ${this.unit()}/h`,
      jobs: t.jobsFinished,
      calledOff: t.jobsCalledOff,
      fields: t.fieldsWorked,
    };
  });
  protected readonly operations = computed(() => (this.data() ? operationsTable(this.data()!, this.units.system()) : null));
  protected readonly weather = computed(() => (this.data() ? weatherTable(this.data()!) : null));
  protected readonly fields = computed(() => (this.data() ? fieldsTable(this.data()!, this.units.system()) : null));
  /** Measured from tracks: shown only when some job of the season has a measured track. */
  protected readonly measured = computed(() => {
    const t = this.data() ? measuredTable(this.data()!, this.units.system()) : null;
    return t && t.rows.length ? t : null;
  });
  protected readonly people = computed(() => (this.data() ? peopleTable(this.data()!, this.units.system()) : null));
  protected readonly machines = computed(() => (this.data() ? machinesTable(this.data()!, this.units.system()) : null));
  /** The older season on the left. */
  protected readonly comparison = computed(() => {
    const s = this.data();
    const o = this.other.hasValue() ? this.other.value() : null;
    if (!s || !o) return null;
    const [a, b] = s.year < o.year ? [s, o] : [o, s];
    return { years: [a.year, b.year] as [number, number], table: compareTable(a, b, this.units.system()) };
  });

  protected csv(table: TableName): string {
    return csvUrl(this.season()!, table);
  }

  protected pick(year: number): void {
    void this.router.navigate([], {
      queryParams: { year, compare: this.compareYear() === year ? null : this.compareYear() },
      replaceUrl: true,
    });
  }

  protected pickCompare(year: number | null): void {
    void this.router.navigate([], { queryParams: { year: this.season(), compare: year }, replaceUrl: true });
  }

  protected print(): void {
    window.print();
  }
}
