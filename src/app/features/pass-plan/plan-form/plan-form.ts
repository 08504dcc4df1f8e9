import { ChangeDetectionStrategy, Component, computed, input, model } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSliderModule } from '@angular/material/slider';
import { LIMIT_TEXT } from '@shared/limits';
import { OPERATION_INFO, type CoverageRule, type Operation } from '@shared/operations';
import { COMMON_PRACTICE, DEFAULT_TURN_SECONDS, implementDefaults, type ImplementKind } from '@shared/plan/implement-defaults';
import type { UnitSystem } from '@shared/schemas/auth';
import { IMPLEMENT_KIND_LABELS, type Implement } from '@shared/schemas/fleet';
import { kindDefaults, type PlanSettings, widthFromMetres } from '../plan-settings';

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

  protected readonly coverageText = COVERAGE_TEXT;
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
    const { speed, efficiencyPct } = kindDefaults(kind, this.system());
    return {
      kind: `${IMPLEMENT_KIND_LABELS[kind]}: ${speed} ${this.speedUnit()}, ${efficiencyPct} % field efficiency (${d.source}).`,
      turn: `Seconds per turn: ${DEFAULT_TURN_SECONDS} (${COMMON_PRACTICE}).`,
    };
  });
  protected readonly shownHeading = computed(() => {
    const s = this.settings();
    return s.autoHeading ? Math.round(this.headingUsed() ?? s.headingDeg) % 180 : s.headingDeg;
  });

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
      ...kindDefaults(implement.kind, this.system()),
    });
  }

  protected chooseKind(kind: ImplementKind): void {
    this.patch({ implementKind: kind, ...kindDefaults(kind, this.system()) });
  }

  protected toggleAuto(auto: boolean): void {
    // Turning Auto off starts from the heading Auto chose, so the passes do not jump.
    this.patch(auto ? { autoHeading: true } : { autoHeading: false, headingDeg: this.shownHeading() });
  }

  protected slide(event: Event): void {
    const value = (event.target as HTMLInputElement).valueAsNumber;
    if (Number.isFinite(value)) this.patch({ headingDeg: value });
  }

  protected useDefaults(): void {
    this.patch({ ...kindDefaults(this.settings().implementKind, this.system()), turnSeconds: DEFAULT_TURN_SECONDS });
  }
}
