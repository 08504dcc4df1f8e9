import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { FailedJob } from '@shared/schemas/background';
import { DateTime } from 'luxon';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { BackgroundJobs } from './background-jobs';

const JOB: FailedJob = {
  id: '6f1c2a9e-4b7d-4c1e-9a3f-2d5e8b0c7a11',
  queue: 'mail',
  what: 'Work order e-mail',
  to: 'tomas@example.test',
  subject: 'Your work for July 2, 2026',
  attempts: 10,
  failedAt: '2026-07-01T23:40:00Z',
  error: '550 mailbox unavailable',
};

describe('BackgroundJobs', () => {
  let fixture: ComponentFixture<BackgroundJobs>;
  let httpTesting: HttpTestingController;
  let el: HTMLElement;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [BackgroundJobs],
      providers: [
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    httpTesting = TestBed.inject(HttpTestingController);
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 1, email: 'o@example.test', name: 'Ingrid' },
      farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Regina' },
      membershipId: 1,
      role: 'owner',
    });
    fixture = TestBed.createComponent(BackgroundJobs);
    el = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
  });

  afterEach(() => {
    httpTesting.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((o) => (o.innerHTML = ''));
  });

  it('when nothing failed, then it says so', async () => {
    httpTesting.expectOne('/api/background/failed').flush({ jobs: [] });
    await fixture.whenStable();
    expect(el.querySelector('h2')?.textContent).toBe('Mail and background jobs');
    expect(el.querySelector('.none')?.textContent).toContain('Nothing has failed');
  });

  it('when a mail failed for good, then it shows what, to whom, the attempts and the reason, and Try again posts the retry and reloads', async () => {
    httpTesting.expectOne('/api/background/failed').flush({ jobs: [JOB] });
    await fixture.whenStable();
    const text = el.querySelector('.job')?.textContent ?? '';
    expect(text).toContain('Work order e-mail');
    expect(text).toContain('tomas@example.test');
    expect(text).toContain('after 10 attempts');
    expect(text).toContain('550 mailbox unavailable');
    // At the farm's clock: 23:40 UTC on July 1 is 17:40 in Regina (UTC-6 all year; luxon, IANA data).
    const gaveUp = DateTime.fromISO(JOB.failedAt, { zone: 'America/Regina' }).setLocale('en-US').toFormat('LLL d, HH:mm');
    expect(gaveUp).toBe('Jul 1, 17:40');
    expect(text).toContain(`Gave up ${gaveUp} after 10 attempts`);

    const button = el.querySelector<HTMLButtonElement>('.job button')!;
    expect(button.getAttribute('aria-label')).toBe('Try again: Work order e-mail to tomas@example.test');
    button.click();
    fixture.detectChanges();
    expect(button.disabled).toBe(true);
    const req = httpTesting.expectOne(`/api/background/failed/${JOB.id}/retry`);
    expect(req.request.method).toBe('POST');
    req.flush(null, { status: 204, statusText: 'No Content' });
    TestBed.tick();
    httpTesting.expectOne('/api/background/failed').flush({ jobs: [] });
    await fixture.whenStable();
    expect(el.querySelector('.job')).toBeNull();
    expect(document.querySelector('.cdk-overlay-container')?.textContent).toContain(
      'Work order e-mail to tomas@example.test is queued again.',
    );
  });

  it('when the list cannot be read, then the server message shows with Try again', async () => {
    httpTesting
      .expectOne('/api/background/failed')
      .flush(
        { error: { code: 'db_unavailable', message: 'The farm database is not answering.' } },
        { status: 503, statusText: 'Unavailable' },
      );
    await fixture.whenStable();
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('The farm database is not answering.');
  });
});
