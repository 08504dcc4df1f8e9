import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { EventInput, ProblemInput, RunSheetItem } from '@shared/schemas/run-sheet';
import { type Observable } from 'rxjs';
import { API } from '../../core/http/api-paths';

/**
 * A day's run sheet: the signed-in person's, or (for the owner) another member's. Without a day the
 * server picks the person's next day with work and says which it picked.
 */
export const runSheetUrl = (date: string | null, membershipId: number | null = null): string =>
  date ? API.runSheet(date, membershipId) : `/api/run-sheet${membershipId === null ? '' : `?membershipId=${membershipId}`}`;

/** What an operator logs on a job; each call answers with the job as it now is. Reads use httpResource on runSheetUrl. */
@Injectable({ providedIn: 'root' })
export class RunSheetApi {
  private readonly http = inject(HttpClient);

  event(id: number, body: EventInput): Observable<RunSheetItem> {
    return this.http.post<RunSheetItem>(API.assignmentEvents(id), body);
  }

  problem(id: number, body: ProblemInput): Observable<RunSheetItem> {
    return this.http.post<RunSheetItem>(API.assignmentProblems(id), body);
  }
}
