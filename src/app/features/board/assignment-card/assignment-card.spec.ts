import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { BoardAssignment, Conflict } from '@shared/schemas/board';
import { AuthStore } from '../../../core/auth/auth-store';
import { TOMAS, card } from '../testing/board-fixtures';
import { AssignmentCard } from './assignment-card';

describe('AssignmentCard', () => {
  let fixture: ComponentFixture<AssignmentCard>;

  function show(a: BoardAssignment, conflicts: Conflict[] = []): HTMLElement {
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

  it('when the planned hours do not fit the window, then the card shows the window set, the planned hours and the warning', () => {
    const warning: Conflict = {
      code: 'window_too_short',
      severity: 'soft',
      message: 'Planned 28.5 h does not fit 08:00–12:00 (4 h): North Section harrowing',
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
    expect(text(el, '.conflict-soft')).toContain('Planned 28.5 h does not fit 08:00–12:00 (4 h)');
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
    expect(text(el, '.planned')?.replace(/\u00a0/g, ' ')).toBe('1.7 h estimate · 10 h booked');
  });
});
