import { HttpClient, httpResource } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  Injector,
  afterNextRender,
  computed,
  effect,
  inject,
  signal,
  untracked,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import type { ErrorStateMatcher } from '@angular/material/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { WeatherLimitsAnswer } from '@shared/schemas/weather';
import { weatherLimitsBody } from '@shared/schemas/weather';
import { SPRAY_LABEL_CAUTION, type LimitSource, type WeatherLimits } from '@shared/weather/limits';
import { AuthStore } from '../../../core/auth/auth-store';
import { API } from '../../../core/http/api-paths';
import { messageOf } from '../../../core/http/api-error';
import { placeServerErrors, problemMatcher, schemaProblems, scrollToFirstProblem } from '../../../shared/forms/field-labels';
import { Units } from '../../../shared/units/units';
import {
  LIMIT_ROWS,
  LIMIT_TABLES,
  WEATHER_LIMIT_FIELDS,
  blockingControl,
  blockingKey,
  blockingLabel,
  limitsBody,
  rowProblem,
  rowValues,
  shownRange,
  shownText,
  shownUnit,
  shownValue,
  siValue,
  valueAt,
  type LimitRow,
  type OperationTable,
} from './limit-rows';

type NumberControls = Record<string, FormControl<number | null>>;
type BlockingControls = Record<string, FormControl<boolean>>;

/**
 * The farm's weather limits, one table per operation: the owner's number, the default beside it
 * with where that default comes from, and a reset per row. Numbers are typed in the farm's units
 * (mph / °F / inches or km/h / °C / mm) and stored in SI; an unchanged number goes back exactly as
 * it came (limit-rows.ts `siValue`). Members who are not the owner see the table without editing.
 */
@Component({
  selector: 'app-weather-limits',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    ReactiveFormsModule,
  ],
  templateUrl: './weather-limits.html',
  styleUrl: './weather-limits.scss',
})
export class WeatherLimitsForm {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthStore);
  private readonly units = inject(Units);
  private readonly snackBar = inject(MatSnackBar);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly injector = inject(Injector);

  protected readonly tables = LIMIT_TABLES;
  protected readonly sprayCaution = SPRAY_LABEL_CAUTION;
  protected readonly system = this.units.system;
  protected readonly canEdit = this.auth.isOwner;

  protected readonly limits = httpResource<WeatherLimitsAnswer>(() => API.weatherLimits);
  protected readonly loadError = computed(() => {
    const error = this.limits.error();
    return error ? messageOf(error) : null;
  });
  private readonly answer = computed(() => (this.limits.hasValue() ? this.limits.value() : null));

  private readonly numbers = new FormGroup<NumberControls>(
    Object.fromEntries(LIMIT_ROWS.map((r) => [r.control, new FormControl<number | null>(null)])),
  );
  private readonly blocking = new FormGroup<BlockingControls>(
    Object.fromEntries(LIMIT_TABLES.map((t) => [blockingControl(t.operation), new FormControl(false, { nonNullable: true })])),
  );
  protected readonly form = new FormGroup({ numbers: this.numbers, blocking: this.blocking });

  /** What each box holds now (a signal, so the template's problems and reset buttons follow typing). */
  private readonly shown = signal<Record<string, number | null>>(this.numbers.getRawValue());
  /** The SI value each box started from: the stored one, or the default after a reset. */
  private readonly base = signal<Record<string, number>>({});
  /** Problems from the last refusal, by control, until that box is changed. */
  private readonly serverProblems = signal<Record<string, string>>({});
  protected readonly saving = signal(false);
  protected readonly saveError = signal<string | null>(null);
  /** Set by a Save that found problems, so that the message above the table names them. */
  private readonly triedToSave = signal(false);

  /** Each box's problem as typed, in the farm's units, then the shared schema's checks across boxes. */
  private readonly typedProblems = computed<Record<string, string>>(() => {
    const answer = this.answer();
    if (!answer) return {};
    const shown = this.shown();
    const base = this.base();
    // Before the first fill there is nothing typed to judge.
    if (!Object.keys(base).length) return {};
    const system = this.system();
    const byRow: Record<string, string> = {};
    for (const row of LIMIT_ROWS) {
      const problem = rowProblem(row, shown[row.control], base[row.control], system);
      if (problem) byRow[row.control] = problem;
    }
    if (Object.keys(byRow).length) return byRow;
    // Across boxes (lowest wind under the highest, Delta T in order): the same schema the server uses.
    return schemaProblems(weatherLimitsBody, this.body(answer.limits), WEATHER_LIMIT_FIELDS).byControl;
  });
  protected readonly problems = computed(() => ({ ...this.typedProblems(), ...this.serverProblems() }));
  protected readonly problemMessage = computed(() => {
    if (this.saveError()) return this.saveError();
    if (!this.triedToSave()) return null;
    const problems = this.problems();
    const labels = Object.values(WEATHER_LIMIT_FIELDS)
      .filter((f) => f.control in problems)
      .map((f) => f.label);
    return labels.length ? `Check ${labels.length > 1 ? `${labels.slice(0, -1).join(', ')} and ${labels.at(-1)}` : labels[0]}.` : null;
  });

  protected readonly matchers: Record<string, ErrorStateMatcher> = Object.fromEntries(
    LIMIT_ROWS.map((r) => [r.control, problemMatcher(() => this.problems()[r.control])]),
  );

  constructor() {
    // Fill the table from the server each time the limits are (re)loaded or the farm's units change.
    effect(() => {
      const answer = this.answer();
      const system = this.system();
      if (!answer) return;
      untracked(() => this.fill(answer.limits, system));
    });
    this.numbers.valueChanges.pipe(takeUntilDestroyed()).subscribe(() => {
      const before = this.shown();
      const now = this.numbers.getRawValue();
      this.shown.set(now);
      // A box the owner changed no longer carries the server's refusal.
      const server = this.serverProblems();
      const kept = Object.fromEntries(Object.entries(server).filter(([k]) => before[k] === now[k]));
      if (Object.keys(kept).length !== Object.keys(server).length) this.serverProblems.set(kept);
    });
    effect(() => {
      if (this.canEdit()) this.form.enable({ emitEvent: false });
      else this.form.disable({ emitEvent: false });
    });
  }

  protected control(row: LimitRow): FormControl<number | null> {
    return this.numbers.controls[row.control];
  }

  protected blockingControl(t: OperationTable): FormControl<boolean> {
    return this.blocking.controls[blockingControl(t.operation)];
  }

  protected blockingLabel(t: OperationTable): string {
    return blockingLabel(t);
  }

  protected unit(row: LimitRow): string {
    return shownUnit(row.quantity, this.system()).unit;
  }

  protected step(row: LimitRow): number {
    return 10 ** -shownUnit(row.quantity, this.system()).digits;
  }

  protected range(row: LimitRow): { min: number; max: number } {
    return shownRange(row, this.system());
  }

  protected defaultText(row: LimitRow): string {
    const answer = this.answer();
    return answer ? shownText(valueAt(answer.defaults, row.key) as number, row.quantity, this.system()) : '';
  }

  protected defaultBlocking(t: OperationTable): string {
    const answer = this.answer();
    return answer && valueAt(answer.defaults, blockingKey(t.operation)) ? 'Default: blocks' : 'Default: a warning only';
  }

  protected source(key: string): LimitSource | null {
    const answer = this.answer();
    return answer ? ((valueAt(answer.sources, key) as LimitSource | undefined) ?? null) : null;
  }

  /** True when the box's number is the default (what would be sent equals the default exactly). */
  protected isDefault(row: LimitRow): boolean {
    const answer = this.answer();
    const shown = this.shown()[row.control];
    if (!answer || shown === null || shown === undefined) return false;
    return siValue(shown, this.base()[row.control], row.quantity, this.system()) === valueAt(answer.defaults, row.key);
  }

  protected reset(row: LimitRow): void {
    const answer = this.answer();
    if (!answer || !this.canEdit()) return;
    const fallback = valueAt(answer.defaults, row.key) as number;
    this.base.update((b) => ({ ...b, [row.control]: fallback }));
    const control = this.control(row);
    control.setValue(shownValue(fallback, row.quantity, this.system()));
    control.markAsDirty();
  }

  protected save(): void {
    const answer = this.answer();
    if (!answer || !this.canEdit() || this.saving()) return;
    this.saveError.set(null);
    if (Object.keys(this.problems()).length) {
      this.triedToSave.set(true);
      this.showFirstProblem();
      return;
    }
    this.triedToSave.set(false);
    this.saving.set(true);
    this.http.put<WeatherLimitsAnswer>(API.weatherLimits, this.body(answer.limits)).subscribe({
      next: (saved) => {
        this.saving.set(false);
        this.serverProblems.set({});
        this.limits.set(saved);
        this.snackBar.open('Weather limits saved.', 'OK', { duration: 4000 });
      },
      error: (err: unknown) => {
        this.saving.set(false);
        const placed = placeServerErrors(err, WEATHER_LIMIT_FIELDS);
        this.serverProblems.set(placed.byControl);
        this.saveError.set(placed.message);
        this.showFirstProblem();
      },
    });
  }

  private body(loaded: WeatherLimits): WeatherLimits {
    return limitsBody(loaded, this.shown(), this.base(), this.blocking.getRawValue(), this.system());
  }

  private fill(limits: WeatherLimits, system: ReturnType<Units['system']>): void {
    const base = rowValues(limits);
    this.base.set(base);
    const numbers = Object.fromEntries(LIMIT_ROWS.map((r) => [r.control, shownValue(base[r.control], r.quantity, system)]));
    const blocking = Object.fromEntries(
      LIMIT_TABLES.map((t) => [blockingControl(t.operation), !!valueAt(limits, blockingKey(t.operation))]),
    );
    this.form.reset({ numbers, blocking });
    this.shown.set(this.numbers.getRawValue());
    this.saveError.set(null);
    this.triedToSave.set(false);
  }

  private showFirstProblem(): void {
    this.form.markAllAsTouched();
    afterNextRender(() => scrollToFirstProblem(this.host.nativeElement), { injector: this.injector });
  }
}
