import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, type TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { RunSheetItem } from '@shared/schemas/run-sheet';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { FieldMapStub } from '../../../shared/map/field-map/field-map-stub';
import { job } from '../../board/testing/board-fixtures';
import { OutboxStore } from '../outbox-store';
import { freshDeviceStorage, setOnline, until } from '../testing/device';
import { RunSheetJob, clockSpan } from './run-sheet-job';

describe('RunSheetJob', () => {
  let fixture: ComponentFixture<RunSheetJob>;
  let http: HttpTestingController;
  let el: HTMLElement;

  function create(item: RunSheetItem): void {
    fixture = TestBed.createComponent(RunSheetJob);
    fixture.componentRef.setInput('item', item);
    el = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
  }

  beforeEach(() => {
    freshDeviceStorage();
    setOnline(false);
    TestBed.configureTestingModule({
      imports: [RunSheetJob],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.overrideComponent(RunSheetJob, { remove: { imports: [FieldMap] }, add: { imports: [FieldMapStub] } });
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 2, email: 't@example.test', name: 'Tomas Reyes' },
      farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' },
      membershipId: 1,
      role: 'operator',
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    localStorage.clear();
    http.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((e) => (e.innerHTML = ''));
  });

  const buttons = () =>
    [...el.querySelectorAll('.buttons button')].map((b) => b.textContent?.replace(/\s+/g, ' ').trim().replace(/^\S+ /, ''));
  const actionButton = (action: string) => el.querySelector(`[data-action="${action}"]`) as HTMLButtonElement;

  it.each([
    ['planned', ['Start', 'Call off', 'Report a problem']],
    ['underway', ['Pause', 'Finish', 'Call off', 'Report a problem']],
    ['paused', ['Resume', 'Finish', 'Call off', 'Report a problem']],
    ['finished', []],
    ['called-off', []],
  ] as const)('when the job is %s, then the buttons are %j', (state, expected) => {
    create(job({ state }));
    expect(buttons()).toEqual(expected);
  });

  it('when the job is shown, then its cautions, the aid statement and the owner note are there', () => {
    create(job({ note: 'Mind the wet corner' }));
    expect(el.querySelector('.cautions')?.textContent).toContain('Look up before folding the implement.');
    expect(el.querySelector('.cautions .aid')?.textContent).toContain("the operator's judgement on the ground comes first");
    expect(el.querySelector('.note')?.textContent).toContain('Mind the wet corner');
  });

  it('when the job has a pass plan and hazards, then heading, passes, headland passes, turns and hours show, and each hazard with its clearance', () => {
    const passPlan = {
      implementId: 21,
      widthM: 25.6,
      headlandPasses: 2,
      headingDeg: 91.6,
      coverage: 'gaps-ok' as const,
      speedMps: 4.4704,
      efficiency: 0.8,
      turnSeconds: 20,
      summary: { passCount: 31, turns: 30, hours: 6.25 },
      updatedAt: '2031-05-01T00:00:00Z',
    };
    const base = job();
    const hazards = {
      type: 'FeatureCollection' as const,
      features: [
        {
          type: 'Feature' as const,
          geometry: { type: 'Point' as const, coordinates: [-99.895, 47.605] },
          properties: { id: 5, fieldId: 107, kind: 'power', clearanceM: 10, note: 'Pole by the approach', status: 'confirmed' },
        },
      ],
    };
    create(job({ passPlan, field: { ...base.field, hazards } }));
    const rows = [...el.querySelectorAll('.plan dl > div')].map(
      (d) => `${d.querySelector('dt')?.textContent?.trim()}: ${d.querySelector('dd')?.textContent?.replace(/\s+/g, ' ').trim()}`,
    );
    expect(rows).toEqual([
      'Pass direction: 91.6° (east–west)',
      'Passes: 31',
      'Headland: 2 passes around',
      'Turns: 30',
      'Hours: 6.3 h whole field',
    ]);
    expect(el.querySelector('.hazards')?.textContent?.replace(/\s+/g, ' ')).toContain('keep 33 ft clear — Pole by the approach');
  });

  it('when Pause is tapped with no signal, then it is kept on the phone with its id and tap time, nothing is sent, and the job shows paused, marked not sent yet', async () => {
    setOnline(false);
    create(job({ state: 'underway' }));
    const tapped = Date.now();
    actionButton('pause').click();
    await until(
      () => el.querySelector('[data-unsent]') !== null,
      'the job marked as not sent',
      () => fixture.detectChanges(),
    );
    http.expectNone('/api/run-sheet/outbox');
    http.expectNone('/api/assignments/7/events');
    expect(el.querySelector('.log-actions .state')?.textContent?.trim()).toBe('paused');
    expect(el.querySelector('.unsent-note')?.textContent).toContain('1 action on this phone, not sent yet');
    expect(buttons()).toEqual(['Resume', 'Finish', 'Call off', 'Report a problem']);
    expect(el.querySelector('.log li.unsent')?.textContent).toContain('Paused');
    const [waiting] = TestBed.inject(OutboxStore).entries();
    expect(waiting.body.type).toBe('pause');
    // RFC 4122 version 4 layout.
    expect(waiting.body.clientEventId).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(Math.abs(Date.parse(waiting.body.at) - tapped)).toBeLessThan(5000);
  });

  it('when Pause is tapped with a signal, then it is sent with its job, id and tap time through the outbox route, and the mark goes once answered', async () => {
    setOnline(true);
    create(job({ state: 'underway' }));
    actionButton('pause').click();
    let req: TestRequest | undefined;
    await until(() => (req = http.match('/api/run-sheet/outbox')[0]) !== undefined, 'the pause to be sent');
    expect(req!.request.body).toEqual({
      events: [{ assignmentId: 7, type: 'pause', at: expect.any(String), clientEventId: expect.any(String) }],
    });
    const clientEventId = req!.request.body.events[0].clientEventId;
    req!.flush({
      results: [{ clientEventId, assignmentId: 7, status: 201, body: { clientEventId, id: 7, state: 'paused', eventId: 90 } }],
    });
    await until(
      () => TestBed.inject(OutboxStore).entries().length === 0,
      'the outbox to empty',
      () => fixture.detectChanges(),
    );
    expect(el.querySelector('[data-unsent]')).toBeNull();
    // Answered, but the day not read again yet: the job stays paused (no flash of underway and
    // its Pause button), the pause in its log without the not-sent mark.
    fixture.detectChanges();
    expect(el.querySelector('.log-actions .state')?.textContent?.trim()).toBe('paused');
    expect(buttons()).toEqual(['Resume', 'Finish', 'Call off', 'Report a problem']);
    expect(el.querySelector('.log li.unsent')).toBeNull();
    expect([...el.querySelectorAll('.log li')].map((li) => li.textContent)).toEqual([expect.stringContaining('Paused')]);
    // The day read again: the server's job replaces the preview.
    fixture.componentRef.setInput('item', job({ state: 'paused' }));
    fixture.detectChanges();
    expect(el.querySelector('.log-actions .state')?.textContent?.trim()).toBe('paused');
    expect(el.querySelectorAll('.log li')).toHaveLength(0);
  });

  it('when the server kept the action as a log (the owner moved the job), then its plain sentence shows on the job', async () => {
    setOnline(true);
    create(job({ state: 'underway' }));
    actionButton('pause').click();
    let req: TestRequest | undefined;
    await until(() => (req = http.match('/api/run-sheet/outbox')[0]) !== undefined, 'the pause to be sent');
    const message = 'The owner moved this job to Ada; your pause at 10:05 was kept as your log.';
    const clientEventId = req!.request.body.events[0].clientEventId;
    req!.flush({ results: [{ clientEventId, assignmentId: 7, status: 409, body: { error: { code: 'job_moved', message } } }] });
    await until(
      () => el.querySelector('[data-outcome]') !== null,
      'the outcome on the job',
      () => fixture.detectChanges(),
    );
    expect(el.querySelector('[data-outcome] span')?.textContent?.trim()).toBe(message);
    expect(el.querySelector('[data-unsent]')).toBeNull();
  });

  it('when the job is for a later day at the farm, then Start is disabled and says the day it opens; on or after its day it is not', () => {
    create(job({ date: '2031-05-15' }));
    expect(actionButton('start').disabled).toBe(true);
    expect(el.querySelector('[data-not-yet]')?.textContent?.trim()).toBe('This job is for Thu, May 15: Start opens on that day.');
    expect(actionButton('start').getAttribute('aria-describedby')).toBe(el.querySelector('[data-not-yet]')?.id);
    actionButton('start').click();
    expect(document.querySelector('mat-dialog-container')).toBeNull();
    // Call off and problem reports stay open: a job can be called off the evening before.
    expect(actionButton('call-off').disabled).toBe(false);
    fixture.destroy();
    create(job({ date: '2020-05-15' }));
    expect(actionButton('start').disabled).toBe(false);
    expect(el.querySelector('[data-not-yet]')).toBeNull();
  });

  it('when Start is tapped, then a dialog asks for the meter, prefilled with the machine reading', async () => {
    create(job({ date: '2020-05-15' }));
    actionButton('start').click();
    await fixture.whenStable();
    const input = document.querySelector('mat-dialog-container input') as HTMLInputElement;
    expect(input.value).toBe('4210.5');
  });

  it('when a job started at meter 2781 finishes at 2789.4 a minute later, then the log shows 8.4 engine hours and the clock time apart, never "Worked: 0 h"', async () => {
    const log = { ...job().log, acresDone: 160, hoursWorked: 0.02, engineHoursStart: 2781, engineHoursEnd: 2789.4 };
    create(job({ state: 'finished', log, worked: { engineHours: 8.4, clockHours: 0.02 } }));
    await fixture.whenStable();
    // 2789.4 − 2781 = 8.4 h: the worked example, by plain subtraction.
    const total = (name: string) => el.querySelector(`[data-total="${name}"] dd`)?.textContent?.replace(/\s+/g, ' ').trim();
    expect(total('engine-hours')).toBe('8.4 h meter 2,781.0 h → 2,789.4 h');
    // 0.02 h × 60 = 1.2 min, rounded to the minute.
    expect(total('clock-time')).toBe('1 min start to finish, less pauses');
    expect(el.textContent).not.toMatch(/Worked: 0 h/);
  });

  it('when the clock time is hours long, then it reads in hours and minutes', () => {
    // 3.5 h = 3 h 30 min; 0.004 h = 14.4 s; 2 h exactly (arithmetic).
    expect([clockSpan(3.5), clockSpan(0.004), clockSpan(2)]).toEqual(['3 h 30 min', 'under a minute', '2 h']);
  });

  it('when the cautions were shown once today, then the next showing that day folds them, one tap from open again', async () => {
    create(job());
    await fixture.whenStable();
    expect(el.querySelector('.cautions li')?.textContent).toContain('Look up before folding');
    fixture.destroy();
    create(job());
    await fixture.whenStable();
    expect(el.querySelector('.cautions li')).toBeNull();
    const fold = el.querySelector('.cautions button.fold') as HTMLButtonElement;
    expect(fold.getAttribute('aria-expanded')).toBe('false');
    expect(fold.textContent).toContain('Cautions for harrowing (2)');
    fold.click();
    await fixture.whenStable();
    expect(el.querySelectorAll('.cautions li')).toHaveLength(2);
    // Another day, or another person on the same phone, reads them open again.
    fixture.destroy();
    create(job({ date: '2031-05-16' }));
    await fixture.whenStable();
    expect(el.querySelectorAll('.cautions li')).toHaveLength(2);
  });

  describe('task data', () => {
    const link = () => el.querySelector('.taskdata a') as HTMLAnchorElement | null;

    it("when the job's operator opens it, then a link downloads that job's TASKDATA.zip for the tractor's display", () => {
      create(job({ id: 42, date: '2031-05-15', role: 'operator' }));
      const a = link()!;
      expect(a.textContent?.replace(/\s+/g, ' ').trim()).toBe('download Task data (ISO 11783-10)');
      // The route of the public API contract: GET /api/assignments/:id/taskdata.zip.
      expect(a.getAttribute('href')).toBe('/api/assignments/42/taskdata.zip');
      expect(a.getAttribute('download')).toBe('TASKDATA-2031-05-15-job-42.zip');
      expect(el.querySelector(`#${a.getAttribute('aria-describedby')}`)?.textContent).toContain("for the tractor's display");
    });

    it("when a mentor opens it, then there is no link: the server gives task data to the job's operator and the owner only", () => {
      create(job({ role: 'mentor' }));
      expect(link()).toBeNull();
    });

    it('when the owner opens a job on a sheet whose person mentors it, then the owner still has the link', () => {
      TestBed.inject(AuthStore).signedInAs({
        user: { id: 1, email: 'o@example.test', name: 'Ingrid Sorensen' },
        farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' },
        membershipId: 9,
        role: 'owner',
      });
      create(job({ id: 7, role: 'mentor' }));
      expect(link()?.getAttribute('href')).toBe('/api/assignments/7/taskdata.zip');
    });
  });
});
