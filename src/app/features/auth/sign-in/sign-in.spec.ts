import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import type { Me } from '@shared/schemas/auth';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { SignIn } from './sign-in';

@Component({ template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class Blank {}

const ME: Me = {
  user: { id: 2, email: 'tomas@example.test', name: 'Tomas Reyes' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'operator',
};

describe('SignIn', () => {
  let fixture: ComponentFixture<SignIn>;
  let httpTesting: HttpTestingController;
  let router: Router;
  let page: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [SignIn],
      providers: [
        provideRouter([
          { path: 'home', component: Blank },
          { path: 'members', component: Blank },
          { path: 'forgot-password', component: Blank },
        ]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    fixture = TestBed.createComponent(SignIn);
    page = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
  });

  afterEach(() => httpTesting.verify());

  function type(label: string, value: string): void {
    const field = [...page.querySelectorAll('mat-form-field')].find((f) => f.querySelector('mat-label')?.textContent?.trim() === label);
    const input = field?.querySelector('input');
    if (!input) throw new Error(`no field labelled ${label}`);
    input.value = value;
    input.dispatchEvent(new Event('input'));
  }

  function button(text: string): HTMLButtonElement {
    const found = [...page.querySelectorAll('button')].find((b) => b.textContent?.trim() === text);
    if (!found) throw new Error(`no button ${text}`);
    return found;
  }

  it('then it shows one h1, the labelled fields and the forgot-password link', () => {
    expect(page.querySelectorAll('h1')).toHaveLength(1);
    expect(page.querySelector('h1')?.textContent).toContain('Sign in');
    const labels = [...page.querySelectorAll('mat-label')].map((l) => l.textContent?.trim());
    expect(labels).toEqual(['E-mail', 'Password']);
    const link = page.querySelector<HTMLAnchorElement>('a[href="/forgot-password"]');
    expect(link?.textContent).toContain('Forgot password?');
  });

  it('when the form is empty, then nothing is sent and the fields say what is missing', async () => {
    button('Sign in').click();
    await fixture.whenStable();
    httpTesting.expectNone('/api/auth/login');
    expect(page.textContent).toContain('Enter your e-mail address');
    expect(page.textContent).toContain('Enter your password');
  });

  it('when the credentials are accepted, then it posts them, keeps the session and goes to next', async () => {
    fixture.componentRef.setInput('next', '/members');
    type('E-mail', ' tomas@example.test ');
    type('Password', 'correct horse battery');
    button('Sign in').click();

    const req = httpTesting.expectOne('/api/auth/login');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ email: 'tomas@example.test', password: 'correct horse battery' });
    req.flush(ME);
    await fixture.whenStable();

    expect(TestBed.inject(AuthStore).me()).toEqual(ME);
    expect(router.url).toBe('/members');
  });

  it('when next points off the site, then it goes to the role home instead', async () => {
    fixture.componentRef.setInput('next', '//elsewhere.example/phish');
    type('E-mail', 'tomas@example.test');
    type('Password', 'correct horse battery');
    button('Sign in').click();
    httpTesting.expectOne('/api/auth/login').flush(ME);
    await fixture.whenStable();
    expect(router.url).toBe('/home');
  });

  it("when the server answers 401, then the server's message shows and nobody is signed in", async () => {
    type('E-mail', 'tomas@example.test');
    type('Password', 'not the password');
    button('Sign in').click();
    httpTesting
      .expectOne('/api/auth/login')
      .flush(
        { error: { code: 'bad_credentials', message: 'That e-mail and password do not match.' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    await fixture.whenStable();

    expect(page.querySelector('[role="alert"]')?.textContent?.trim()).toBe('That e-mail and password do not match.');
    expect(TestBed.inject(AuthStore).me()).toBeNull();
    expect(router.url).toBe('/');
    expect(button('Sign in').disabled).toBe(false);
  });

  it('when sign-in is rate-limited (429), then the server message shows', async () => {
    type('E-mail', 'tomas@example.test');
    type('Password', 'not the password');
    button('Sign in').click();
    httpTesting
      .expectOne('/api/auth/login')
      .flush(
        { error: { code: 'rate_limited', message: 'Too many tries. Wait 15 minutes.' } },
        { status: 429, statusText: 'Too Many Requests' },
      );
    await fixture.whenStable();
    expect(page.querySelector('[role="alert"]')?.textContent).toContain('Too many tries. Wait 15 minutes.');
  });
});
