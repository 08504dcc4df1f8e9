import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { RunSheetItem } from '@shared/schemas/run-sheet';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { FieldMapStub } from '../../../shared/map/field-map/field-map-stub';
import { job } from '../../board/testing/board-fixtures';
import { RunSheetJob, clockSpan } from './run-sheet-job';

describe('RunSheetJob', () => {
  let fixture: ComponentFixture<RunSheetJob>;
  let http: HttpTestingController;
  let el: HTMLElement;
  let changed: RunSheetItem[];

  function create(item: RunSheetItem): void {
    fixture = TestBed.createComponent(RunSheetJob);
    fixture.componentRef.setInput('item', item);
    changed = [];
    fixture.componentInstance.changed.subscribe((i) => changed.push(i));
    el = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
  }

  beforeEach(() => {
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
      speedMph: 10,
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
    expect(rows).toEqual(['Heading: 92°', 'Passes: 31', 'Headland: 2 passes around', 'Turns: 30', 'Hours: 6.3 h whole field']);
    expect(el.querySelector('.hazards')?.textContent?.replace(/\s+/g, ' ')).toContain('keep 33 ft clear — Pole by the approach');
  });

  it('when Pause is tapped twice on a slow line, then one request goes, with the tap time, and the button waits', async () => {
    create(job({ state: 'underway' }));
    actionButton('pause').click();
    fixture.detectChanges();
    expect(actionButton('pause').disabled).toBe(true);
    expect(actionButton('pause').textContent).toContain('Sending');
    actionButton('pause').click();
    const req = http.expectOne('/api/assignments/7/events');
    expect(req.request.body.type).toBe('pause');
    expect(Date.now() - Date.parse(req.request.body.at)).toBeLessThan(5000);
    req.flush(job({ state: 'paused' }));
    await fixture.whenStable();
    expect(changed.map((i) => i.state)).toEqual(['paused']);
  });

  it('when the connection drops, then a retry message shows and Try again sends the same tap time', async () => {
    create(job({ state: 'underway' }));
    actionButton('pause').click();
    const first = http.expectOne('/api/assignments/7/events');
    const at = first.request.body.at as string;
    first.error(new ProgressEvent('error'), { status: 0, statusText: '' });
    await fixture.whenStable();
    const alert = el.querySelector('.failure[role="alert"]') as HTMLElement;
    expect(alert.textContent).toContain('Cannot reach Furlong');
    expect(alert.textContent).toContain('tap Pause to try again');
    expect(actionButton('pause').disabled).toBe(false);

    (alert.querySelector('button') as HTMLButtonElement).click();
    const second = http.expectOne('/api/assignments/7/events');
    expect(second.request.body).toEqual({ type: 'pause', at });
    second.flush(job({ state: 'paused' }));
    await fixture.whenStable();
    expect(el.querySelector('.failure')).toBeNull();
  });

  it('when the server says the job moved on (409), then its message shows without a retry', async () => {
    create(job({ state: 'underway' }));
    let outdated = 0;
    fixture.componentInstance.outdated.subscribe(() => outdated++);
    actionButton('pause').click();
    http
      .expectOne('/api/assignments/7/events')
      .flush(
        { error: { code: 'invalid_transition', message: 'This job is paused: it cannot be paused.' } },
        { status: 409, statusText: 'Conflict' },
      );
    await fixture.whenStable();
    expect(el.querySelector('.failure')?.textContent).toContain('This job is paused: it cannot be paused.');
    expect(el.querySelector('.failure button')).toBeNull();
    expect(outdated).toBe(1);
  });

  it('when Start is tapped, then a dialog asks for the meter, prefilled with the machine reading', async () => {
    create(job());
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
    expect(total('engine-hours')).toBe('8.4 h meter 2781 → 2789.4 h');
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
});
