import { HttpClient } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import { yearIn } from '@shared/calendar';
import type { Me, Role } from '@shared/schemas/auth';
import { type Observable, catchError, firstValueFrom, map, of, tap } from 'rxjs';

/**
 * Who is signed in, for the whole app. The server decides what each role may do; this store only
 * shapes the UI (navigation, greetings) around the answer of `GET /api/auth/me`.
 */
@Injectable({ providedIn: 'root' })
export class AuthStore {
  private readonly http = inject(HttpClient);
  private readonly current = signal<Me | null>(null);

  readonly me = this.current.asReadonly();
  readonly signedIn = computed(() => this.current() !== null);
  readonly role = computed<Role | null>(() => this.current()?.role ?? null);
  readonly isOwner = computed(() => this.role() === 'owner');
  readonly user = computed(() => this.current()?.user ?? null);
  readonly farm = computed(() => this.current()?.farm ?? null);

  /** The farm's current season: the calendar year at the farm (the browser's, before sign-in). */
  currentSeason(now = new Date()): number {
    const zone = this.farm()?.timeZone;
    return zone ? yearIn(zone, now) : now.getFullYear();
  }

  /** Asks the server once at start-up who this browser belongs to; a 401 just means "nobody". */
  load(): Promise<Me | null> {
    return firstValueFrom(
      this.http.get<Me>('/api/auth/me').pipe(
        catchError(() => of(null)),
        tap((me) => this.current.set(me)),
      ),
    );
  }

  login(email: string, password: string): Observable<Me> {
    return this.http.post<Me>('/api/auth/login', { email, password }).pipe(tap((me) => this.current.set(me)));
  }

  /** Used by pages whose POST signs the person in (accepting an invitation, a password reset). */
  signedInAs(me: Me): void {
    this.current.set(me);
  }

  logout(): Observable<void> {
    return this.http.post<void>('/api/auth/logout', {}).pipe(
      catchError(() => of(undefined)),
      tap(() => this.clear()),
      map(() => undefined),
    );
  }

  /** After the owner saves the farm's settings: the header, units and calendar follow at once. */
  farmChanged(farm: { id: number; name: string; units: Me['farm']['units']; timeZone: string }): void {
    const me = this.current();
    if (me && me.farm.id === farm.id)
      this.current.set({ ...me, farm: { id: farm.id, name: farm.name, units: farm.units, timeZone: farm.timeZone } });
  }

  clear(): void {
    this.current.set(null);
  }
}
