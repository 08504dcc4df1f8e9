import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { LegendEntry } from '../crop-colours';

/** A map's colour key: a swatch, a label and how many shapes have it (e.g. fields by crop). */
@Component({
  selector: 'app-colour-legend',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './colour-legend.html',
  styleUrl: './colour-legend.scss',
})
export class ColourLegend {
  readonly entries = input<readonly LegendEntry[]>([]);
  /** The key's accessible name, e.g. "Crops 2026". */
  readonly label = input('Map key');
}
