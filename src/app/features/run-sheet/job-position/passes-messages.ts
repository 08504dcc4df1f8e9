// What the page and the passes worker say to each other (types only: the worker's type check has no DOM).
import type { PassProperties, PlanInput } from '@shared/plan/types';
import type { FeatureCollection, LineString } from 'geojson';

export type PlanPasses = FeatureCollection<LineString, PassProperties>;
export interface PassesRequest {
  input: PlanInput;
}
export type PassesReply = { passes: PlanPasses; error?: undefined } | { passes?: undefined; error: string };
