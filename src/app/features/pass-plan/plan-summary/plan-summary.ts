import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { PlanResult } from '@shared/plan/types';
import type { UnitSystem } from '@shared/schemas/auth';
import { summaryRows } from '../plan-summary-rows';

/**
 * The figures of a pass plan in the farm's units, its warnings, and, when the latest settings could
 * not be planned, the planner's message in place of the numbers.
 */
@Component({
  selector: 'app-plan-summary',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule, MatTooltipModule],
  templateUrl: './plan-summary.html',
  styleUrl: './plan-summary.scss',
})
export class PlanSummary {
  readonly result = input<PlanResult | null>(null);
  readonly system = input<UnitSystem>('us');
  readonly autoHeading = input(false);
  /** The planner's message for the latest settings, if it refused them. */
  readonly error = input<string | null>(null);
  /** A newer plan is being worked out. */
  readonly computing = input(false);

  protected readonly rows = computed(() => {
    const r = this.result();
    return r ? summaryRows(r, this.system(), this.autoHeading()) : [];
  });
  protected readonly warnings = computed(() => this.result()?.warnings ?? []);
}
