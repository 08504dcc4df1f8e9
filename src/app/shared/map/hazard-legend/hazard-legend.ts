import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { HAZARD_KINDS, HAZARD_LABELS, type HazardKind } from '@shared/schemas/fields';
import { HazardSymbol } from '../hazard-symbol/hazard-symbol';

/**
 * The symbols for the hazard kinds on a map, and the caution that goes wherever hazards show.
 * `kinds` limits the key to the kinds present; empty shows every kind.
 */
@Component({
  selector: 'app-hazard-legend',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [HazardSymbol],
  templateUrl: './hazard-legend.html',
  styleUrl: './hazard-legend.scss',
})
export class HazardLegend {
  readonly kinds = input<readonly string[]>([]);

  protected readonly entries = computed(() => {
    const present = new Set(this.kinds());
    return HAZARD_KINDS.filter((kind) => present.size === 0 || present.has(kind)).map((kind: HazardKind) => ({
      kind,
      label: HAZARD_LABELS[kind],
    }));
  });
}
