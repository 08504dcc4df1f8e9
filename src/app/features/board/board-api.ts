import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AssignmentCreate, AssignmentPatch, Board, BoardOrder, PublishResult } from '@shared/schemas/board';
import { type Observable } from 'rxjs';

export const boardUrl = (day: string) => `/api/board?date=${day}`;
export const FIELDS_URL = '/api/fields';
export const CREW_URL = '/api/crew';
export const MACHINES_URL = '/api/fleet/machines';
export const IMPLEMENTS_URL = '/api/fleet/implements';

/**
 * Writes to the work board (owner only on the server). Every write carries the board version the
 * owner last saw and answers with the whole board, or a 409 `stale_board` when someone else saved first.
 * Reads use httpResource on the URLs above.
 */
@Injectable({ providedIn: 'root' })
export class BoardApi {
  private readonly http = inject(HttpClient);

  create(body: AssignmentCreate): Observable<Board> {
    return this.http.post<Board>('/api/assignments', body);
  }

  update(id: number, body: AssignmentPatch): Observable<Board> {
    return this.http.patch<Board>(`/api/assignments/${id}`, body);
  }

  remove(id: number, version: number): Observable<Board> {
    // DELETE carries no body: the version goes in If-Match.
    return this.http.delete<Board>(`/api/assignments/${id}`, { headers: { 'If-Match': `"${version}"` } });
  }

  order(day: string, body: BoardOrder): Observable<Board> {
    return this.http.post<Board>(`/api/board/${day}/order`, body);
  }

  publish(day: string, version: number): Observable<PublishResult> {
    return this.http.post<PublishResult>(`/api/board/${day}/publish`, { version });
  }
}
