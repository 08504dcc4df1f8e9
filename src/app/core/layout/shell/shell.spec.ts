import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import type { Me, Role } from '@shared/schemas/auth';
import { AuthStore } from '../../auth/auth-store';
import { errorInterceptor } from '../../http/error.interceptor';
import { THEME_STORAGE_KEY } from '../theme';
import { Shell } from './shell';

@Component({ template: '<h1>Page</h1>', changeDetection: ChangeDetectionStrategy.OnPush })
class Blank {}

function me(role: Role): Me {
  return {
    user: { id: 1, email: 'someone@example.test', name: 'Ingrid Sorensen' },
    farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
    membershipId: 1,
    role,
  };
}

describe('Shell', () => {
  let fixture: ComponentFixture<Shell>;
  let page: HTMLElement;

  async function render(role: Role): Promise<void> {
    TestBed.inject(AuthStore).signedInAs(me(role));
    fixture = TestBed.createComponent(Shell);
    page = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    // The owner's bar asks for the open reports from the field; answer with none unless a test says otherwise.
    for (const req of TestBed.inject(HttpTestingController).match('/api/reports')) req.flush({ reports: [], machinesDown: [] });
    await fixture.whenStable();
  }

  beforeEach(() => {
    localStorage.clear();
    document.documentElement.className = '';
    TestBed.configureTestingModule({
      imports: [Shell],
      providers: [
        provideRouter([
          { path: 'home', component: Blank },
          { path: 'members', component: Blank },
          { path: 'sign-in', component: Blank },
        ]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
      ],
    });
  });

  const navLabels = () =>
    [...page.querySelectorAll('nav[aria-label="Main"] a[mat-list-item]')].map((a) =>
      a.querySelector('[matListItemTitle]')?.textContent?.trim(),
    );

  it('when an owner is signed in, then the main navigation offers every screen', async () => {
    await render('owner');
    expect(navLabels()).toEqual(['Home', 'Work board', 'Run sheet', 'Fields', 'Pass plan', 'Fleet', 'Crew', 'Season', 'Members']);
    expect(page.querySelector('nav[aria-label="Main"] a[href="/members"]')).not.toBeNull();
  });

  it('when an operator is signed in, then Members is not offered', async () => {
    await render('operator');
    expect(navLabels()).toEqual(['Home', 'Run sheet', 'Fields', 'Pass plan', 'Fleet']);
    expect(page.querySelector('a[href="/members"]')).toBeNull();
  });

  it('then the toolbar names the app, the farm, the person and the role, with landmarks around the page', async () => {
    await render('viewer');
    const header = page.querySelector('header');
    expect(header?.textContent).toContain('Furlong');
    expect(header?.textContent).toContain('Tamarack Ridge Farm');
    expect(header?.textContent).toContain('Ingrid Sorensen');
    expect(header?.textContent).toContain('viewer');
    expect(page.querySelectorAll('main')).toHaveLength(1);
    expect(page.querySelector('footer')?.textContent).toContain(
      "Furlong's plans are aids: the operator's judgement on the ground comes first.",
    );
    // The list inside <nav> must not add a second, unnamed navigation landmark.
    expect(page.querySelectorAll('[role="navigation"]')).toHaveLength(0);
  });

  it('when the theme toggle is pressed, then the dark theme applies, is remembered and the label flips', async () => {
    await render('owner');
    const toggle = page.querySelector<HTMLButtonElement>('button[aria-label="Switch to dark theme"]');
    expect(toggle).not.toBeNull();
    toggle!.click();
    await fixture.whenStable();
    expect(document.documentElement.classList.contains('dark-theme')).toBe(true);
    expect(localStorage.getItem(THEME_STORAGE_KEY)).toBe('dark');
    expect(page.querySelector('button[aria-label="Switch to light theme"]')).not.toBeNull();
  });

  it('when Sign out is pressed, then the session ends and sign-in opens', async () => {
    await render('owner');
    const signOut = [...page.querySelectorAll('button')].find((b) => b.textContent?.includes('Sign out'));
    signOut!.click();
    const req = TestBed.inject(HttpTestingController).expectOne('/api/auth/logout');
    expect(req.request.method).toBe('POST');
    req.flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    expect(TestBed.inject(AuthStore).me()).toBeNull();
    expect(TestBed.inject(Router).url).toBe('/sign-in');
  });
});
