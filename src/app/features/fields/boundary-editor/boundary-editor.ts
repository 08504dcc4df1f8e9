import { ChangeDetectionStrategy, Component, DestroyRef, inject, input, output, signal } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import type { Feature, Geometry, MultiPolygon, Polygon, Position } from 'geojson';
import * as L from 'leaflet';
import { stopDrawing } from '../../../shared/map/draw-shape';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import type { HazardFeature, MapField } from '../../../shared/map/map-types';
import { combineParts } from '../boundary-measure';
import type { Boundary } from '../fields-api';

export type BoundaryTool = 'none' | 'draw' | 'cut' | 'edit' | 'remove';

const EDIT_EVENTS = 'pm:edit pm:markerdragend pm:markerdrag pm:vertexremoved pm:vertexadded pm:change';

/**
 * A map to draw a field boundary on: parts (polygons), holes cut into them, corners moved, parts
 * removed. Emits the whole boundary after every change so the page can measure it live.
 */
@Component({
  selector: 'app-boundary-editor',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FieldMap, MatButtonToggleModule, MatIconModule],
  templateUrl: './boundary-editor.html',
  styleUrl: './boundary-editor.scss',
})
export class BoundaryEditor {
  /** The boundary to start from (editing a saved field); null to start empty. */
  readonly initial = input<Boundary | null>(null);
  /** Other fields, drawn dashed for reference. */
  readonly context = input<readonly MapField[]>([]);
  readonly hazards = input<readonly HazardFeature[]>([]);
  readonly label = input('Map to draw the field boundary on');

  readonly changed = output<Boundary | null>();

  protected readonly tool = signal<BoundaryTool>('none');
  private map: L.Map | null = null;

  constructor() {
    inject(DestroyRef).onDestroy(() => this.map && stopDrawing(this.map));
  }

  protected ready(map: L.Map): void {
    this.map = map;
    const initial = this.initial();
    if (initial) {
      const parts = initial.type === 'Polygon' ? [initial.coordinates] : initial.coordinates;
      for (const rings of parts) this.track(L.polygon(rings.map((ring) => ring.map(toLatLng))).addTo(map));
      const bounds = L.featureGroup(this.parts()).getBounds();
      if (bounds.isValid()) map.fitBounds(bounds, { padding: [28, 28], maxZoom: 17 });
    }
    map.on('pm:create', (e) => {
      if (e.layer instanceof L.Polygon) this.track(e.layer);
      this.emit();
    });
    map.on('pm:cut', (e) => {
      // The cut shape replaces the original; it may be a group when a cut splits a part in two.
      const result = e.layer as L.Layer;
      if (result instanceof L.LayerGroup) result.eachLayer((l) => this.track(l));
      else this.track(result);
      this.emit();
    });
    map.on('pm:remove', () => this.emit());
    map.on('pm:drawend pm:globalcutmodetoggled pm:globaleditmodetoggled pm:globalremovalmodetoggled', () => {
      if (
        !map.pm.globalDrawModeEnabled() &&
        !map.pm.globalEditModeEnabled() &&
        !map.pm.globalCutModeEnabled() &&
        !map.pm.globalRemovalModeEnabled()
      )
        this.tool.set('none');
    });
    this.emit();
  }

  protected choose(tool: BoundaryTool): void {
    const map = this.map;
    if (!map) return;
    stopDrawing(map);
    this.tool.set(tool);
    const polygon = { allowSelfIntersection: true, finishOn: 'dblclick' as const, finishOnEnter: true, continueDrawing: false };
    if (tool === 'draw') map.pm.enableDraw('Polygon', polygon);
    else if (tool === 'cut') map.pm.enableGlobalCutMode({ allowSelfIntersection: true });
    else if (tool === 'edit') map.pm.enableGlobalEditMode({ allowSelfIntersection: true });
    else if (tool === 'remove') map.pm.enableGlobalRemovalMode();
  }

  private track(layer: L.Layer): void {
    layer.on(EDIT_EVENTS, () => this.emit());
  }

  /** The drawn parts: every polygon the drawing plugin manages (display layers are ignored by it). */
  private parts(): L.Polygon[] {
    if (!this.map) return [];
    return this.map.pm.getGeomanLayers().filter((l): l is L.Polygon => l instanceof L.Polygon && !!this.map?.hasLayer(l));
  }

  private emit(): void {
    const shapes = this.parts().map((p) => (p.toGeoJSON() as Feature<Polygon | MultiPolygon>).geometry as Geometry);
    this.changed.emit(combineParts(shapes));
  }
}

const toLatLng = (p: Position): L.LatLng => L.latLng(p[1], p[0]);
