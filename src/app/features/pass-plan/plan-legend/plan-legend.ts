import { ChangeDetectionStrategy, Component, ViewEncapsulation, input } from '@angular/core';
import type { CoverageRule } from '@shared/operations';

/**
 * The key to the plan's layers on the map. Not encapsulated on purpose: its stylesheet also colours
 * the Leaflet paths and pass numbers the page draws (classes `pp-*`), so key and map always match.
 */
@Component({
  selector: 'app-plan-legend',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './plan-legend.html',
  styleUrl: './plan-legend.scss',
  encapsulation: ViewEncapsulation.None,
  host: { class: 'plan-legend' },
})
export class PlanLegend {
  readonly coverage = input<CoverageRule>('gaps-ok');
}
