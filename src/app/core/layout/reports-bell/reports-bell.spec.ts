import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Role } from '@shared/schemas/auth';
import type { FieldReport, FieldReports } from '@shared/schemas/run-sheet';
import { AuthStore } from '../../auth/auth-store';
import { errorInterceptor } from '../../http/error.interceptor';
import { ReportsBell } from './reports-bell';

const report = (id: number): FieldReport => ({
  id,
  kind: 'breakdown',
  note: 'Hose burst',
  at: '2031-05-15T14:00:00.000Z',
  by: 'Tomas Reyes',
  review: 'open',
  job: { id: 7, date: '2031-05-15', operation: 'harrowing', state: 'paused' },
  field: { id: 107, name: 'North Quarter' },
  machine: { id: 1, name: '4WD 620' },
  hazardId: null,
});

describe('ReportsBell', () => {
  function setUp(role: Role) {
    TestBed.configureTestingModule({
      imports: [ReportsBell],
      providers: [provideRouter([]), provideHttpClient(withInterceptors([errorInterceptor])), provideHttpClientTesting()],
    });
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 1, email: 'o@example.test', name: 'Ingrid' },
      farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' },
      membershipId: 1,
      role,
    });
    const fixture = TestBed.createComponent(ReportsBell);
    return { fixture, http: TestBed.inject(HttpTestingController), el: fixture.nativeElement as HTMLElement };
  }

  it('when the owner has open reports, then the bell shows their count and links to the list', async () => {
    const { fixture, http, el } = setUp('owner');
    fixture.detectChanges();
    const answer: FieldReports = { reports: [report(1), report(2)], machinesDown: [] };
    http.expectOne('/api/reports').flush(answer);
    await fixture.whenStable();
    const link = el.querySelector('a') as HTMLAnchorElement;
    expect(link.getAttribute('href')).toBe('/reports');
    expect(link.getAttribute('aria-label')).toBe('Reports from the field: 2 open');
    expect(el.querySelector('[data-testid="reports-count"]')?.textContent?.trim()).toBe('2');
    http.verify();
  });

  it('when there are none, then no count shows; an operator never asks for reports', async () => {
    const owner = setUp('owner');
    owner.fixture.detectChanges();
    owner.http.expectOne('/api/reports').flush({ reports: [], machinesDown: [] });
    await owner.fixture.whenStable();
    expect(owner.el.querySelector('[data-testid="reports-count"]')).toBeNull();
    expect(owner.el.querySelector('a')?.getAttribute('aria-label')).toBe('Reports from the field: none open');
    TestBed.resetTestingModule();
    const operator = setUp('operator');
    operator.fixture.detectChanges();
    await operator.fixture.whenStable();
    operator.http.expectNone('/api/reports');
  });
});
