import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { UnitSystem } from '@shared/schemas/auth';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { job } from '../../board/testing/board-fixtures';
import type { JobDialogData } from '../start-dialog/start-dialog';
import { FinishDialog } from './finish-dialog';

describe('FinishDialog', () => {
  let fixture: ComponentFixture<FinishDialog>;
  let http: HttpTestingController;
  let el: HTMLElement;
  const close = jest.fn();
  const at = '2031-05-15T15:30:00.000Z';

  function open(units: UnitSystem, item = job({ state: 'underway', acresPlanned: 150 }), startReading = 4211): void {
    const data: JobDialogData = { item: { ...item, log: { ...item.log, engineHoursStart: startReading } }, at };
    TestBed.configureTestingModule({
      imports: [FinishDialog],
      providers: [
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
        { provide: MAT_DIALOG_DATA, useValue: data },
        { provide: MatDialogRef, useValue: { close } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 2, email: 't@example.test', name: 'Tomas' },
      farm: { id: 1, name: 'F', units, timeZone: 'America/Chicago' },
      membershipId: 1,
      role: 'operator',
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(FinishDialog);
    el = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
  }

  afterEach(() => {
    http.verify();
    close.mockReset();
  });

  const inputs = () => [...el.querySelectorAll('input')] as HTMLInputElement[];
  const submit = () => (el.querySelector('button[type="submit"]') as HTMLButtonElement).click();

  it('when it opens, then acres default to the planned acres and engine hours to the start reading above the machine meter', () => {
    open('us');
    expect(el.textContent).toContain('Acres done');
    expect(inputs().map((i) => i.value)).toEqual(['150', '4211']);
  });

  it('when the farm is metric, then it asks hectares and sends acres', async () => {
    open('metric');
    expect(el.textContent).toContain('Hectares done');
    expect(inputs()[0].value).toBe('60.7');
    submit();
    const req = http.expectOne('/api/assignments/7/events');
    expect(req.request.body.acres).toBeCloseTo(150, 0);
    req.flush(job({ state: 'finished' }));
    await fixture.whenStable();
  });

  it('when finished with the defaults, then it sends finish, acres, engine hours and the tap time, and closes with the job', async () => {
    open('us');
    submit();
    const req = http.expectOne('/api/assignments/7/events');
    expect(req.request.body).toEqual({ type: 'finish', acres: 150, engineHours: 4211, at });
    const done = job({ state: 'finished' });
    req.flush(done);
    await fixture.whenStable();
    expect(close).toHaveBeenCalledWith(done);
  });

  it('when the server refuses engine hours running backwards (422), then its message shows and the dialog stays with the entries', async () => {
    open('us');
    const hours = inputs()[1];
    hours.value = '4100';
    hours.dispatchEvent(new Event('input'));
    submit();
    http.expectOne('/api/assignments/7/events').flush(
      {
        error: {
          code: 'engine_hours_backwards',
          message: 'The meter cannot read 4100 h: that is below the reading at the start of this job (4211 h)',
        },
      },
      { status: 422, statusText: 'Unprocessable Entity' },
    );
    await fixture.whenStable();
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('below the reading at the start of this job');
    expect(close).not.toHaveBeenCalled();
    expect(inputs()[1].value).toBe('4100');
  });

  it('when the acres are emptied, then nothing is sent and it says what to fix', async () => {
    open('us');
    inputs()[0].value = '';
    inputs()[0].dispatchEvent(new Event('input'));
    submit();
    await fixture.whenStable();
    http.expectNone('/api/assignments/7/events');
    expect(el.textContent).toContain('Enter the area done');
  });

  it('when the end reading is typed, then the hint says the engine hours the job ran (end less start)', async () => {
    open('us', job({ state: 'underway' }), 2781);
    inputs()[1].value = '2789.4';
    inputs()[1].dispatchEvent(new Event('input'));
    await fixture.whenStable();
    // 2789.4 − 2781 = 8.4 (the worked example).
    expect(el.querySelector('[data-hint="engine-hours"]')?.textContent).toContain('8.4 engine hours on this job');
  });
});
