import { HttpClient } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import { yearIn } from '@shared/calendar';
import type { Me, Role } from '@shared/schemas/auth';
import { type Observable, catchError, firstValueFrom, map, of, tap } from 'rxjs';
import { API } from '../http/api-paths';

/**
 * Who is signed in, for the whole app. The server decides what each role may do; this store only
 * shapes the UI (navigation, greetings) around the answer of `GET /api/auth/me`.
 */
@Injectable({ providedIn: 'root' })
export class AuthStore {
  private readonly http = inject(HttpClient);
  private readonly current = signal<Me | null>(null);

  readonly me = this.current.asReadonly();
  /**
   * Why the server could not say who this browser belongs to (the farm's database not answering,
   * no connection). Not the same as signed out: the person keeps their session and is not sent to
   * sign-in; the app offers to try again instead.
   */
  readonly unavailable = signal<string | null>(null);
  /** The page that was asked for when the server could not answer, to open on "Try again". */
  retryUrl: string | null = null;
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

  /**
   * Asks the server once at start-up who this browser belongs to; a 401 just means "nobody", any
   * other failure means the server could not tell (see `unavailable`).
   */
  load(): Promise<Me | null> {
    return firstValueFrom(
      this.http.get<Me>(API.authMe).pipe(
        tap(() => this.unavailable.set(null)),
        catchError((err: unknown) => {
          const e = err as { status?: number; message?: string };
          this.unavailable.set(e?.status === 401 ? null : (e?.message ?? "Cannot reach Furlong's server; your work is not lost."));
          return of(null);
        }),
        tap((me) => this.current.set(me)),
      ),
    );
  }

  login(email: string, password: string): Observable<Me> {
    return this.http.post<Me>(API.authLogin, { email, password }).pipe(tap((me) => this.current.set(me)));
  }

  /** Used by pages whose POST signs the person in (accepting an invitation, a password reset). */
  signedInAs(me: Me): void {
    this.current.set(me);
  }

  logout(): Observable<void> {
    return this.http.post<void>(API.authLogout, {}).pipe(
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
