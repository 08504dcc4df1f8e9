import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Me } from '@shared/schemas/auth';
import { provideRouter, Router } from '@angular/router';
import { KEPT_VIEW_KEY } from '../offline/kept-view';
import { AuthStore, SERVER_WAIT_MS, SIGNED_IN_KEY } from './auth-store';

const OPERATOR: Me = {
  user: { id: 7, email: 'wren@example.test', name: 'Wren Halloway' },
  farm: { id: 3, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 11,
  role: 'operator',
};

describe('AuthStore', () => {
  beforeEach(() => TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] }));

  it("when it is New Year's Eve in the browser and already New Year at the farm, then the current season is the farm's", () => {
    const store = TestBed.inject(AuthStore);
    // IANA tz database: Pacific/Chatham keeps UTC+13:45 in the southern summer, so 11:00 UTC on
    // December 31 is 00:45 on January 1 there.
    const at = new Date('2026-12-31T11:00:00Z');
    expect(store.currentSeason(at)).toBe(at.getFullYear());
    store.signedInAs({
      user: { id: 1, email: 'i@example.test', name: 'Ingrid' },
      farm: { id: 1, name: 'F', units: 'us', timeZone: 'Pacific/Chatham' },
      membershipId: 1,
      role: 'owner',
    });
    expect(store.currentSeason(at)).toBe(2027);
    store.farmChanged({ id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' });
    expect(store.currentSeason(at)).toBe(2026);
  });
});

describe('AuthStore start-up', () => {
  beforeEach(() => TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] }));

  it('when the server answers 503 to "who am I", then nobody is signed in but the outage is kept, not taken for a sign-out', async () => {
    const store = TestBed.inject(AuthStore);
    const http = TestBed.inject(HttpTestingController);
    const loading = store.load();
    http
      .expectOne('/api/auth/me')
      .flush(
        { error: { code: 'db_unavailable', message: "The farm's database is not answering" } },
        { status: 503, statusText: 'Service Unavailable' },
      );
    expect(await loading).toBeNull();
    expect(store.signedIn()).toBe(false);
    expect(store.unavailable()).toEqual(expect.any(String));
  });

  it('when the server answers 401, then it is an ordinary "signed out" with no outage', async () => {
    const store = TestBed.inject(AuthStore);
    const http = TestBed.inject(HttpTestingController);
    const loading = store.load();
    http
      .expectOne('/api/auth/me')
      .flush({ error: { code: 'signed_out', message: 'Sign in' } }, { status: 401, statusText: 'Unauthorized' });
    expect(await loading).toBeNull();
    expect(store.unavailable()).toBeNull();
  });
});

describe('AuthStore with no signal', () => {
  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
  });

  /** Starts the app's "who am I" and answers it with no network at all. */
  async function loadOffline(store: AuthStore): Promise<Me | null> {
    const loading = store.load();
    TestBed.inject(HttpTestingController).expectOne('/api/auth/me').error(new ProgressEvent('error'), { status: 0, statusText: '' });
    return loading;
  }

  it('when the person signed in on this device before and the phone has no network, then the app opens as them, marked as taken from the device', async () => {
    const store = TestBed.inject(AuthStore);
    const loading = store.load();
    TestBed.inject(HttpTestingController).expectOne('/api/auth/me').flush(OPERATOR);
    expect(await loading).toEqual(OPERATOR);
    expect(store.fromDevice()).toBe(false);

    // The next start of the app, in a draw with no signal.
    TestBed.resetTestingModule();
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    const later = TestBed.inject(AuthStore);
    expect(later.signedIn()).toBe(false);
    expect(await loadOffline(later)).toEqual(OPERATOR);
    expect(later.signedIn()).toBe(true);
    expect(later.role()).toBe('operator');
    expect(later.fromDevice()).toBe(true);
    expect(later.unavailable()).toBeNull();
  });

  it('when nobody signed in on this device, then no network is still the outage it was', async () => {
    const store = TestBed.inject(AuthStore);
    expect(await loadOffline(store)).toBeNull();
    expect(store.signedIn()).toBe(false);
    expect(store.unavailable()).toEqual(expect.any(String));
  });

  it('when the server says the session ended (401), or the person signs out, then the device forgets them and the run sheet kept as drawn', async () => {
    const store = TestBed.inject(AuthStore);
    store.signedInAs(OPERATOR);
    localStorage.setItem(KEPT_VIEW_KEY, '{"v":1}');
    expect(localStorage.getItem(SIGNED_IN_KEY)).not.toBeNull();
    const loading = store.load();
    TestBed.inject(HttpTestingController)
      .expectOne('/api/auth/me')
      .flush({ error: { code: 'signed_out', message: 'Sign in' } }, { status: 401, statusText: 'Unauthorized' });
    expect(await loading).toBeNull();
    expect(localStorage.getItem(SIGNED_IN_KEY)).toBeNull();
    expect(localStorage.getItem(KEPT_VIEW_KEY)).toBeNull();
    expect(await loadOffline(store)).toBeNull();

    store.signedInAs(OPERATOR);
    localStorage.setItem(KEPT_VIEW_KEY, '{"v":1}');
    store.clear();
    expect(localStorage.getItem(SIGNED_IN_KEY)).toBeNull();
    expect(localStorage.getItem(KEPT_VIEW_KEY)).toBeNull();
  });

  it('when the same person is signed in again the run sheet kept as drawn stays; when someone else is, it goes', () => {
    const store = TestBed.inject(AuthStore);
    store.signedInAs(OPERATOR);
    localStorage.setItem(KEPT_VIEW_KEY, '{"v":1}');
    store.signedInAs({ ...OPERATOR });
    expect(localStorage.getItem(KEPT_VIEW_KEY)).toBe('{"v":1}');
    // Accepting an invitation or resetting a password signs in without signing out first.
    store.signedInAs({ ...OPERATOR, user: { ...OPERATOR.user, id: OPERATOR.user.id + 1 } });
    expect(localStorage.getItem(KEPT_VIEW_KEY)).toBeNull();
  });

  it('when the server answers but its database does not (503), then the device copy is not used: the server is there to ask again', async () => {
    const store = TestBed.inject(AuthStore);
    store.signedInAs(OPERATOR);
    const loading = store.load();
    TestBed.inject(HttpTestingController)
      .expectOne('/api/auth/me')
      .flush({ error: { code: 'db_unavailable', message: 'Not answering' } }, { status: 503, statusText: 'Service Unavailable' });
    expect(await loading).toBeNull();
    expect(store.unavailable()).toEqual(expect.any(String));
    expect(store.fromDevice()).toBe(false);
  });

  it('when a weak signal holds "who am I" without an answer, then the app opens as the person last signed in here after the wait, and the answer when it comes still counts', async () => {
    const store = TestBed.inject(AuthStore);
    store.signedInAs(OPERATOR);
    const http = TestBed.inject(HttpTestingController);
    const started = Date.now();
    const opened = await store.load(50);
    expect(Date.now() - started).toBeGreaterThanOrEqual(45);
    expect(opened).toEqual(OPERATOR);
    expect(store.fromDevice()).toBe(true);
    expect(store.unavailable()).toBeNull();
    http.expectOne('/api/auth/me').flush({ ...OPERATOR, user: { ...OPERATOR.user, name: 'Wren H.' } });
    expect(store.user()?.name).toBe('Wren H.');
    expect(store.fromDevice()).toBe(false);
  });

  it('when the late answer says the session ended, then the person is sent to sign-in and back, and the device forgets them', async () => {
    TestBed.resetTestingModule();
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])] });
    const store = TestBed.inject(AuthStore);
    store.signedInAs(OPERATOR);
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    expect(await store.load(10)).toEqual(OPERATOR);
    TestBed.inject(HttpTestingController)
      .expectOne('/api/auth/me')
      .flush({ error: { code: 'signed_out', message: 'Sign in' } }, { status: 401, statusText: 'Unauthorized' });
    expect(store.signedIn()).toBe(false);
    expect(localStorage.getItem(SIGNED_IN_KEY)).toBeNull();
    expect(navigate).toHaveBeenCalledWith(['/sign-in'], { queryParams: {} });
  });

  it('when the late answer is a failure (the farm database down), then the person stays as opened from the device', async () => {
    const store = TestBed.inject(AuthStore);
    store.signedInAs(OPERATOR);
    expect(await store.load(10)).toEqual(OPERATOR);
    TestBed.inject(HttpTestingController)
      .expectOne('/api/auth/me')
      .flush({ error: { code: 'db_unavailable', message: 'Not answering' } }, { status: 503, statusText: 'Service Unavailable' });
    expect(store.me()).toEqual(OPERATOR);
    expect(store.fromDevice()).toBe(true);
    expect(store.unavailable()).toBeNull();
  });

  it('when the server answers within the wait, then the device copy is never used', async () => {
    const store = TestBed.inject(AuthStore);
    store.signedInAs(OPERATOR);
    const loading = store.load(SERVER_WAIT_MS);
    TestBed.inject(HttpTestingController).expectOne('/api/auth/me').flush(OPERATOR);
    expect(await loading).toEqual(OPERATOR);
    expect(store.fromDevice()).toBe(false);
  });
});
