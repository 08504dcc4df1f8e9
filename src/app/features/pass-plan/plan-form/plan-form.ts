import { formatHeading, formatHours, formatSpeed, formatWidth } from '@shared/figures';
import { ChangeDetectionStrategy, Component, computed, input, model } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSliderModule } from '@angular/material/slider';
import { MatIconModule } from '@angular/material/icon';
import type { ErrorStateMatcher } from '@angular/material/core';
import { DEFAULT_EDGE_MARGIN_PCT, type HeadingCandidate } from '@shared/plan/auto-heading';
import { roundTo } from '@shared/round';
import { problemMatcher } from '../../../shared/forms/field-labels';
import { LIMIT_TEXT } from '@shared/limits';
import { OPERATION_INFO, type CoverageRule, type Operation } from '@shared/operations';
import { COMMON_PRACTICE, DEFAULT_TURN_SECONDS, implementDefaults, type ImplementKind } from '@shared/plan/implement-defaults';
import type { UnitSystem } from '@shared/schemas/auth';
import { IMPLEMENT_KIND_LABELS, type Implement } from '@shared/schemas/fleet';
import { kindDefaults, type PlanSettings, settingsFigures, widthFromMetres } from '../plan-settings';

/** One-line explanations of the coverage rules. */
export const COVERAGE_TEXT: Record<CoverageRule, { label: string; hint: string }> = {
  full: { label: 'No skip allowed', hint: 'A last pass is added so nothing is missed; it overlaps the pass before it.' },
  'gaps-ok': { label: 'Gaps allowed', hint: 'Passes stay evenly spaced; corners and a strip may stay unworked.' },
};

/**
 * The settings of a pass plan: implement and width, heading, headland passes, and the advanced
 * speed, efficiency and turn time. With `readonly`, the same settings as plain text.
 */
@Component({
  selector: 'app-plan-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FormsModule,
    MatButtonModule,
    MatExpansionModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    MatSlideToggleModule,
    MatSliderModule,
  ],
  templateUrl: './plan-form.html',
  styleUrl: './plan-form.scss',
})
export class PlanForm {
  readonly settings = model.required<PlanSettings>();
  readonly operation = input.required<Operation>();
  /** Fleet implements that do this operation. */
  readonly implements = input<readonly Implement[]>([]);
  readonly system = input<UnitSystem>('us');
  readonly readonly = input(false);
  /** The heading the planner used last (shown while Auto is on). */
  readonly headingUsed = input<number | null>(null);
  /** The best headings the planner weighed, the one auto picks first (empty: none yet). */
  readonly candidates = input<readonly HeadingCandidate[]>([]);
  /** Problems by box (typed or from the server), shown under each box as it is typed. */
  readonly problems = input<Readonly<Record<string, string>>>({});
  /** The saved plan's implement, for when the fleet cannot be read (operators) or it left the fleet. */
  readonly savedImplement = input<{ name: string; widthM: number } | null>(null);

  private readonly matchers = new Map<string, ErrorStateMatcher>();
  /** Marks a box while it has a problem (one matcher per box, kept so the input does not churn). */
  protected matcher(control: string): ErrorStateMatcher {
    let m = this.matchers.get(control);
    if (!m) {
      m = problemMatcher(() => this.problems()[control]);
      this.matchers.set(control, m);
    }
    return m;
  }
  /**
   * The chosen implement works at another width than the plan: said beside the width, since every
   * pass, acre and hour below is for the plan's width.
   */
  protected readonly widthWarning = computed(() => {
    const s = this.settings();
    const fleet = this.implements().find((i) => i.id === s.implementId);
    const implement = fleet ? { name: fleet.name, widthM: fleet.widthM } : s.implementId !== null ? this.savedImplement() : null;
    // A width the form refuses (0, negative) is said under the box, not compared here.
    if (!implement || s.width === null || !Number.isFinite(s.width) || s.width <= 0) return null;
    const own = widthFromMetres(implement.widthM, this.system());
    // Widths are shown to 0.1 ft or 1 cm: anything closer is the same width.
    if (Math.abs(own - s.width) < (this.system() === 'metric' ? 0.005 : 0.05)) return null;
    const plan = this.shown().width;
    return `${implement.name} works ${formatWidth(implement.widthM, this.system())}; this plan uses ${plan}. Passes, acres and hours are for ${plan}.`;
  });
  /** The width and speed as text, as every screen writes them (the read-only list, the width warning). */
  protected readonly shown = computed(() => settingsFigures(this.settings(), this.system()));
  protected readonly offered = computed(() =>
    this.candidates().map((c, i) => ({
      ...c,
      // 180° and 0° are the same passes; the heading box takes 0 to 179°.
      shown: formatHeading(c.headingDeg, 180),
      auto: i === 0,
      inUse: this.headingUsed() !== null && Math.abs(c.headingDeg - this.headingUsed()!) < 1e-6,
    })),
  );

  protected readonly coverageText = COVERAGE_TEXT;
  protected readonly commonPractice = COMMON_PRACTICE;
  /** The planner's budgets, in plain words. */
  protected readonly planLimits = LIMIT_TEXT.plan;
  protected readonly coverageRules = Object.keys(COVERAGE_TEXT) as CoverageRule[];
  protected readonly kindLabels = IMPLEMENT_KIND_LABELS;
  protected readonly kinds = computed(() => OPERATION_INFO[this.operation()].implementKinds);
  protected readonly lengthUnit = computed(() => (this.system() === 'metric' ? 'm' : 'ft'));
  protected readonly speedUnit = computed(() => (this.system() === 'metric' ? 'km/h' : 'mph'));
  protected readonly implementName = computed(() => {
    const s = this.settings();
    const fleet = this.implements().find((i) => i.id === s.implementId);
    return fleet ? fleet.name : `${IMPLEMENT_KIND_LABELS[s.implementKind]} (not from the fleet)`;
  });
  protected readonly defaultsText = computed(() => {
    const kind = this.settings().implementKind;
    const d = implementDefaults(kind);
    const { efficiencyPct } = kindDefaults(kind, this.system());
    return {
      kind: `${IMPLEMENT_KIND_LABELS[kind]}: ${formatSpeed(d.speedMps, this.system())}, ${efficiencyPct} % field efficiency (${d.source}).`,
      turn: `Seconds per turn: ${DEFAULT_TURN_SECONDS} (${COMMON_PRACTICE}).`,
    };
  });
  /** The heading in use as a number for the box: auto's choice to 0.1° (180° is 0°), or the typed one. */
  protected readonly headingValue = computed(() => {
    const s = this.settings();
    return s.autoHeading ? roundTo(this.headingUsed() ?? s.headingDeg, 1) % 180 : s.headingDeg;
  });
  protected readonly shownHeading = computed(() => formatHeading(this.headingValue(), 180));

  protected patch(change: Partial<PlanSettings>): void {
    this.settings.update((s) => ({ ...s, ...change }));
  }

  protected chooseImplement(id: number | null): void {
    const implement = this.implements().find((i) => i.id === id);
    if (!implement) {
      this.patch({ implementId: null });
      return;
    }
    this.patch({
      implementId: implement.id,
      implementKind: implement.kind,
      width: widthFromMetres(implement.widthM, this.system()),
      widthM: implement.widthM,
      ...kindDefaults(implement.kind, this.system()),
    });
  }

  protected chooseKind(kind: ImplementKind): void {
    this.patch({ implementKind: kind, ...kindDefaults(kind, this.system()) });
  }

  protected toggleAuto(auto: boolean): void {
    // Turning Auto off starts from the heading Auto chose, so the passes do not jump.
    this.patch(auto ? { autoHeading: true } : { autoHeading: false, headingDeg: this.headingValue() });
  }

  protected slide(event: Event): void {
    const value = (event.target as HTMLInputElement).valueAsNumber;
    if (Number.isFinite(value)) this.patch({ headingDeg: value });
  }

  /** Takes one of the offered headings: the first is auto's own choice, so it keeps Auto on. */
  protected useHeading(index: number): void {
    const c = this.candidates()[index];
    if (!c) return;
    this.patch(index === 0 ? { autoHeading: true } : { autoHeading: false, headingDeg: roundTo(c.headingDeg, 1) });
  }

  protected hours(h: number): string {
    return formatHours(h);
  }

  protected useDefaults(): void {
    this.patch({
      ...kindDefaults(this.settings().implementKind, this.system()),
      turnSeconds: DEFAULT_TURN_SECONDS,
      edgeMarginPct: DEFAULT_EDGE_MARGIN_PCT,
    });
  }
}
