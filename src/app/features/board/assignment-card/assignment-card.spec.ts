import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { BoardAssignment, CardWeather, Conflict } from '@shared/schemas/board';
import { AuthStore } from '../../../core/auth/auth-store';
import { TOMAS, card, cardWeather } from '../testing/board-fixtures';
import { AssignmentCard } from './assignment-card';

describe('AssignmentCard', () => {
  let fixture: ComponentFixture<AssignmentCard>;

  function show(a: BoardAssignment, conflicts: Conflict[] = [], weather: CardWeather | null = null): HTMLElement {
    TestBed.configureTestingModule({
      imports: [AssignmentCard],
      providers: [{ provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }],
    });
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 1, email: 'i@example.test', name: 'Ingrid' },
      farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' },
      membershipId: 1,
      role: 'owner',
    });
    fixture = TestBed.createComponent(AssignmentCard);
    fixture.componentRef.setInput('assignment', a);
    fixture.componentRef.setInput('conflicts', conflicts);
    fixture.componentRef.setInput('weather', weather);
    fixture.detectChanges();
    return fixture.nativeElement as HTMLElement;
  }
  const text = (el: HTMLElement, selector: string) => el.querySelector(selector)?.textContent?.replace(/\s+/g, ' ').trim();

  it('when the job finished 185.5 of 200 ac, then the card gives the acres done and left, not the acres to do', () => {
    const el = show(
      card(1, TOMAS, 1, {
        state: 'finished',
        acresPlanned: 200,
        acresToDo: 200,
        acresLeft: 14.5,
        log: {
          startedAt: '2031-05-15T13:00:00Z',
          finishedAt: '2031-05-15T17:00:00Z',
          acresDone: 185.5,
          acresTyped: 185.5,
          acresMeasured: false,
          hoursWorked: 4,
          engineHoursStart: null,
          engineHoursEnd: null,
          callOffReason: null,
        },
      }),
    );
    expect(text(el, '.done')).toBe('185.5 ac of 200.0 ac');
    expect(text(el, '.left')).toBe('14.5 ac of the field');
    expect(el.querySelector('.to-do')).toBeNull();
    expect(el.textContent).not.toContain('To do');
  });

  it('when the finish counts the acres measured from its track, then the card says so and keeps the typed acres beside them', () => {
    const el = show(
      card(1, TOMAS, 1, {
        state: 'finished',
        acresPlanned: 200,
        acresLeft: 12.7,
        log: {
          startedAt: '2031-05-15T13:00:00Z',
          finishedAt: '2031-05-15T17:00:00Z',
          acresDone: 187.3,
          acresTyped: 195,
          acresMeasured: true,
          hoursWorked: 4,
          engineHoursStart: null,
          engineHoursEnd: null,
          callOffReason: null,
        },
      }),
    );
    expect(text(el, '.done')).toBe('187.3 ac of 200.0 ac · measured from its track, typed 195.0 ac');
  });

  it('when the planned hours do not fit the window, then the card shows the window set, the planned hours and the warning', () => {
    const warning: Conflict = {
      code: 'window_too_short',
      severity: 'soft',
      message: 'Planned 28.5 h does not fit 08:00–12:00 (4.0 h): North Section harrowing',
      assignmentIds: [1],
    };
    const el = show(
      card(1, TOMAS, 1, {
        plannedStart: '08:00',
        plannedEnd: '12:00',
        startTime: '08:00',
        endTime: '36:30',
        planHours: 28.5,
        bookedHours: 28.5,
        fitsWindow: false,
        planSource: 'pass-plan',
      }),
      [warning],
    );
    expect(text(el, '.time')).toBe('08:00–12:00');
    expect(text(el, '.planned')).toBe('28.5 h from pass plan');
    expect(text(el, '.conflict-soft')).toContain('Planned 28.5 h does not fit 08:00–12:00 (4.0 h)');
  });

  it('when the window is longer than the work, then the card says the hours it books, as the column counts them', () => {
    const el = show(
      card(1, TOMAS, 1, {
        plannedStart: '08:00',
        plannedEnd: '18:00',
        startTime: '08:00',
        endTime: '18:00',
        planHours: 1.7,
        bookedHours: 10,
      }),
    );
    expect(text(el, '.time')).toBe('08:00–18:00');
    expect(text(el, '.planned')?.replace(/\u00a0/g, ' ')).toBe('1.7 h estimate · 10.0 h booked');
  });

  it('when the running order carries the job past midnight, then the card writes the end as the next day, never 25:43', () => {
    const el = show(card(1, TOMAS, 1, { startTime: '20:00', endTime: '25:43', planHours: 5.7 }));
    expect(text(el, '.time')).toBe('20:00–01:43 next day in running order');
  });

  describe('weather', () => {
    const REASON = 'wind 18.6 mph at 14:00, above the spraying limit of 10 mph';
    const spraying = () => card(1, TOMAS, 1, { operation: 'spraying', plannedStart: '10:00', plannedEnd: '16:00' });

    it('when the card is no-go over its window, then it says No-go, the hours judged and the first reason in words', () => {
      const el = show(
        spraying(),
        [],
        cardWeather(1, { verdict: 'no-go', reason: REASON, reasons: [REASON], from: '10:00', to: '16:00', over: 'card' }),
      );
      expect(el.querySelector('.weather')?.getAttribute('data-verdict')).toBe('no-go');
      expect(text(el, '.verdict > span')).toBe('Weather: No-go · 10:00–16:00');
      expect(text(el, '.reason')).toBe(REASON);
      expect(el.querySelector('.stale-forecast')).toBeNull();
    });

    it('when the card has no window, then the verdict names the working day; a go verdict has no reason line', () => {
      const el = show(card(1, TOMAS, 1), [], cardWeather(1));
      expect(text(el, '.verdict > span')).toBe('Weather: Go · working day 07:00–19:00');
      expect(el.querySelector('.reason')).toBeNull();
    });

    it('when the server marked the forecast stale, then the card says so with its age and why', () => {
      const why = 'Forecast from 3.0 h ago: the last refresh failed (the forecast service answered 500)';
      const el = show(spraying(), [], cardWeather(1, { verdict: 'caution', reason: 'x', stale: true, staleReason: why, ageMinutes: 180 }));
      expect(text(el, '.stale-forecast > span')).toBe(`Stale: ${why}`);
    });

    it('when a fresh forecast has aged past its stale time since the board was read, then the page marks it stale with the age by its own clock', () => {
      const fetched = new Date(Date.now() - 150 * 60_000);
      const w = cardWeather(1, {
        fetchedAt: fetched.toISOString(),
        ageMinutes: 10,
        staleAfter: new Date(fetched.getTime() + 2 * 3_600_000).toISOString(),
      });
      const el = show(spraying(), [], w);
      expect(text(el, '.stale-forecast > span')).toBe('Stale: Forecast from 2.5 h ago: no newer forecast has arrived');
    });

    it('when the page finds a forecast three hours old, then its age reads as the server and the run sheet write it, one decimal', () => {
      const fetched = new Date(Date.now() - 180 * 60_000);
      const w = cardWeather(1, {
        fetchedAt: fetched.toISOString(),
        ageMinutes: 180,
        staleAfter: new Date(fetched.getTime() + 2 * 3_600_000).toISOString(),
      });
      const el = show(spraying(), [], w);
      expect(text(el, '.stale-forecast > span')).toBe('Stale: Forecast from 3.0 h ago: no newer forecast has arrived');
    });

    it('when there is no forecast, then the card shows no verdict at all', () => {
      const el = show(spraying());
      expect(el.querySelector('.weather')).toBeNull();
    });
  });
});
