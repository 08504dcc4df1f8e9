import type { UnitSystem } from '@shared/schemas/auth';
import { httpResource } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  HostListener,
  Injector,
  afterNextRender,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { OPERATION_INFO, OPERATIONS, isOperation, type Operation } from '@shared/operations';
import type { PlanInput } from '@shared/plan/types';
import type { Implement } from '@shared/schemas/fleet';
import type { SavedPlan } from '@shared/schemas/plans';
import type * as L from 'leaflet';
import { AuthStore } from '../../../core/auth/auth-store';
import { placeServerErrors, problemMatcher, scrollToFirstProblem } from '../../../shared/forms/field-labels';
import type { HasUnsavedChanges } from '../../../shared/forms/unsaved-changes.guard';
import { ApiError, messageOf } from '../../../core/http/api-error';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { HazardLegend } from '../../../shared/map/hazard-legend/hazard-legend';
import type { MapField } from '../../../shared/map/map-types';
import { Units } from '../../../shared/units/units';
import { LivePlanner } from '../live-planner';
import { PassLabelLayer } from '../pass-label-layer';
import {
  FIELDS_URL,
  IMPLEMENTS_URL,
  type FieldOption,
  type PlanField,
  PassPlanApi,
  type SavedPlanWithResult,
  fieldUrl,
  passesUrl,
  planUrl,
} from '../pass-plan-api';
import { COVERAGE_TEXT, PlanForm } from '../plan-form/plan-form';
import { passLabels, planLayers } from '../plan-layers';
import { PlanLegend } from '../plan-legend/plan-legend';
import {
  PASS_PLAN_FIELDS,
  type PlanSettings,
  defaultSettings,
  implementsFor,
  sameAsSaved,
  settingsBody,
  settingsFromSaved,
  settingsInUnits,
  settingsProblems,
  toPlanInput,
} from '../plan-settings';
import { PlanSummary } from '../plan-summary/plan-summary';
import { API } from '../../../core/http/api-paths';

const positiveId = (v: string | undefined): number | null => {
  const n = Number(v);
  return v && Number.isInteger(n) && n > 0 ? n : null;
};

/**
 * The Pass plan screen: a field, an operation and an implement give headland laps and numbered
 * passes on the map with their figures. The owner changes the settings (planned live in a worker)
 * and saves; an operator reads the saved plan. Deep link: `/pass-plan?field=ID&operation=OP`.
 */
@Component({
  selector: 'app-pass-plan-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FieldMap,
    HazardLegend,
    MatButtonModule,
    MatExpansionModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    PlanForm,
    PlanLegend,
    PlanSummary,
  ],
  providers: [LivePlanner],
  templateUrl: './pass-plan-page.html',
  styleUrl: './pass-plan-page.scss',
})
export class PassPlanPage implements HasUnsavedChanges {
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly injector = inject(Injector);
  private readonly api = inject(PassPlanApi);
  private readonly planner = inject(LivePlanner);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  private readonly units = inject(Units);

  /** `?field=` */
  readonly field = input<string>();
  /** `?operation=` */
  readonly operation = input<string>();

  protected readonly isOwner = inject(AuthStore).isOwner;
  protected readonly system = this.units.system;
  protected readonly operations = OPERATIONS.map((op) => ({ value: op, label: OPERATION_INFO[op].label }));
  protected readonly coverageText = COVERAGE_TEXT;

  protected readonly fieldId = computed(() => positiveId(this.field()));
  protected readonly op = computed<Operation | null>(() => {
    const o = this.operation();
    return o && isOperation(o) ? o : null;
  });
  protected readonly info = computed(() => {
    const op = this.op();
    return op ? OPERATION_INFO[op] : null;
  });

  protected readonly fields = httpResource<FieldOption[]>(() => FIELDS_URL, { defaultValue: [] });
  protected readonly fieldList = computed(() =>
    this.fields.hasValue() ? [...this.fields.value()].sort((a, b) => a.name.localeCompare(b.name)) : [],
  );
  protected readonly detailRes = httpResource<PlanField>(() => {
    const id = this.fieldId();
    return id ? fieldUrl(id) : undefined;
  });
  protected readonly detail = computed(() => {
    const d = this.detailRes.hasValue() ? this.detailRes.value() : null;
    return d && d.id === this.fieldId() ? d : null;
  });
  /** The fleet; while it is missing or fails, the person picks a kind and types a width. */
  private readonly fleetRes = httpResource<Implement[]>(() => IMPLEMENTS_URL);
  private readonly fleet = computed(() => (this.fleetRes.hasValue() && Array.isArray(this.fleetRes.value()) ? this.fleetRes.value() : []));
  protected readonly fleetForOp = computed(() => {
    const op = this.op();
    return op ? implementsFor(this.fleet(), op) : [];
  });
  private readonly savedList = httpResource<SavedPlan[]>(() => {
    const id = this.fieldId();
    return id ? API.plansOfField(id) : undefined;
  });
  protected readonly savedOps = computed(() => new Set((this.savedList.hasValue() ? this.savedList.value() : []).map((p) => p.operation)));
  protected readonly savedRes = httpResource<SavedPlanWithResult>(() => {
    const id = this.fieldId();
    const op = this.op();
    return id && op ? planUrl(id, op) : undefined;
  });
  protected readonly saved = computed(() => {
    const s = this.savedRes.hasValue() ? this.savedRes.value() : null;
    return s && s.fieldId === this.fieldId() && s.operation === this.op() ? s : null;
  });
  private readonly savedMissing = computed(() => {
    const e = this.savedRes.error();
    return e instanceof ApiError && e.status === 404;
  });
  protected readonly loadError = computed(() => {
    for (const r of [this.fields, this.detailRes]) if (r.error()) return messageOf(r.error());
    const e = this.savedRes.error();
    return e && !this.savedMissing() ? messageOf(e) : null;
  });

  protected readonly settings = signal<PlanSettings | null>(null);
  private settingsKey: string | null = null;
  /** The units the form's boxes are in: a switch of the farm's units converts them from the stored values. */
  private settingsSystem: UnitSystem | null = null;
  protected readonly saving = signal(false);
  protected readonly saveError = signal<string | null>(null);
  /** The person changed a setting since the form was filled or saved. */
  private readonly edited = signal(false);
  /** The server's last refusal, by box; cleared by the next change. */
  private readonly serverProblems = signal<Record<string, string>>({});
  /** What the form says is wrong as it is typed (the shared schema's own checks). */
  private readonly typed = computed(() => {
    const s = this.settings();
    return s ? settingsProblems(s, this.system()) : { byControl: {}, message: null };
  });
  protected readonly problems = computed(() => ({ ...this.typed().byControl, ...this.serverProblems() }));
  /** Why Save is off, naming the boxes by their labels; null when the form can be saved. */
  protected readonly blocked = computed(() => this.typed().message);
  protected readonly pickerMatcher = {
    field: problemMatcher(() => this.serverProblems()['field']),
    operation: problemMatcher(() => this.serverProblems()['operation']),
  };
  protected readonly savedImplement = computed(() => {
    const p = this.saved();
    return p?.implementName && p.implementWidthM ? { name: p.implementName, widthM: p.implementWidthM } : null;
  });

  /** What the map and the card show: the live plan for the owner, the saved plan for everyone else. */
  protected readonly view = computed(() => {
    const saved = this.saved();
    if (!this.isOwner()) return { result: saved?.result ?? null, error: null, computing: false };
    const live = this.planner.state();
    return { result: live.result ?? saved?.result ?? null, error: live.error, computing: live.computing };
  });
  protected readonly outOfDate = computed(() => this.view().result !== null && this.view().error !== null);
  protected readonly unsaved = computed(() => {
    const s = this.settings();
    const saved = this.saved();
    return !!s && (!saved || !sameAsSaved(s, saved, this.system()));
  });

  protected readonly mapFields = computed<MapField[]>(() => {
    const f = this.detail();
    return f ? [{ id: f.id, name: f.name, boundary: f.boundary }] : [];
  });
  protected readonly hazards = computed(() => this.detail()?.hazards.features ?? []);
  protected readonly hazardKinds = computed(() => [...new Set(this.hazards().map((h) => h.properties.kind))]);
  protected readonly layers = computed(() => {
    const r = this.view().result;
    return r ? planLayers(r, (m) => this.units.length(m)) : [];
  });
  protected readonly downloadUrl = computed(() => {
    const saved = this.saved();
    return saved ? passesUrl(saved.fieldId, saved.operation) : null;
  });

  private readonly map = signal<L.Map | null>(null);
  private labels: PassLabelLayer | null = null;

  constructor() {
    // Fill the form once per field + operation, from the saved plan when there is one.
    effect(() => {
      const id = this.fieldId();
      const op = this.op();
      const key = id && op ? `${id}/${op}` : null;
      if (key === null || this.savedRes.isLoading() || this.fleetRes.isLoading()) return;
      const saved = this.saved();
      if (!saved && !this.savedMissing() && !this.savedRes.error()) return;
      if (key === this.settingsKey) return;
      this.settingsKey = key;
      const fleet = this.fleet();
      const system = untracked(this.system);
      untracked(() => {
        this.planner.reset();
        this.saveError.set(null);
        this.serverProblems.set({});
        this.edited.set(false);
        this.settingsSystem = system;
        this.settings.set(saved && op ? settingsFromSaved(saved, fleet, system) : defaultSettings(op as Operation, fleet, system));
      });
    });

    // The farm's units switched while the form is open: the boxes follow, the stored figures do not move.
    effect(() => {
      const system = this.system();
      const from = this.settingsSystem;
      if (from === null || from === system) return;
      this.settingsSystem = system;
      untracked(() => this.settings.update((s) => (s ? settingsInUnits(s, from, system) : s)));
    });

    // The owner's plan follows every change of the settings (debounced in the planner).
    effect(() => {
      const s = this.settings();
      const f = this.detail();
      if (!this.isOwner() || !s || !f) return;
      let request: PlanInput | Error;
      try {
        request = toPlanInput(s, f, this.system());
      } catch (err) {
        // A box left empty: the form's prompt for it ("Enter the working width in feet.").
        request = err instanceof Error ? err : new Error(String(err));
      }
      // A setting the form refuses is said in the form's words (its box and label), not planned
      // and refused again by the planner in metres ("got -1.524").
      const refused = this.typed().message;
      if (refused && !(request instanceof Error)) request = new Error(refused);
      untracked(() => this.planner.request(request));
    });

    effect(() => {
      const map = this.map();
      const result = this.view().result;
      if (!map) return;
      this.labels ??= new PassLabelLayer(map);
      this.labels.show(result ? passLabels(result.passes.features) : []);
    });
  }

  protected mapReady(map: L.Map): void {
    this.map.set(map);
  }

  protected chooseField(id: number): void {
    this.go({ field: id, operation: this.op() });
  }

  protected chooseOperation(op: Operation): void {
    this.go({ field: this.fieldId(), operation: op });
  }

  protected changeSettings(s: PlanSettings): void {
    this.settings.set(s);
    this.saveError.set(null);
    this.serverProblems.set({});
    this.edited.set(true);
  }

  /** For the leave-page guard: the owner changed settings that are not saved. */
  hasUnsavedChanges(): boolean {
    return this.isOwner() && this.edited() && this.unsaved();
  }

  /** Closing or reloading the tab with unsaved changes: the browser asks in its own words. */
  @HostListener('window:beforeunload', ['$event'])
  protected beforeUnload(event: BeforeUnloadEvent): void {
    if (this.hasUnsavedChanges()) event.preventDefault();
  }

  /** After the boxes are marked, brings the first one in error into view. */
  private showFirstProblem(): void {
    afterNextRender(() => scrollToFirstProblem(this.host.nativeElement), { injector: this.injector });
  }

  protected save(): void {
    const id = this.fieldId();
    const op = this.op();
    const s = this.settings();
    if (!id || !op || !s || this.saving()) return;
    if (this.blocked()) {
      this.showFirstProblem();
      return;
    }
    let body;
    try {
      body = settingsBody(s, this.system());
    } catch (err) {
      this.saveError.set((err as Error).message);
      return;
    }
    this.saving.set(true);
    this.saveError.set(null);
    this.api.save(id, op, body).subscribe({
      next: (saved) => {
        this.saving.set(false);
        this.edited.set(false);
        this.savedRes.set(saved);
        this.savedList.reload();
        this.snackBar.open(`Pass plan saved for ${saved.fieldName}, ${OPERATION_INFO[op].label.toLowerCase()}.`, 'Close', {
          duration: 5000,
        });
      },
      error: (err: unknown) => {
        this.saving.set(false);
        const placed = placeServerErrors(err, PASS_PLAN_FIELDS);
        this.serverProblems.set(placed.byControl);
        this.saveError.set(placed.message);
        this.showFirstProblem();
      },
    });
  }

  private go(q: { field: number | null; operation: Operation | null }): void {
    void this.router.navigate([], {
      queryParams: { field: q.field ?? undefined, operation: q.operation ?? undefined },
      replaceUrl: true,
    });
  }
}
