import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { HAZARD_LABELS, type HazardKind } from '@shared/schemas/fields';
import { HazardSymbol } from '../../../shared/map/hazard-symbol/hazard-symbol';
import type { HazardFeature } from '../../../shared/map/map-types';
import { LengthPipe } from '../../../shared/units/length-pipe';

const SHAPES: Record<string, string> = {
  Point: 'point',
  MultiPoint: 'points',
  LineString: 'line',
  MultiLineString: 'lines',
  Polygon: 'area',
  MultiPolygon: 'areas',
};

/** A field's hazards with their clearances; the owner's edit, remove and confirm buttons. */
@Component({
  selector: 'app-hazard-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [HazardSymbol, LengthPipe, MatButtonModule, MatIconModule],
  templateUrl: './hazard-list.html',
  styleUrl: './hazard-list.scss',
})
export class HazardList {
  readonly hazards = input<readonly HazardFeature[]>([]);
  readonly canEdit = input(false);
  readonly highlighted = input<number | null>(null);

  readonly edit = output<HazardFeature>();
  /** Draw the hazard's shape again where it really is (kind, clearance and note stay). */
  readonly redraw = output<HazardFeature>();
  readonly remove = output<HazardFeature>();
  readonly confirm = output<HazardFeature>();

  protected labelOf(kind: string): string {
    return HAZARD_LABELS[kind as HazardKind] ?? kind;
  }

  protected shapeOf(h: HazardFeature): string {
    return SHAPES[h.geometry.type] ?? h.geometry.type;
  }
}
