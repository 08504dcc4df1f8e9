import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import type { Me, TokenInfo } from '@shared/schemas/auth';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { AcceptInvitation } from './accept-invitation';

@Component({ template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class Blank {}

const TOKEN = 'tok_0123456789abcdefghijklmnop';
const INVITE: TokenInfo = {
  kind: 'invite',
  email: 'ada@example.test',
  name: 'Ada Lindqvist',
  farmName: 'Tamarack Ridge Farm',
};
const ME: Me = {
  user: { id: 6, email: 'ada@example.test', name: 'Ada L.' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'operator',
};

describe('AcceptInvitation', () => {
  let fixture: ComponentFixture<AcceptInvitation>;
  let httpTesting: HttpTestingController;
  let page: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [AcceptInvitation],
      providers: [
        provideRouter([
          { path: 'home', component: Blank },
          { path: 'sign-in', component: Blank },
        ]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(AcceptInvitation);
    page = fixture.nativeElement as HTMLElement;
    fixture.componentRef.setInput('token', TOKEN);
    fixture.detectChanges();
  });

  afterEach(() => httpTesting.verify());

  function input(label: string): HTMLInputElement {
    const field = [...page.querySelectorAll('mat-form-field')].find((f) => f.querySelector('mat-label')?.textContent?.trim() === label);
    const found = field?.querySelector('input');
    if (!found) throw new Error(`no field labelled ${label}`);
    return found;
  }

  function type(label: string, value: string): void {
    const el = input(label);
    el.value = value;
    el.dispatchEvent(new Event('input'));
  }

  async function answerToken(): Promise<void> {
    httpTesting.expectOne(`/api/auth/token/${TOKEN}`).flush(INVITE);
    await fixture.whenStable();
  }

  it('when the link is valid, then it shows the farm and e-mail and prefills the name', async () => {
    await answerToken();
    expect(page.textContent).toContain('Tamarack Ridge Farm');
    expect(page.textContent).toContain('ada@example.test');
    expect(input('Your name').value).toBe('Ada Lindqvist');
  });

  it('when the two passwords differ, then nothing is sent', async () => {
    await answerToken();
    type('New password', 'long enough password');
    type('New password again', 'long enough passw0rd');
    [...page.querySelectorAll('button')].find((b) => b.textContent?.includes('Join the farm'))!.click();
    await fixture.whenStable();
    httpTesting.expectNone('/api/auth/set-password');
    expect(page.textContent).toContain('The two passwords differ');
  });

  it('when the password is too short, then the shared rule says so and nothing is sent', async () => {
    await answerToken();
    type('New password', 'short');
    type('New password again', 'short');
    [...page.querySelectorAll('button')].find((b) => b.textContent?.includes('Join the farm'))!.click();
    await fixture.whenStable();
    httpTesting.expectNone('/api/auth/set-password');
    expect(page.textContent).toContain('Use at least 10 characters');
  });

  it('when the form is sent, then it posts token, password and name and signs the person in', async () => {
    await answerToken();
    type('Your name', 'Ada L.');
    type('New password', 'long enough password');
    type('New password again', 'long enough password');
    [...page.querySelectorAll('button')].find((b) => b.textContent?.includes('Join the farm'))!.click();

    const req = httpTesting.expectOne('/api/auth/set-password');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ token: TOKEN, password: 'long enough password', name: 'Ada L.' });
    req.flush(ME);
    await fixture.whenStable();
    expect(TestBed.inject(AuthStore).me()).toEqual(ME);
    expect(TestBed.inject(Router).url).toBe('/home');
  });

  it('when the link has been used, then the server message shows instead of the form', async () => {
    httpTesting
      .expectOne(`/api/auth/token/${TOKEN}`)
      .flush({ error: { code: 'token_used', message: 'This invitation has already been accepted.' } }, { status: 410, statusText: 'Gone' });
    await fixture.whenStable();
    expect(page.querySelector('[role="alert"]')?.textContent).toContain('This invitation has already been accepted.');
    expect(page.querySelector('form')).toBeNull();
  });
});
