// The owner's open reports from the field, read once for the whole app: the shell shows their
// count on every page, the reports page lists them. Read again on every navigation and every
// minute, and at once after the owner confirms or dismisses one.
import { HttpClient, httpResource } from '@angular/common/http';
import { DestroyRef, Injectable, computed, inject } from '@angular/core';
import { NavigationEnd, Router } from '@angular/router';
import type { FieldReport, FieldReports } from '@shared/schemas/run-sheet';
import { type Observable, filter, tap } from 'rxjs';
import { AuthStore } from '../auth/auth-store';
import { API } from '../http/api-paths';

/** How often an open page looks for new reports (a report also shows on the next navigation). */
export const REPORTS_REFRESH_MS = 60_000;

@Injectable({ providedIn: 'root' })
export class FieldReportsStore {
  private readonly auth = inject(AuthStore);
  private readonly http = inject(HttpClient);

  /** Only owners read reports; for anyone else nothing is asked. */
  readonly resource = httpResource<FieldReports>(() => (this.auth.isOwner() ? API.reports : undefined));
  readonly reports = computed<FieldReport[]>(() => (this.resource.hasValue() ? (this.resource.value()?.reports ?? []) : []));
  readonly machinesDown = computed(() => (this.resource.hasValue() ? (this.resource.value()?.machinesDown ?? []) : []));
  readonly count = computed(() => this.reports().length);

  constructor() {
    const router = inject(Router);
    const sub = router.events.pipe(filter((e) => e instanceof NavigationEnd)).subscribe(() => this.refresh());
    const timer = setInterval(() => this.refresh(), REPORTS_REFRESH_MS);
    inject(DestroyRef).onDestroy(() => {
      sub.unsubscribe();
      clearInterval(timer);
    });
  }

  refresh(): void {
    if (this.auth.isOwner() && !this.resource.isLoading()) this.resource.reload();
  }

  review(id: number, action: 'confirm' | 'dismiss'): Observable<FieldReport> {
    return this.http.post<FieldReport>(API.reportReview(id, action), {}).pipe(tap(() => this.resource.reload()));
  }
}
