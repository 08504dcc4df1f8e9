import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { EventInput, ProblemInput, RunSheetItem } from '@shared/schemas/board';
import { type Observable } from 'rxjs';

/** A day's run sheet: the signed-in person's, or (for the owner) another member's. */
export const runSheetUrl = (day: string, membershipId: number | null = null) =>
  `/api/run-sheet?date=${day}${membershipId === null ? '' : `&membershipId=${membershipId}`}`;

/** What an operator logs on a job; each call answers with the job as it now is. Reads use httpResource on runSheetUrl. */
@Injectable({ providedIn: 'root' })
export class RunSheetApi {
  private readonly http = inject(HttpClient);

  event(id: number, body: EventInput): Observable<RunSheetItem> {
    return this.http.post<RunSheetItem>(`/api/assignments/${id}/events`, body);
  }

  problem(id: number, body: ProblemInput): Observable<RunSheetItem> {
    return this.http.post<RunSheetItem>(`/api/assignments/${id}/problems`, body);
  }
}
