import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import type { Role } from '@shared/schemas/auth';
import { roleGuard, signedIn, signedOut } from './auth-guards';
import { AuthStore } from './auth-store';
import { safeNext } from './role-home';

@Component({ template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class Blank {}

describe('route guards', () => {
  let router: Router;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([
          { path: 'sign-in', component: Blank, canActivate: [signedOut] },
          { path: 'home', component: Blank, canActivate: [signedIn] },
          { path: 'members', component: Blank, canActivate: [signedIn, roleGuard(['owner'])] },
        ]),
      ],
    });
    router = TestBed.inject(Router);
  });

  function signIn(role: Role): void {
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 1, email: 'a@example.test', name: 'A' },
      farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' },
      membershipId: 1,
      role,
    });
  }

  it('when nobody is signed in, then a screen sends them to sign-in with next', async () => {
    await router.navigateByUrl('/members?tab=2');
    expect(router.url).toBe('/sign-in?next=%2Fmembers%3Ftab%3D2');
  });

  it('when the server could not say who this is (an outage), then nobody is sent to sign-in', async () => {
    TestBed.inject(AuthStore).unavailable.set("The farm's database is not answering");
    const ok = await router.navigateByUrl('/members');
    expect(ok).toBe(false);
    expect(router.url).not.toContain('sign-in');
    expect(TestBed.inject(AuthStore).retryUrl).toBe('/members');
  });

  it('when an operator opens an owner-only screen, then they land on their home', async () => {
    signIn('operator');
    await router.navigateByUrl('/members');
    expect(router.url).toBe('/home');
  });

  it('when an owner opens Members, then it opens', async () => {
    signIn('owner');
    await router.navigateByUrl('/members');
    expect(router.url).toBe('/members');
  });

  it('when a signed-in person opens sign-in, then they go home instead', async () => {
    signIn('viewer');
    await router.navigateByUrl('/sign-in');
    expect(router.url).toBe('/home');
  });

  it.each([
    ['/members', '/members'],
    ['//evil.example', null],
    ['/\\evil.example', null],
    ['https://evil.example', null],
    ['/sign-in?next=/x', null],
    [undefined, null],
  ])('when next is %s, then safeNext gives %s', (next, expected) => {
    expect(safeNext(next)).toBe(expected);
  });
});
