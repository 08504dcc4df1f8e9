import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { FarmPatch, FarmSettings } from '@shared/schemas/farm';
import type { Observable } from 'rxjs';
import { API } from '../../core/http/api-paths';

export const FARM_URL = API.farm;

/** The farm's own settings (changes are the owner's). Reads use httpResource on FARM_URL. */
@Injectable({ providedIn: 'root' })
export class FarmApi {
  private readonly http = inject(HttpClient);

  save(patch: FarmPatch): Observable<FarmSettings> {
    return this.http.patch<FarmSettings>(FARM_URL, patch);
  }
}
