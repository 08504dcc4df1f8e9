import type { Geometry } from 'geojson';
import type * as L from 'leaflet';

export type DrawnShape = 'Marker' | 'Line' | 'Polygon';

/**
 * Lets the person draw one point, line or area on a map made with `editable`, and resolves with its
 * geometry (lon/lat); null when the drawing is cancelled. The drawn layer is taken off the map:
 * the caller shows what it saves.
 */
export function drawShape(map: L.Map, shape: DrawnShape): Promise<Geometry | null> {
  return new Promise((resolve) => {
    let done = false;
    const finish = (geometry: Geometry | null) => {
      if (done) return;
      done = true;
      map.off('pm:create', created);
      map.off('pm:drawend', ended);
      resolve(geometry);
    };
    const created = (e: { layer: L.Layer }) => {
      const feature = (e.layer as L.Layer & { toGeoJSON(): { geometry: Geometry } }).toGeoJSON();
      e.layer.remove();
      finish(feature.geometry);
    };
    // drawend follows create; on its own it means the drawing was cancelled.
    const ended = () => setTimeout(() => finish(null));
    map.on('pm:create', created);
    map.on('pm:drawend', ended);
    map.pm.enableDraw(shape, { continueDrawing: false, finishOn: shape === 'Marker' ? null : 'dblclick', finishOnEnter: true });
  });
}

/** Stops any drawing or editing mode of the plugin. */
export function stopDrawing(map: L.Map): void {
  map.pm.disableDraw();
  map.pm.disableGlobalEditMode();
  map.pm.disableGlobalCutMode();
  map.pm.disableGlobalRemovalMode();
}
