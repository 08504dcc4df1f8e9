import { HttpClient, type HttpEvent } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { UnitSystem } from '@shared/schemas/auth';
import type { CropPlan, FieldDetail, ImportPreview, ImportSaved } from '@shared/schemas/fields';
import type { Geometry, MultiPolygon, Polygon } from 'geojson';
import { type Observable } from 'rxjs';
import type { HazardFeature } from '../../shared/map/map-types';
import type { FarmSettings } from '@shared/schemas/farm';
import { API } from '../../core/http/api-paths';

export const FIELDS_URL = API.fields;
export const fieldsUrl = API.fieldsOfSeason;
export const fieldUrl = API.fieldOfSeason;
export const EXPORT_URL = API.fieldsExport;

export type Boundary = Polygon | MultiPolygon;

export interface HazardInput {
  kind: string;
  geometry: Geometry;
  /** Metres (0–500). */
  clearanceM: number;
  note?: string | null;
}

/** Writes for the Fields screens (owner only on the server). Reads use httpResource on the URLs above. */
@Injectable({ providedIn: 'root' })
export class FieldsApi {
  private readonly http = inject(HttpClient);

  create(body: { name: string; boundary: Boundary; notes?: string }): Observable<FieldDetail> {
    return this.http.post<FieldDetail>(FIELDS_URL, body);
  }

  update(id: number, patch: { name?: string; boundary?: Boundary; notes?: string | null }): Observable<FieldDetail> {
    return this.http.patch<FieldDetail>(API.field(id), patch);
  }

  remove(id: number): Observable<void> {
    return this.http.delete<void>(API.field(id));
  }

  addHazard(fieldId: number, body: HazardInput): Observable<HazardFeature> {
    return this.http.post<HazardFeature>(API.hazards(fieldId), body);
  }

  updateHazard(fieldId: number, hazardId: number, patch: Partial<HazardInput> & { status?: 'confirmed' }): Observable<HazardFeature> {
    return this.http.patch<HazardFeature>(API.hazard(fieldId, hazardId), patch);
  }

  removeHazard(fieldId: number, hazardId: number): Observable<void> {
    return this.http.delete<void>(API.hazard(fieldId, hazardId));
  }

  setCrop(
    fieldId: number,
    season: number,
    body: { crop: string; varietyNote?: string | null },
  ): Observable<CropPlan & { fieldId: number }> {
    return this.http.put<CropPlan & { fieldId: number }>(API.crop(fieldId, season), body);
  }

  clearCrop(fieldId: number, season: number): Observable<void> {
    return this.http.delete<void>(API.crop(fieldId, season));
  }

  copyCrops(from: number, to: number): Observable<{ copied: number }> {
    return this.http.post<{ copied: number }>(API.cropCopy(to), { from });
  }

  setUnits(units: UnitSystem): Observable<FarmSettings> {
    return this.http.patch<FarmSettings>(API.farm, { units });
  }

  /** Uploads a boundary file for a preview; events carry the upload progress. */
  previewImport(file: File, nameAttribute: string | null): Observable<HttpEvent<ImportPreview>> {
    return this.http.post<ImportPreview>(API.fieldsImport, formOf(file), {
      params: { dryRun: 'true', ...(nameAttribute ? { nameAttribute } : {}) },
      reportProgress: true,
      observe: 'events',
    });
  }

  /** Uploads the same file again with the owner's choices; saves all of them or none. */
  saveImport(file: File, nameAttribute: string | null, selection: { index: number; name: string }[]): Observable<HttpEvent<ImportSaved>> {
    const form = formOf(file);
    form.append('selection', JSON.stringify(selection));
    return this.http.post<ImportSaved>(API.fieldsImport, form, {
      params: nameAttribute ? { nameAttribute } : {},
      reportProgress: true,
      observe: 'events',
    });
  }
}

function formOf(file: File): FormData {
  const form = new FormData();
  form.append('file', file, file.name);
  return form;
}
