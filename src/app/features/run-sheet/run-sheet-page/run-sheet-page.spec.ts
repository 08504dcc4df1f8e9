import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Me } from '@shared/schemas/auth';
import type { RunSheet } from '@shared/schemas/run-sheet';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { FieldMapStub } from '../../../shared/map/field-map/field-map-stub';
import { MILO, TOMAS, job } from '../../board/testing/board-fixtures';
import { RunSheetJob } from '../run-sheet-job/run-sheet-job';
import { RunSheetPage, firstOpen } from './run-sheet-page';

/** The page for a signed-in person on 2031-05-15, its HTTP calls held for the test to answer. */
function setUp(me: Me): { fixture: ComponentFixture<RunSheetPage>; http: HttpTestingController; el: HTMLElement } {
  TestBed.configureTestingModule({
    imports: [RunSheetPage],
    providers: [
      provideRouter([]),
      provideHttpClient(withInterceptors([errorInterceptor])),
      provideHttpClientTesting(),
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
    ],
  });
  TestBed.overrideComponent(RunSheetJob, { remove: { imports: [FieldMap] }, add: { imports: [FieldMapStub] } });
  TestBed.inject(AuthStore).signedInAs(me);
  const fixture = TestBed.createComponent(RunSheetPage);
  fixture.componentRef.setInput('date', '2031-05-15');
  return { fixture, http: TestBed.inject(HttpTestingController), el: fixture.nativeElement as HTMLElement };
}

describe('RunSheetPage', () => {
  let fixture: ComponentFixture<RunSheetPage>;
  let http: HttpTestingController;
  let el: HTMLElement;

  beforeEach(() => {
    ({ fixture, http, el } = setUp({
      user: { id: 2, email: 't@example.test', name: 'Tomas Reyes' },
      farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' },
      membershipId: TOMAS.membershipId,
      role: 'operator',
    }));
    fixture.detectChanges();
  });

  afterEach(() => http.verify());

  const sheet = (assignments: RunSheet['assignments'], over: Partial<RunSheet> = {}): RunSheet => ({
    date: '2031-05-15',
    today: '2031-05-15',
    opened: 'asked',
    person: TOMAS,
    assignments,
    ...over,
  });

  it('when the day is in the address, then that day is asked for and its jobs show in time order under one h1', async () => {
    const harrow = job({ id: 1, role: 'mentor', operator: MILO, startTime: '07:00', field: { ...job().field, name: 'North Section' } });
    const seed = job({ id: 2, operation: 'seeding', startTime: '11:00', field: { ...job().field, name: 'Tamarack Flats' } });
    http.expectOne('/api/run-sheet?date=2031-05-15').flush(sheet([seed, harrow]));
    await fixture.whenStable();
    expect(el.querySelectorAll('h1')).toHaveLength(1);
    expect([...el.querySelectorAll('.job-title')].map((t) => t.textContent?.trim())).toEqual([
      '1. North Section · Harrowing',
      '2. Tamarack Flats · Seeding',
    ]);
    expect(el.textContent).toContain('mentoring Milo Sorensen');
    // The person's own job opens first, not the one they mentor.
    expect(el.querySelector('[data-job="2"] app-run-sheet-job')).not.toBeNull();
    expect(el.querySelector('[data-job="1"] app-run-sheet-job')).toBeNull();
  });

  it('when a logged action answers with the job, then the sheet shows its new state', async () => {
    http.expectOne('/api/run-sheet?date=2031-05-15').flush(sheet([job({ id: 7 })]));
    await fixture.whenStable();
    const jobView = fixture.debugElement.query((d) => d.componentInstance instanceof RunSheetJob);
    (jobView.componentInstance as RunSheetJob).changed.emit(job({ id: 7, state: 'underway' }));
    await fixture.whenStable();
    expect(el.querySelector('.job-sub .state')?.textContent?.trim()).toBe('underway');
  });

  it('when the day has no jobs, then it says so', async () => {
    http.expectOne('/api/run-sheet?date=2031-05-15').flush(sheet([]));
    await fixture.whenStable();
    expect(el.textContent).toContain('Nothing on your run sheet for this day.');
  });

  it('when no day is in the address and there is no work today, then it asks for the next day with work and says which day it shows', async () => {
    http.expectOne('/api/run-sheet?date=2031-05-15').flush(sheet([]));
    await fixture.whenStable();
    fixture.componentRef.setInput('date', undefined);
    TestBed.tick();
    const next = job({ id: 9, date: '2031-05-21' });
    http.expectOne('/api/run-sheet').flush(sheet([next], { date: '2031-05-21', opened: 'next-day-with-work' }));
    await fixture.whenStable();
    expect(el.querySelector('.opened-note span')?.textContent?.trim()).toBe(
      'No work today; showing Wednesday, May 21, the next day with work.',
    );
    expect(el.querySelector('.who')?.textContent).toContain('Wednesday, May 21, 2031');
    expect(el.querySelector('[data-job="9"] app-run-sheet-job')).not.toBeNull();
    expect(el.textContent).not.toContain('Nothing on your run sheet');
  });

  it('when no day is in the address and no published day ahead has work, then it says so on today', async () => {
    http.expectOne('/api/run-sheet?date=2031-05-15').flush(sheet([]));
    await fixture.whenStable();
    fixture.componentRef.setInput('date', undefined);
    TestBed.tick();
    http.expectOne('/api/run-sheet').flush(sheet([], { opened: 'no-work-ahead' }));
    await fixture.whenStable();
    expect(el.querySelector('.opened-note span')?.textContent?.trim()).toBe('No work today, and none on the published days ahead.');
  });

  it('when the sheet cannot load, then the server message shows with Try again', async () => {
    http.expectOne('/api/run-sheet?date=2031-05-15').error(new ProgressEvent('error'), { status: 0, statusText: '' });
    await fixture.whenStable();
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Cannot reach Furlong');
    (el.querySelector('[role="alert"] button') as HTMLButtonElement).click();
    TestBed.tick();
    http.expectOne('/api/run-sheet?date=2031-05-15').flush(sheet([]));
    await fixture.whenStable();
  });
});

describe('RunSheetPage for the owner', () => {
  let fixture: ComponentFixture<RunSheetPage>;
  let http: HttpTestingController;
  let el: HTMLElement;
  const CREW = [
    { membershipId: 1, name: 'Ingrid Sorensen', role: 'owner' as const, skills: {} },
    { membershipId: TOMAS.membershipId, name: TOMAS.name, role: 'operator' as const, skills: {} },
    { membershipId: 9, name: 'Walt Sorensen', role: 'viewer' as const, skills: {} },
  ];

  beforeEach(() => {
    ({ fixture, http, el } = setUp({
      user: { id: 1, email: 'i@example.test', name: 'Ingrid Sorensen' },
      farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' },
      membershipId: 1,
      role: 'owner',
    }));
  });

  afterEach(() => http.verify());

  it("when the owner opens an operator's run sheet, then that person's sheet is asked for and a note says whom they log for", async () => {
    fixture.componentRef.setInput('person', String(TOMAS.membershipId));
    fixture.detectChanges();
    http.expectOne('/api/crew').flush(CREW);
    http
      .expectOne(`/api/run-sheet?date=2031-05-15&membershipId=${TOMAS.membershipId}`)
      .flush({ date: '2031-05-15', person: TOMAS, assignments: [] });
    await fixture.whenStable();
    expect(el.querySelector('[role="note"]')?.textContent).toContain(`You are logging for ${TOMAS.name}`);
    expect(el.textContent).toContain(`Nothing on ${TOMAS.name}'s run sheet for this day.`);
    expect(el.textContent).toContain('Whose run sheet');
  });

  it('when the owner opens their own, then no one else is asked for, no note shows and viewers are not offered', async () => {
    fixture.componentRef.setInput('person', '1');
    fixture.detectChanges();
    http.expectOne('/api/crew').flush(CREW);
    http
      .expectOne('/api/run-sheet?date=2031-05-15')
      .flush({ date: '2031-05-15', person: { membershipId: 1, name: 'Ingrid Sorensen' }, assignments: [] });
    await fixture.whenStable();
    expect(el.querySelector('[role="note"]')).toBeNull();
    (el.querySelector('mat-select') as HTMLElement).click();
    fixture.detectChanges();
    await fixture.whenStable();
    const options = [...document.querySelectorAll('mat-option')].map((o) => o.textContent?.trim());
    expect(options).toEqual(['Ingrid Sorensen', TOMAS.name]);
    document.querySelectorAll('.cdk-overlay-container').forEach((o) => (o.innerHTML = ''));
  });
});

describe('firstOpen', () => {
  it('when one job is underway, then it opens before planned ones; with none of the person’s own, a mentored one opens', () => {
    expect(firstOpen([job({ id: 1 }), job({ id: 2, state: 'underway' })])).toBe(2);
    expect(firstOpen([job({ id: 1, state: 'finished' }), job({ id: 3, role: 'mentor' })])).toBe(3);
    expect(firstOpen([job({ id: 1, state: 'finished' })])).toBeNull();
  });
});
