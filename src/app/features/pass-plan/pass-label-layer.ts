import * as L from 'leaflet';
import { type PassLabel, spacedLabels } from './plan-layers';

/**
 * Writes pass numbers at the start of the passes on a map, in a layer of their own, as many as fit
 * without overlapping at the current zoom. Labels are not interactive: the pass lines carry tooltips.
 */
export class PassLabelLayer {
  private readonly group = L.layerGroup([], { pmIgnore: true } as L.LayerOptions);
  private labels: readonly PassLabel[] = [];

  constructor(private readonly map: L.Map) {
    this.group.addTo(map);
    map.on('zoomend', () => this.draw());
  }

  show(labels: readonly PassLabel[]): void {
    this.labels = labels;
    this.draw();
  }

  private draw(): void {
    this.group.clearLayers();
    const shown = spacedLabels(this.labels, ({ at }) => this.map.latLngToLayerPoint(L.latLng(at[1], at[0])));
    for (const { pass, at } of shown) {
      this.group.addLayer(
        L.marker(L.latLng(at[1], at[0]), {
          icon: L.divIcon({ html: String(pass), className: 'pp-pass-label', iconSize: [28, 18], iconAnchor: [14, 9] }),
          interactive: false,
          keyboard: false,
          pmIgnore: true,
        } as L.MarkerOptions),
      );
    }
  }
}
