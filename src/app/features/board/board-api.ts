import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AssignmentCreate, AssignmentPatch, Board, BoardOrder, PublishResult } from '@shared/schemas/board';
import { type Observable } from 'rxjs';
import { API } from '../../core/http/api-paths';

/**
 * Writes to the work board (owner only on the server). Every write carries the board version the
 * owner last saw and answers with the whole board, or a 409 `stale_board` when someone else saved first.
 * Reads use httpResource on `API.board(date)` and the fields, crew and fleet lists.
 */
@Injectable({ providedIn: 'root' })
export class BoardApi {
  private readonly http = inject(HttpClient);

  create(body: AssignmentCreate): Observable<Board> {
    return this.http.post<Board>(API.assignments, body);
  }

  update(id: number, body: AssignmentPatch): Observable<Board> {
    return this.http.patch<Board>(API.assignment(id), body);
  }

  remove(id: number, version: number): Observable<Board> {
    // DELETE carries no body: the version goes in If-Match.
    return this.http.delete<Board>(API.assignment(id), { headers: { 'If-Match': `"${version}"` } });
  }

  order(day: string, body: BoardOrder): Observable<Board> {
    return this.http.post<Board>(API.boardOrder(day), body);
  }

  publish(day: string, version: number): Observable<PublishResult> {
    return this.http.post<PublishResult>(API.boardPublish(day), { version });
  }
}
