import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { catchError, firstValueFrom, of } from 'rxjs';
import { API } from '../../core/http/api-paths';

/** The optional background tile layer, from `GET /api/config`. Null URL: outlines on a plain background. */
export interface TileConfig {
  mapTileUrl: string | null;
  mapTileAttribution: string | null;
}

const NO_TILES: TileConfig = { mapTileUrl: null, mapTileAttribution: null };

/** Asks the server once per visit whether a tile source is configured; a failure means no tiles. */
@Injectable({ providedIn: 'root' })
export class MapConfig {
  private readonly http = inject(HttpClient);
  private cached: Promise<TileConfig> | null = null;

  tiles(): Promise<TileConfig> {
    this.cached ??= firstValueFrom(this.http.get<TileConfig>(API.config).pipe(catchError(() => of(NO_TILES))));
    return this.cached;
  }
}
