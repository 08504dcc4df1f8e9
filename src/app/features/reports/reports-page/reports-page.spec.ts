import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { DateTime } from 'luxon';
import { provideRouter } from '@angular/router';
import type { FieldReport, FieldReports } from '@shared/schemas/run-sheet';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { ReportsPage } from './reports-page';

const report = (id: number, over: Partial<FieldReport> = {}): FieldReport => ({
  id,
  kind: 'breakdown',
  note: 'Hydraulic hose burst',
  at: '2031-05-15T14:00:00.000Z',
  by: 'Tomas Reyes',
  review: 'open',
  job: { id: 7, date: '2031-05-15', operation: 'harrowing', state: 'paused' },
  field: { id: 107, name: 'North Quarter' },
  machine: { id: 1, name: '4WD 620' },
  hazardId: null,
  ...over,
});

describe('ReportsPage', () => {
  async function setUp(answer: FieldReports) {
    TestBed.configureTestingModule({
      imports: [ReportsPage],
      providers: [provideRouter([]), provideHttpClient(withInterceptors([errorInterceptor])), provideHttpClientTesting()],
    });
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 1, email: 'o@example.test', name: 'Ingrid' },
      farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' },
      membershipId: 1,
      role: 'owner',
    });
    const fixture = TestBed.createComponent(ReportsPage);
    const http = TestBed.inject(HttpTestingController);
    fixture.detectChanges();
    http.expectOne('/api/reports').flush(answer);
    await fixture.whenStable();
    return { fixture, http, el: fixture.nativeElement as HTMLElement };
  }

  it('when there are open reports, then each says what, where and who, links to the job and the field, and the machine down is listed', async () => {
    const { el, http } = await setUp({
      reports: [report(1), report(2, { kind: 'hazard', note: 'Washout', hazardId: 9 })],
      machinesDown: [{ machineId: 1, name: '4WD 620', reportId: 1, since: '2031-05-15T14:00:00.000Z' }],
    });
    const items = [...el.querySelectorAll('li.report')];
    expect(items.map((i) => i.querySelector('h2')?.textContent?.trim())).toEqual(['Breakdown: North Quarter', 'New hazard: North Quarter']);
    expect(items[0].textContent).toContain('“Hydraulic hose burst”');
    expect(items[0].textContent).toContain('Tomas Reyes');
    const links = [...items[0].querySelectorAll('a')].map((a) => a.getAttribute('href'));
    expect(links).toEqual(['/board?date=2031-05-15', '/fields/107']);
    expect(el.querySelector('[data-machine-down]')?.textContent).toContain('4WD 620');
    // At the farm's clock (America/Chicago), whatever the machine's zone: 14:00 UTC on
    // 2031-05-15 is 09:00 CDT (luxon with IANA zone data gives the same).
    const when = DateTime.fromISO('2031-05-15T14:00:00.000Z', { zone: 'America/Chicago' }).setLocale('en-US').toFormat('ccc, LLL d, HH:mm');
    expect(when).toBe('Thu, May 15, 09:00');
    expect(items[0].textContent).toContain(`Tomas Reyes · ${when}`);
    expect(el.querySelector('[data-machine-down]')?.textContent).toContain(`since ${when}`);
    http.verify();
  });

  it('when the owner confirms a report, then it is sent and the list is read again without it', async () => {
    const { el, http, fixture } = await setUp({ reports: [report(1)], machinesDown: [] });
    const confirm = [...el.querySelectorAll('li.report button')].find((b) => b.textContent?.includes('Confirm')) as HTMLButtonElement;
    confirm.click();
    http.expectOne({ method: 'POST', url: '/api/reports/1/confirm' }).flush(report(1, { review: 'confirmed' }));
    TestBed.tick();
    http.expectOne('/api/reports').flush({ reports: [], machinesDown: [] });
    await fixture.whenStable();
    expect(el.querySelectorAll('li.report')).toHaveLength(0);
    expect(el.textContent).toContain('No open reports');
  });

  it('when the report was already reviewed elsewhere (409), then the message shows and the list is read again', async () => {
    const { el, http, fixture } = await setUp({ reports: [report(1)], machinesDown: [] });
    const dismiss = [...el.querySelectorAll('li.report button')].find((b) => b.textContent?.includes('Dismiss')) as HTMLButtonElement;
    dismiss.click();
    http
      .expectOne('/api/reports/1/dismiss')
      .flush({ error: { code: 'report_reviewed', message: 'This report was already confirmed' } }, { status: 409, statusText: 'Conflict' });
    TestBed.tick();
    http.expectOne('/api/reports').flush({ reports: [], machinesDown: [] });
    await fixture.whenStable();
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('This report was already confirmed');
  });
});
