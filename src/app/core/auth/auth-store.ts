import { HttpClient } from '@angular/common/http';
import { Injectable, Injector, computed, inject, signal } from '@angular/core';
import { Router } from '@angular/router';
import { yearIn } from '@shared/calendar';
import type { Me, Role } from '@shared/schemas/auth';
import { type Observable, catchError, firstValueFrom, map, of, tap } from 'rxjs';
import { API } from '../http/api-paths';
import { KEPT_VIEW_KEY } from '../offline/kept-view';
import { toSignIn } from './to-sign-in';

/**
 * Who was last signed in on this device, kept so the app opens with no signal (the run sheet in a
 * draw or a steel cab). It only shapes the screens: the server still decides on every request, and
 * a 401 or a sign-out forgets it.
 */
export const SIGNED_IN_KEY = 'furlong.signed-in';

/**
 * How long the app waits at start-up for the server to say who this is before it opens for the
 * person last signed in on this device. A weak signal (one bar at the far end of a section) can
 * hold a request for minutes without failing it; the run sheet must not wait that long.
 */
export const SERVER_WAIT_MS = 4000;

/**
 * Who is signed in, for the whole app. The server decides what each role may do; this store only
 * shapes the UI (navigation, greetings) around the answer of `GET /api/auth/me`.
 */
@Injectable({ providedIn: 'root' })
export class AuthStore {
  private readonly http = inject(HttpClient);
  private readonly injector = inject(Injector);
  private readonly current = signal<Me | null>(null);

  readonly me = this.current.asReadonly();
  /**
   * Why the server could not say who this browser belongs to (the farm's database not answering,
   * no connection). Not the same as signed out: the person keeps their session and is not sent to
   * sign-in; the app offers to try again instead.
   */
  readonly unavailable = signal<string | null>(null);
  /** True when the server could not be reached at start-up and the person is who this device last saw. */
  readonly fromDevice = signal(false);
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
   * other failure means the server could not tell (see `unavailable`). With no connection at all
   * (status 0) the person last signed in on this device is taken, so the app opens offline. So it
   * is when the server has not answered within `waitMs`: its answer, when it comes, still counts
   * (a 401 then sends the person to sign-in; a late failure changes nothing).
   */
  load(waitMs = SERVER_WAIT_MS): Promise<Me | null> {
    let openedFromDevice = false;
    const answer = firstValueFrom(
      this.http.get<Me>(API.authMe).pipe(
        tap((me) => {
          this.unavailable.set(null);
          this.fromDevice.set(false);
          this.set(me);
        }),
        catchError((err: unknown) => {
          const e = err as { status?: number; message?: string };
          if (e?.status === 401) {
            this.unavailable.set(null);
            this.set(null);
            if (openedFromDevice) toSignIn(this.injector.get(Router));
            return of(null);
          }
          // Already open as the device's person: a late failure leaves them be (no blank screen mid-job).
          if (openedFromDevice) return of(this.current());
          const kept = e?.status === 0 ? remembered() : null;
          this.fromDevice.set(kept !== null);
          this.unavailable.set(kept ? null : (e?.message ?? "Cannot reach Furlong's server; your work is not lost."));
          this.current.set(kept);
          return of(kept);
        }),
      ),
    );
    const kept = remembered();
    if (!kept) return answer;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const waited = new Promise<Me>((resolve) => (timer = setTimeout(() => resolve(kept), waitMs))).then((me) => {
      openedFromDevice = true;
      this.unavailable.set(null);
      this.current.set(me);
      this.fromDevice.set(true);
      return me;
    });
    return Promise.race([answer.finally(() => clearTimeout(timer)), waited]);
  }

  login(email: string, password: string): Observable<Me> {
    return this.http.post<Me>(API.authLogin, { email, password }).pipe(tap((me) => this.set(me)));
  }

  /** Used by pages whose POST signs the person in (accepting an invitation, a password reset). */
  signedInAs(me: Me): void {
    this.set(me);
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
      this.set({ ...me, farm: { id: farm.id, name: farm.name, units: farm.units, timeZone: farm.timeZone } });
  }

  clear(): void {
    this.set(null);
  }

  /**
   * Sets who is signed in and keeps it on this device (or forgets it). The run sheet the phone kept
   * as drawn (core/offline/kept-view) goes too when nobody, or someone else, is signed in now.
   */
  private set(me: Me | null): void {
    this.current.set(me);
    this.fromDevice.set(false);
    try {
      const before = remembered();
      if (!me || before?.user.id !== me.user.id || before?.farm.id !== me.farm.id) localStorage.removeItem(KEPT_VIEW_KEY);
      if (me) localStorage.setItem(SIGNED_IN_KEY, JSON.stringify(me));
      else localStorage.removeItem(SIGNED_IN_KEY);
    } catch {
      // Storage refused (private mode, full): the app still works online.
    }
  }
}

/** The person kept by `set`, if it still reads as one. */
function remembered(): Me | null {
  try {
    const me = JSON.parse(localStorage.getItem(SIGNED_IN_KEY) ?? 'null') as Partial<Me> | null;
    return me && typeof me.membershipId === 'number' && me.user && me.farm && me.role ? (me as Me) : null;
  } catch {
    return null;
  }
}
