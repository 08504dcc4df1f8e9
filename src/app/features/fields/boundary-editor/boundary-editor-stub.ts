import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import type { HazardFeature, MapField } from '../../../shared/map/map-types';
import type { Boundary } from '../fields-api';

/** Stands in for BoundaryEditor in page specs: a spec emits `changed` as if the owner had drawn. */
@Component({ selector: 'app-boundary-editor', template: '', changeDetection: ChangeDetectionStrategy.OnPush })
export class BoundaryEditorStub {
  readonly initial = input<Boundary | null>(null);
  readonly context = input<readonly MapField[]>([]);
  readonly hazards = input<readonly HazardFeature[]>([]);
  readonly label = input('');
  readonly changed = output<Boundary | null>();
}
