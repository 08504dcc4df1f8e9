import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import type { Me, Role } from '@shared/schemas/auth';
import { AuthStore } from '../../auth/auth-store';
import { errorInterceptor } from '../../http/error.interceptor';
import { THEME_STORAGE_KEY } from '../theme';
import { Outbox } from '../../../features/run-sheet/outbox/outbox';
import { OutboxStore } from '../../../features/run-sheet/outbox-store';
import { freshDeviceStorage, setOnline, until } from '../../../features/run-sheet/testing/device';
import { Shell, unsentWarning } from './shell';

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
    freshDeviceStorage();
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
    expect(navLabels()).toEqual([
      'Home',
      'Work board',
      'Run sheet',
      'Fields',
      'Pass plan',
      'Fleet',
      'Crew',
      'Season',
      'Custom work',
      'Invoices',
      'Members',
    ]);
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

  it('when run-sheet actions are not sent yet, then Sign out asks first; kept, the session stays; confirmed, it ends and the actions stay on the phone', async () => {
    setOnline(false);
    const box = await Outbox.open();
    await box.add({ userId: 1, farmId: 1, name: 'Ingrid Sorensen' }, 7, { type: 'start' }, new Date('2031-05-15T13:00:00Z'));
    box.close();
    await render('operator');
    await until(() => TestBed.inject(OutboxStore).entries().length === 1, 'the waiting action');
    const confirm = jest.spyOn(window, 'confirm').mockReturnValue(false);
    const signOut = [...page.querySelectorAll('button')].find((b) => b.textContent?.includes('Sign out'))!;
    signOut.click();
    expect(confirm).toHaveBeenCalledWith(unsentWarning(1));
    expect(unsentWarning(1)).toBe(
      '1 run-sheet action is not sent yet. It stays on this phone and is sent when you sign in here again. Sign out anyway?',
    );
    TestBed.inject(HttpTestingController).expectNone('/api/auth/logout');

    confirm.mockReturnValue(true);
    signOut.click();
    TestBed.inject(HttpTestingController).expectOne('/api/auth/logout').flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/sign-in');
    const after = await Outbox.open();
    expect((await after.waiting({ userId: 1, farmId: 1 })).map((e) => e.body.type)).toEqual(['start']);
    after.close();
    confirm.mockRestore();
  });
});
