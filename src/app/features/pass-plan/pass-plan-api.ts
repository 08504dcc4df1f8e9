import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Operation } from '@shared/operations';
import type { PlanResult } from '@shared/plan/types';
import type { FieldSummary } from '@shared/schemas/fields';
import type { SavedPlan } from '@shared/schemas/plans';
import type { MultiPolygon, Polygon } from 'geojson';
import { type Observable } from 'rxjs';
import type { HazardCollection } from '../../shared/map/map-types';
import type { PlanSettingsBody } from './plan-settings';
import { API } from '../../core/http/api-paths';

export const FIELDS_URL = API.fields;
export const IMPLEMENTS_URL = API.implements;
export const fieldUrl = API.field;
export const planUrl = API.plan;
export const passesUrl = API.planPasses;

/** `GET /api/fields` (the parts this screen reads). */
export type FieldOption = Pick<FieldSummary, 'id' | 'name' | 'acres'>;

/** `GET /api/fields/:id` (the parts this screen reads). */
export interface PlanField {
  id: number;
  name: string;
  acres: number;
  boundary: Polygon | MultiPolygon;
  hazards: HazardCollection;
}

/** A saved plan with its geometries, as `GET` and `PUT /api/plans/:fieldId/:operation` answer. */
export type SavedPlanWithResult = SavedPlan & { result: PlanResult };

/** Saves a pass plan (owner only on the server). Reads use httpResource on the URLs above. */
@Injectable({ providedIn: 'root' })
export class PassPlanApi {
  private readonly http = inject(HttpClient);

  save(fieldId: number, operation: Operation, body: PlanSettingsBody): Observable<SavedPlanWithResult> {
    return this.http.put<SavedPlanWithResult>(planUrl(fieldId, operation), body);
  }
}
