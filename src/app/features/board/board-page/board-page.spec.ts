import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Me } from '@shared/schemas/auth';
import type { Board, PublishResult } from '@shared/schemas/board';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { ADA, CREW, IMPLEMENTS, MACHINES, MILO, TOMAS, board, card, cardWeather, dayStrip } from '../testing/board-fixtures';
import { BoardPage } from './board-page';

const OWNER: Me = {
  user: { id: 1, email: 'ingrid@example.test', name: 'Ingrid Sorensen' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
};
const DAY = '2031-05-15';

describe('BoardPage', () => {
  let fixture: ComponentFixture<BoardPage>;
  let http: HttpTestingController;
  let page: HTMLElement;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [BoardPage],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs(OWNER);
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(BoardPage);
    fixture.componentRef.setInput('date', DAY);
    page = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
  });

  afterEach(() => {
    http.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((el) => (el.innerHTML = ''));
  });

  async function load(b: Board): Promise<void> {
    http.expectOne(`/api/board?date=${DAY}`).flush(b);
    http.expectOne('/api/crew').flush(CREW);
    http.expectOne('/api/fleet/machines').flush(MACHINES);
    http.expectOne('/api/fleet/implements').flush(IMPLEMENTS);
    http.expectOne('/api/fields').flush([]);
    await fixture.whenStable();
  }

  const column = (name: string) =>
    [...page.querySelectorAll('section.column')].find((s) => s.querySelector('h2')?.textContent?.trim() === name) as HTMLElement;
  const cardsIn = (name: string) => [...column(name).querySelectorAll('app-assignment-card h3 .field')].map((e) => e.textContent?.trim());
  const button = (text: string, root: ParentNode = page) => {
    const found = [...root.querySelectorAll('button')].find((b) => b.textContent?.replace(/\s+/g, ' ').trim().endsWith(text));
    if (!found) throw new Error(`no button ${text}`);
    return found as HTMLButtonElement;
  };

  const twoCards = () =>
    board([card(1, TOMAS, 1, { planHours: 2.5 }), card(2, TOMAS, 2, { planHours: 3 }), card(3, MILO, 1)], {
      conflicts: [
        {
          code: 'learner_without_mentor',
          severity: 'hard',
          message: 'Milo Sorensen is learning harrowing and has no mentor on Field 3',
          assignmentIds: [3],
        },
      ],
    });

  it('when the board loads, then it has one h1, a column per operator with hours against the limit, and cards with their conflicts', async () => {
    await load(twoCards());
    expect(page.querySelectorAll('h1')).toHaveLength(1);
    expect(cardsIn('Tomas Reyes')).toEqual(['Field 1', 'Field 2']);
    expect(column('Tomas Reyes').querySelector('.hours')?.textContent).toContain('5.5 h planned of 10.0 h');
    expect(column('Milo Sorensen').querySelector('.conflict-hard')?.textContent).toContain('has no mentor on Field 3');
    expect(column('Tomas Reyes').textContent).toContain('Work order not sent');
    expect(column('Ada Lindqvist').textContent).toContain('No jobs, no work order');
  });

  it('when hard conflicts remain, then Publish is disabled and says why', async () => {
    await load(twoCards());
    const publish = button('Publish work orders');
    expect(publish.disabled).toBe(true);
    expect(page.querySelector('#publish-why')?.textContent).toContain('Publishing waits until the hard conflict is fixed');
  });

  it('when the owner moves a card to another operator from the Move menu, then the order endpoint gets both columns and the board shows the answer', async () => {
    await load(board([card(1, TOMAS, 1), card(2, TOMAS, 2), card(4, ADA, 1)]));
    (page.querySelector('[aria-label="Move Field 2 harrowing"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    button('To Ada Lindqvist', document.querySelector('.mat-mdc-menu-panel')!).click();
    await fixture.whenStable();

    const req = http.expectOne(`/api/board/${DAY}/order`);
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({
      version: 4,
      columns: [
        { membershipId: TOMAS.membershipId, assignmentIds: [1] },
        { membershipId: ADA.membershipId, assignmentIds: [4, 2] },
      ],
    });
    expect(cardsIn('Ada Lindqvist')).toEqual(['Field 4', 'Field 2']);
    req.flush(board([card(1, TOMAS, 1), card(4, ADA, 1), card(2, ADA, 2)], { version: 5 }));
    await fixture.whenStable();
    expect(cardsIn('Ada Lindqvist')).toEqual(['Field 4', 'Field 2']);
    expect(cardsIn('Tomas Reyes')).toEqual(['Field 1']);
  });

  it('when a card is dropped on another column, then the drop handler sends the columns body', async () => {
    await load(board([card(1, TOMAS, 1), card(2, TOMAS, 2)]));
    const a = card(1, TOMAS, 1);
    (fixture.componentInstance as unknown as { dropped: (e: unknown) => void }).dropped({
      item: { data: a },
      container: { data: MILO.membershipId },
      previousContainer: { data: TOMAS.membershipId },
      currentIndex: 0,
      previousIndex: 0,
    });
    const req = http.expectOne(`/api/board/${DAY}/order`);
    expect(req.request.body.columns).toEqual([
      { membershipId: TOMAS.membershipId, assignmentIds: [2] },
      { membershipId: MILO.membershipId, assignmentIds: [1] },
    ]);
    req.flush(board([card(2, TOMAS, 1), card(1, MILO, 1)], { version: 5 }));
    await fixture.whenStable();
  });

  it('when someone else saved first (409 stale_board), then nothing is lost: current board shown, changes in words, retry uses the new version', async () => {
    await load(board([card(1, TOMAS, 1), card(2, TOMAS, 2)]));
    (page.querySelector('[aria-label="Move Field 1 harrowing"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    button('Later in the day', document.querySelector('.mat-mdc-menu-panel')!).click();
    await fixture.whenStable();

    const current = board([card(1, TOMAS, 1), card(2, TOMAS, 2), card(5, TOMAS, 3)], { version: 9 });
    http.expectOne(`/api/board/${DAY}/order`).flush(
      {
        error: {
          code: 'stale_board',
          message: 'The board changed since you loaded it.',
          changes: [
            {
              version: 9,
              at: '2031-05-14T19:05:00Z',
              by: 'Ingrid Sorensen',
              summary: 'Added Field 5 harrowing for Tomas Reyes',
              assignmentIds: [5],
            },
          ],
          current,
        },
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();

    const stale = page.querySelector('.stale') as HTMLElement;
    expect(stale.getAttribute('role')).toBe('alert');
    expect(stale.textContent).toContain('Added Field 5 harrowing for Tomas Reyes');
    expect(stale.textContent).toContain('Reorder Field 1 harrowing');
    expect(cardsIn('Tomas Reyes')).toEqual(['Field 1', 'Field 2', 'Field 5']);

    button('Apply my change again', stale).click();
    await fixture.whenStable();
    const retry = http.expectOne(`/api/board/${DAY}/order`);
    expect(retry.request.body).toEqual({ version: 9, columns: [{ membershipId: TOMAS.membershipId, assignmentIds: [2, 1, 5] }] });
    retry.flush(board([card(2, TOMAS, 1), card(1, TOMAS, 2), card(5, TOMAS, 3)], { version: 10 }));
    await fixture.whenStable();
    expect(page.querySelector('.stale')).toBeNull();
    expect(cardsIn('Tomas Reyes')).toEqual(['Field 2', 'Field 1', 'Field 5']);
  });

  it('when a move is refused for another reason, then the old board comes back and the server message shows', async () => {
    await load(board([card(1, TOMAS, 1), card(4, ADA, 1)]));
    (page.querySelector('[aria-label="Move Field 1 harrowing"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    button('To Ada Lindqvist', document.querySelector('.mat-mdc-menu-panel')!).click();
    await fixture.whenStable();
    http
      .expectOne(`/api/board/${DAY}/order`)
      .flush(
        { error: { code: 'job_started', message: 'A job that has started stays with its operator' } },
        { status: 409, statusText: 'Conflict' },
      );
    await fixture.whenStable();
    expect(cardsIn('Tomas Reyes')).toEqual(['Field 1']);
    expect(page.querySelector('.problem')?.textContent).toContain('A job that has started stays with its operator');
  });

  it('when the owner publishes a board without hard conflicts, then it posts the version and says who was sent what', async () => {
    await load(board([card(1, TOMAS, 1), card(4, ADA, 1)]));
    button('Publish work orders').click();
    const req = http.expectOne(`/api/board/${DAY}/publish`);
    expect(req.request.body).toEqual({ version: 4 });
    const result: PublishResult = {
      sent: [{ ...TOMAS, kind: 'order' }],
      unchanged: [ADA],
      board: board([card(1, TOMAS, 1), card(4, ADA, 1)], {
        version: 5,
        publishedAt: '2031-05-14T19:00:00Z',
        orders: [{ ...TOMAS, status: 'queued', sentAt: null, changedSincePublish: false, changes: null, kind: 'order' }],
      }),
    };
    req.flush(result);
    await fixture.whenStable();
    expect(page.querySelector('.notice')?.textContent).toContain(
      'Work orders sent to Tomas Reyes. Not changed, not sent again: Ada Lindqvist.',
    );
    expect(column('Tomas Reyes').textContent).toContain('Work order queued to send');
  });

  it('when soft warnings stand, then Publish first lists them and sends only once the owner says Publish anyway', async () => {
    const warned = board([card(1, TOMAS, 1), card(4, ADA, 1)], {
      conflicts: [
        { code: 'field_finished', severity: 'soft', message: 'Field 1 is already done for harrowing this season', assignmentIds: [1] },
        { code: 'weather_no_go', severity: 'soft', message: 'Field 4 harrowing: No-go, wind 31 mph at 10:00', assignmentIds: [4] },
        { code: 'weather_no_go', severity: 'soft', message: 'Field 4 harrowing: No-go, wind 31 mph at 10:00', assignmentIds: [4] },
      ],
    });
    await load(warned);
    button('Publish work orders').click();
    await fixture.whenStable();
    const dialog = document.querySelector('mat-dialog-container') as HTMLElement;
    expect(dialog.querySelector('h2')?.textContent).toBe('Publish with warnings?');
    expect([...dialog.querySelectorAll('li')].map((li) => li.textContent?.trim())).toEqual([
      'Field 1 is already done for harrowing this season',
      'Field 4 harrowing: No-go, wind 31 mph at 10:00',
    ]);
    http.expectNone(`/api/board/${DAY}/publish`);
    button('Go back', dialog).click();
    await fixture.whenStable();
    http.expectNone(`/api/board/${DAY}/publish`);

    button('Publish work orders').click();
    await fixture.whenStable();
    button('Publish anyway', document.querySelector('mat-dialog-container')!).click();
    await fixture.whenStable();
    expect(http.expectOne(`/api/board/${DAY}/publish`).request.body).toEqual({ version: 4 });
  });

  describe('weather and empty days', () => {
    const REASON = 'wind 18.6 mph at 14:00, above the spraying limit of 10 mph';

    it('when the board carries weather, then the day header shows the strip and each card its own verdict', async () => {
      await load(
        board([card(1, TOMAS, 1, { operation: 'spraying' }), card(2, TOMAS, 2)], {
          weather: {
            cards: [cardWeather(1, { verdict: 'no-go', reason: REASON, reasons: [REASON] }), cardWeather(2)],
            strip: dayStrip(),
            note: null,
          },
        }),
      );
      expect(page.querySelector('app-day-strip table caption')?.textContent).toContain('North Quarter');
      const cards = [...column('Tomas Reyes').querySelectorAll('app-assignment-card')];
      expect(cards[0].querySelector('.weather')?.getAttribute('data-verdict')).toBe('no-go');
      expect(cards[0].querySelector('.reason')?.textContent?.trim()).toBe(REASON);
      expect(cards[1].querySelector('.weather')?.getAttribute('data-verdict')).toBe('go');
    });

    it('when the day is past the forecasts, then the day header says forecasts reach 7 days ahead in place of the strip', async () => {
      await load(
        board([card(1, TOMAS, 1, { operation: 'spraying' })], {
          weather: { cards: [], strip: null, note: 'No forecast yet: forecasts reach 7 days ahead' },
        }),
      );
      expect(page.querySelector('app-day-strip')).toBeNull();
      expect(page.querySelector('.forecast-note')?.textContent?.trim()).toBe('No forecast yet: forecasts reach 7 days ahead');
    });

    it('when there is no forecast, then no strip and no verdicts, and the board shows as before', async () => {
      await load(board([card(1, TOMAS, 1)]));
      expect(page.querySelector('app-day-strip')).toBeNull();
      expect(page.querySelector('.forecast-note')).toBeNull();
      expect(page.querySelector('.weather')).toBeNull();
      expect(cardsIn('Tomas Reyes')).toEqual(['Field 1']);
    });

    it('when the day shown is empty and a later day has work, then a link names that day and goes to it', async () => {
      await load(board([], { nextDayWithWork: '2032-04-20' }));
      const link = page.querySelector('.next-day a') as HTMLAnchorElement;
      expect(link.textContent?.trim()).toBe('Next day with work: Tue, April 20');
      expect(link.getAttribute('href')).toContain('date=2032-04-20');
    });

    it('when the day shown has cards, then no next-day link, even when a later day has work', async () => {
      await load(board([card(1, TOMAS, 1)], { nextDayWithWork: '2032-04-20' }));
      expect(page.querySelector('.next-day')).toBeNull();
    });
  });

  describe('task data', () => {
    const link = () => page.querySelector('a.taskdata') as HTMLAnchorElement | null;

    it("when the day has jobs, then a link downloads the day's TASKDATA.zip for the tractor's display", async () => {
      await load(twoCards());
      const a = link()!;
      expect(a.textContent?.replace(/\s+/g, ' ').trim()).toBe('download Task data (ISO 11783-10)');
      // The route of the public API contract: GET /api/board/:date/taskdata.zip.
      expect(a.getAttribute('href')).toBe(`/api/board/${DAY}/taskdata.zip`);
      expect(a.getAttribute('download')).toBe(`TASKDATA-${DAY}.zip`);
      const hint = page.querySelector(`#${a.getAttribute('aria-describedby')}`);
      expect(hint?.textContent).toContain("for the tractor's display");
    });

    it('when the day has no jobs, then there is no task data to download', async () => {
      await load(board([]));
      expect(link()).toBeNull();
    });
  });
});
