import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, type TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, DeferBlockState, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Me } from '@shared/schemas/auth';
import type { RunSheet } from '@shared/schemas/run-sheet';
import { AuthStore, SERVER_WAIT_MS } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { FieldMapStub } from '../../../shared/map/field-map/field-map-stub';
import { MILO, TOMAS, job } from '../../board/testing/board-fixtures';
import { RunSheetJob } from '../run-sheet-job/run-sheet-job';
import { Outbox } from '../outbox/outbox';
import { freshDeviceStorage, setOnline, until } from '../testing/device';
import { KEPT_VIEW_ID, KEPT_VIEW_KEY, KEPT_VIEW_OPEN_CLASS, closeKeptView, type KeptView } from '../../../core/offline/kept-view';
import { KEEP_VIEW_AFTER_MS, RunSheetPage, firstOpen } from './run-sheet-page';

/** Tomas, the operator the specs sign in as (unless they are the owner). */
const TOMAS_ME: Me = {
  user: { id: 2, email: 't@example.test', name: 'Tomas Reyes' },
  farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' },
  membershipId: TOMAS.membershipId,
  role: 'operator',
};

/** The page for a signed-in person on 2031-05-15, its HTTP calls held for the test to answer. */
function setUp(me: Me, fresh = true): { fixture: ComponentFixture<RunSheetPage>; http: HttpTestingController; el: HTMLElement } {
  if (fresh) freshDeviceStorage();
  setOnline(true);
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

/** Answers the reads of the days after `day` that the page keeps on the phone (empty days). */
async function answerAhead(http: HttpTestingController, day: string, person = TOMAS): Promise<string[]> {
  const asked: string[] = [];
  for (let i = 1; i <= 3; i++) {
    const date = new Date(Date.parse(`${day}T00:00:00Z`) + i * 86_400_000).toISOString().slice(0, 10);
    const url = `/api/run-sheet?date=${date}`;
    let req: TestRequest | undefined;
    await until(() => (req = http.match(url)[0]) !== undefined, `the read of ${date}`);
    req!.flush({ date, today: day, opened: 'asked', person, assignments: [] });
    asked.push(date);
  }
  return asked;
}

describe('RunSheetPage', () => {
  let fixture: ComponentFixture<RunSheetPage>;
  let http: HttpTestingController;
  let el: HTMLElement;

  beforeEach(() => {
    ({ fixture, http, el } = setUp(TOMAS_ME));
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
    // Opened from the navigation (no day asked): the days after the one shown are read to keep on the phone.
    expect(await answerAhead(http, '2031-05-21')).toEqual(['2031-05-22', '2031-05-23', '2031-05-24']);
  });

  it('when no day is in the address and no published day ahead has work, then it says so on today', async () => {
    http.expectOne('/api/run-sheet?date=2031-05-15').flush(sheet([]));
    await fixture.whenStable();
    fixture.componentRef.setInput('date', undefined);
    TestBed.tick();
    http.expectOne('/api/run-sheet').flush(sheet([], { opened: 'no-work-ahead' }));
    await fixture.whenStable();
    expect(el.querySelector('.opened-note span')?.textContent?.trim()).toBe('No work today, and none on the published days ahead.');
    await answerAhead(http, '2031-05-15');
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

describe('RunSheetPage on a phone with no signal', () => {
  const day = (assignments: RunSheet['assignments']): RunSheet => ({
    date: '2031-05-15',
    today: '2031-05-15',
    opened: 'asked',
    person: TOMAS,
    assignments,
  });
  /** The page over a phone whose storage already holds what `seed` writes. */
  async function onPhone(seed: (box: Outbox) => Promise<void>, online = true) {
    freshDeviceStorage();
    const box = await Outbox.open();
    await seed(box);
    box.close();
    const set = setUp(TOMAS_ME, false);
    setOnline(online);
    return set;
  }
  const text = (el: HTMLElement, sel: string) => el.querySelector(sel)?.textContent?.replace(/\s+/g, ' ').trim();

  it('when the network gives no answer and the phone kept the day, then the kept jobs show "as of" their time on the farm clock, with no error', async () => {
    // 11:12 UTC on 15 May is 06:12 in Chicago: Central Daylight Time is UTC−5 (IANA time zone database, America/Chicago).
    const { fixture, http, el } = await onPhone((box) =>
      box.keepSheet('2:1:/api/run-sheet?date=2031-05-15', day([job({ id: 7 })]), new Date('2031-05-15T11:12:00Z')),
    );
    fixture.detectChanges();
    http.expectOne('/api/run-sheet?date=2031-05-15').error(new ProgressEvent('error'), { status: 0, statusText: '' });
    await until(
      () => el.querySelector('[data-as-of]') !== null,
      'the kept sheet',
      () => fixture.detectChanges(),
    );
    expect(text(el, '[data-as-of] span')).toBe('No connection: the run sheet kept on this phone, as of 06:12.');
    expect(el.querySelector('[data-job="7"]')).not.toBeNull();
    expect(el.querySelector('.load-error')).toBeNull();
    http.verify();
  });

  it('when a weak signal holds the read without an answer, then the kept jobs show after the wait, said to be waiting for the server, and the answer replaces them', async () => {
    const { fixture, http, el } = await onPhone((box) =>
      box.keepSheet('2:1:/api/run-sheet?date=2031-05-15', day([job({ id: 7 })]), new Date('2031-05-15T11:12:00Z')),
    );
    fixture.detectChanges();
    const read = http.expectOne('/api/run-sheet?date=2031-05-15');
    await new Promise((r) => setTimeout(r, SERVER_WAIT_MS / 2));
    fixture.detectChanges();
    expect(el.querySelector('[data-job="7"]')).toBeNull();
    await new Promise((r) => setTimeout(r, SERVER_WAIT_MS / 2));
    await until(
      () => el.querySelector('[data-as-of]') !== null,
      'the kept sheet',
      () => fixture.detectChanges(),
    );
    expect(text(el, '[data-as-of] span')).toBe('Waiting for the server: the run sheet kept on this phone, as of 06:12.');
    expect(el.querySelector('[data-job="7"]')).not.toBeNull();
    expect(el.querySelector('.load-error')).toBeNull();

    read.flush(day([job({ id: 8 })]));
    await until(
      () => el.querySelector('[data-job="8"]') !== null,
      "the server's day",
      () => fixture.detectChanges(),
    );
    expect(el.querySelector('[data-as-of]')).toBeNull();
    expect(el.querySelector('[data-job="7"]')).toBeNull();
  });

  it('when the app already opened from the phone because the server was slow to say who this is, then the kept jobs show at once, with no second wait', async () => {
    const { fixture, http, el } = await onPhone((box) =>
      box.keepSheet('2:1:/api/run-sheet?date=2031-05-15', day([job({ id: 7 })]), new Date('2031-05-15T11:12:00Z')),
    );
    const auth = TestBed.inject(AuthStore);
    const opening = auth.load(10);
    expect(await opening).toEqual(TOMAS_ME);
    expect(auth.fromDevice()).toBe(true);
    const started = Date.now();
    fixture.detectChanges();
    const reads = () => http.match('/api/run-sheet?date=2031-05-15');
    expect(reads()).toHaveLength(1);
    await until(
      () => el.querySelector('[data-job="7"]') !== null,
      'the kept sheet',
      () => fixture.detectChanges(),
    );
    expect(Date.now() - started).toBeLessThan(SERVER_WAIT_MS);
    expect(text(el, '[data-as-of] span')).toBe('Waiting for the server: the run sheet kept on this phone, as of 06:12.');
  });

  it('when the network answers, then the day is kept on the phone for next time', async () => {
    const { fixture, http } = setUp(TOMAS_ME);
    fixture.detectChanges();
    http.expectOne('/api/run-sheet?date=2031-05-15').flush(day([job({ id: 7 })]));
    await fixture.whenStable();
    const box = await Outbox.open();
    let kept: Awaited<ReturnType<Outbox['keptSheet']>>;
    await until(
      () => kept !== undefined,
      'the kept copy',
      () => void box.keptSheet('2:1:/api/run-sheet?date=2031-05-15').then((k) => (kept = k)),
    );
    expect(kept!.sheet.assignments.map((a) => a.id)).toEqual([7]);
    box.close();
  });

  it('when the sheet opened without a day, then the days after it are kept too and open with no signal', async () => {
    const { fixture, http, el } = setUp(TOMAS_ME);
    fixture.componentRef.setInput('date', undefined);
    fixture.detectChanges();
    http.expectOne('/api/run-sheet').flush(day([job({ id: 7 })]));
    await fixture.whenStable();
    const asked = await answerAhead(http, '2031-05-15');
    fixture.componentRef.setInput('date', asked[1]);
    TestBed.tick();
    // Wait until the last day read is kept, then ask for one of them with no signal.
    const box = await Outbox.open();
    let keptLast = false;
    await until(
      () => keptLast,
      'the last day kept',
      () => void box.keptSheet(`2:1:/api/run-sheet?date=${asked[2]}`).then((k) => (keptLast = !!k)),
    );
    box.close();
    http.expectOne(`/api/run-sheet?date=${asked[1]}`).error(new ProgressEvent('error'), { status: 0, statusText: '' });
    await until(
      () => el.querySelector('[data-as-of]') !== null,
      'the kept day',
      () => fixture.detectChanges(),
    );
    expect(el.querySelector('.load-error')).toBeNull();
    expect(el.querySelector('.who')?.textContent).toContain('Saturday, May 17, 2031');
    http.verify();
  });

  it('when two actions wait with no signal, then the sheet says "Offline — 2 actions waiting" and marks their job as not sent', async () => {
    const tomas = { userId: 2, farmId: 1, name: 'Tomas Reyes' };
    const { fixture, http, el } = await onPhone(async (box) => {
      await box.add(tomas, 7, { type: 'start', engineHours: 4211 }, new Date('2031-05-15T13:00:00Z'));
      await box.add(tomas, 7, { type: 'finish', acres: 150, engineHours: 4218.4 }, new Date('2031-05-15T18:40:00Z'));
    }, false);
    fixture.detectChanges();
    http.expectOne('/api/run-sheet?date=2031-05-15').flush(day([job({ id: 7 }), job({ id: 8 })]));
    await until(
      () => el.querySelector('[data-sync]') !== null,
      'the sync line',
      () => fixture.detectChanges(),
    );
    expect(text(el, '[data-sync] span')).toBe('Offline — 2 actions waiting');
    expect(el.querySelector('[data-job="7"] .job-sub [data-unsent]')?.textContent?.trim()).toBe('not sent yet');
    expect(el.querySelector('[data-job="8"] .job-sub [data-unsent]')).toBeNull();
  });

  it('when the signal returns while a read of the day is on its way, then the day is read again after the outbox is answered and the job shows the server state, not the older answer', async () => {
    const tomas = { userId: 2, farmId: 1, name: 'Tomas Reyes' };
    const { fixture, http, el } = await onPhone(async (box) => {
      await box.add(tomas, 7, { type: 'start', engineHours: 4211 }, new Date('2031-05-15T13:00:00Z'));
    }, false);
    const url = '/api/run-sheet?date=2031-05-15';
    fixture.detectChanges();
    http.expectOne(url).flush(day([job({ id: 7, state: 'planned' })]));
    await until(
      () => text(el, '[data-sync] span') === 'Offline — 1 action waiting',
      'the waiting action',
      () => fixture.detectChanges(),
    );
    // The signal returns: the page reads the day again and the outbox sends, at the same moment.
    setOnline(true);
    window.dispatchEvent(new Event('online'));
    fixture.detectChanges();
    const early = http.expectOne(url);
    let post: TestRequest | undefined;
    await until(() => (post = http.match('/api/run-sheet/outbox')[0]) !== undefined, 'the start sent');
    const [sent] = post!.request.body.events;
    post!.flush({
      results: [
        {
          clientEventId: sent.clientEventId,
          assignmentId: 7,
          status: 201,
          body: { clientEventId: sent.clientEventId, id: 7, state: 'underway', eventId: 90 },
        },
      ],
    });
    await until(
      () => text(el, '[data-sync] span')?.startsWith('All sent') === true,
      'all sent',
      () => fixture.detectChanges(),
    );
    // The read that left before the start was applied is dropped for one made after the answer.
    let late: TestRequest | undefined;
    await until(
      () => (late = http.match(url)[0]) !== undefined,
      'the day read after the answer',
      () => fixture.detectChanges(),
    );
    expect(early.cancelled).toBe(true);
    // The jobs stay on screen while the day is read again.
    fixture.detectChanges();
    expect(el.querySelector('[data-job="7"]')).not.toBeNull();
    late!.flush(day([job({ id: 7, state: 'underway' })]));
    await until(
      () => el.querySelector('[data-job="7"] .state')?.getAttribute('data-state') === 'underway',
      'the server state',
      () => fixture.detectChanges(),
    );
    expect(el.querySelector('[data-job="7"] [data-action="start"]')).toBeNull();
    expect(el.querySelector('[data-job="7"] [data-action="pause"]')).not.toBeNull();
    http.verify();
  });

  it("when another person's actions wait on this phone, then they are not sent and the sheet says whose they are", async () => {
    const { fixture, http, el } = await onPhone(async (box) => {
      await box.add({ userId: 5, farmId: 1, name: 'Milo Sorensen' }, 9, { type: 'start' }, new Date('2031-05-15T13:00:00Z'));
    });
    fixture.detectChanges();
    http.expectOne('/api/run-sheet?date=2031-05-15').flush(day([]));
    await until(
      () => el.querySelector('[data-others]') !== null,
      'the line for the other person',
      () => fixture.detectChanges(),
    );
    expect(text(el, '[data-others] span')).toBe(
      '1 action tapped by Milo Sorensen waits on this device. It is sent only when that person signs in here again.',
    );
    http.expectNone('/api/assignments/9/events');
    http.expectNone('/api/run-sheet/outbox');
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

  /** The person list loads after the page is shown (a deferred block): let it come in. */
  async function renderDeferred(): Promise<void> {
    for (const block of await fixture.getDeferBlocks()) await block.render(DeferBlockState.Complete);
    fixture.detectChanges();
  }

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
    await renderDeferred();
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
    await renderDeferred();
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

describe('RunSheetPage, kept as drawn for a start with no connection', () => {
  const north = job({ id: 4, startTime: '07:00', field: { ...job().field, name: 'North Section' } });
  let appRoot: HTMLElement;

  /** The page inside an <app-root> (what is kept is the app's whole drawing), with the copy the phone showed before the app started. */
  function setUpInApp(date: string | undefined, fresh = true) {
    appRoot = document.createElement('app-root');
    document.body.append(appRoot);
    const copy = document.createElement('div');
    copy.id = KEPT_VIEW_ID;
    document.body.insertBefore(copy, appRoot);
    document.documentElement.classList.add(KEPT_VIEW_OPEN_CLASS);
    const set = setUp(TOMAS_ME, fresh);
    appRoot.append(set.el);
    set.fixture.componentRef.setInput('date', date);
    return set;
  }

  afterEach(() => {
    appRoot.remove();
    closeKeptView();
    localStorage.removeItem(KEPT_VIEW_KEY);
  });

  it('when the own day comes from the server, then the copy gives way once it shows, and the page is kept as drawn after a quiet second', async () => {
    const { fixture, http } = setUpInApp(undefined);
    TestBed.tick();
    expect(document.getElementById(KEPT_VIEW_ID)).not.toBeNull();
    http
      .expectOne('/api/run-sheet')
      .flush({ date: '2031-05-15', today: '2031-05-15', opened: 'today', person: TOMAS, assignments: [north] });
    await fixture.whenStable();
    expect(document.getElementById(KEPT_VIEW_ID)).toBeNull();
    expect(document.documentElement.classList.contains(KEPT_VIEW_OPEN_CLASS)).toBe(false);
    await answerAhead(http, '2031-05-15');
    await until(() => localStorage.getItem(KEPT_VIEW_KEY) !== null, 'the page kept as drawn');
    const kept = JSON.parse(localStorage.getItem(KEPT_VIEW_KEY)!) as KeptView;
    expect(kept).toMatchObject({ v: 1, userId: 2, farmId: 1 });
    expect(kept.html).toContain('1. North Section · Harrowing');
    expect(kept.html).toContain('<h1');
    http.verify();
  });

  it('when another day is asked for in the address, then nothing is kept as drawn (the copy is the day the app opens on)', async () => {
    const { fixture, http } = setUpInApp('2031-05-20');
    TestBed.tick();
    http
      .expectOne('/api/run-sheet?date=2031-05-20')
      .flush({ date: '2031-05-20', today: '2031-05-15', opened: 'asked', person: TOMAS, assignments: [north] });
    await fixture.whenStable();
    expect(document.getElementById(KEPT_VIEW_ID)).toBeNull();
    await new Promise((r) => setTimeout(r, KEEP_VIEW_AFTER_MS + 500));
    expect(localStorage.getItem(KEPT_VIEW_KEY)).toBeNull();
    http.verify();
  });

  it('when the day shown is the one the phone kept (no connection), then the copy gives way to it and nothing is kept as drawn', async () => {
    freshDeviceStorage();
    const box = await Outbox.open();
    await box.keepSheet('2:1:/api/run-sheet', {
      date: '2031-05-15',
      today: '2031-05-15',
      opened: 'today',
      person: TOMAS,
      assignments: [north],
    });
    box.close();
    const { fixture, http, el } = setUpInApp(undefined, false);
    setOnline(false);
    TestBed.tick();
    http.expectOne('/api/run-sheet').error(new ProgressEvent('error'), { status: 0, statusText: '' });
    await until(
      () => el.querySelector('[data-as-of]') !== null,
      'the kept sheet',
      () => fixture.detectChanges(),
    );
    expect(document.getElementById(KEPT_VIEW_ID)).toBeNull();
    await new Promise((r) => setTimeout(r, KEEP_VIEW_AFTER_MS + 500));
    expect(localStorage.getItem(KEPT_VIEW_KEY)).toBeNull();
  });

  it('when the day cannot be read and the phone kept none, then the copy gives way to the error', async () => {
    const { fixture, http, el } = setUpInApp(undefined);
    setOnline(false);
    TestBed.tick();
    http.expectOne('/api/run-sheet').error(new ProgressEvent('error'), { status: 0, statusText: '' });
    await until(
      () => el.querySelector('.load-error') !== null,
      'the error',
      () => fixture.detectChanges(),
    );
    // Once the phone was asked for its copy of the day (it has none): the error is what there is to show.
    await until(
      () => document.getElementById(KEPT_VIEW_ID) === null,
      'the copy to give way',
      () => fixture.detectChanges(),
    );
    expect(document.documentElement.classList.contains(KEPT_VIEW_OPEN_CLASS)).toBe(false);
    expect(el.querySelector('.load-error')).not.toBeNull();
  });
});
