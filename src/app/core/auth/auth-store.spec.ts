import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { AuthStore } from './auth-store';

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
