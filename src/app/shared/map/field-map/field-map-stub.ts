import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import type * as L from 'leaflet';
import type { HazardFeature, MapField, MapLayer } from '../map-types';

/**
 * Stands in for FieldMap in page specs (jsdom has no layout for Leaflet): same inputs and outputs,
 * renders the field names so specs can see what the map was given.
 */
@Component({
  selector: 'app-field-map',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<ul class="map-stub" [attr.aria-label]="label()">
    @for (f of fields(); track f.id) {
      <li>{{ f.name }}</li>
    }
  </ul>`,
})
export class FieldMapStub {
  readonly fields = input<readonly MapField[]>([]);
  readonly hazards = input<readonly HazardFeature[]>([]);
  readonly layers = input<readonly MapLayer[]>([]);
  readonly selectedId = input<number | null>(null);
  readonly label = input('Map of the fields');
  readonly selectable = input(true);
  readonly editable = input(false);
  readonly fieldSelected = output<number>();
  readonly hazardSelected = output<number>();
  readonly ready = output<L.Map>();
}
