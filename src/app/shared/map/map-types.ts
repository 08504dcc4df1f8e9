import type { Feature, FeatureCollection, GeoJsonObject, Geometry, MultiPolygon, Polygon } from 'geojson';
import type { PathOptions } from 'leaflet';

/** A field outline drawn on the map, labelled with its name. */
export interface MapField {
  id: number;
  name: string;
  boundary: Polygon | MultiPolygon;
  /** Drawn quieter (an import feature not ticked, a neighbour field for context). */
  muted?: boolean;
  /** Fill colour (a CSS colour, e.g. by crop: crop-colours.ts); the theme's plain fill when left out. */
  colour?: string | null;
}

/** What the API keeps on each hazard feature. */
export interface HazardProperties {
  id: number;
  fieldId: number;
  kind: string;
  /** Clearance distance around the hazard, metres. */
  clearanceM: number;
  note: string | null;
  status: 'confirmed' | 'reported' | string;
}

export type HazardFeature = Feature<Geometry, HazardProperties>;
export type HazardCollection = FeatureCollection<Geometry, HazardProperties>;

/**
 * Any extra GeoJSON to draw (pass lines, headlands, worked area…), under the outlines' labels.
 * `style` is Leaflet path styling, fixed or per feature; `className` lets a screen style it in CSS.
 */
export interface MapLayer {
  id: string;
  data: GeoJsonObject;
  style?: PathOptions | ((feature?: Feature) => PathOptions);
  /** Text shown when a feature is hovered or focused, if any. */
  tooltip?: (feature: Feature) => string | null;
}
