// What the page and the passes worker say to each other (types only: the worker's type check has no DOM).
import type { PassProperties, PlanInput } from '@shared/plan/types';
import type { FeatureCollection, LineString, MultiPolygon, Polygon } from 'geojson';

export type PlanPasses = FeatureCollection<LineString, PassProperties>;
/** A saved plan as the job's map draws it: its numbered passes and its headland (null with none). */
export interface PlanLayout {
  passes: PlanPasses;
  headland: Polygon | MultiPolygon | null;
}
export interface PassesRequest {
  input: PlanInput;
}
export type PassesReply = { layout: PlanLayout; error?: undefined } | { layout?: undefined; error: string };
