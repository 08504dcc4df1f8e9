import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
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
