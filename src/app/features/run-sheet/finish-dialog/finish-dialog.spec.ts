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
import { OutboxStore } from '../outbox-store';
import { freshDeviceStorage, setOnline, until } from '../testing/device';
import { FinishDialog } from './finish-dialog';

describe('FinishDialog', () => {
  let fixture: ComponentFixture<FinishDialog>;
  let http: HttpTestingController;
  let el: HTMLElement;
  const close = jest.fn();
  const at = '2031-05-15T15:30:00.000Z';

  function open(units: UnitSystem, item = job({ state: 'underway', acresPlanned: 150 }), startReading = 4211): void {
    const data: JobDialogData = { item: { ...item, log: { ...item.log, engineHoursStart: startReading } }, at };
    freshDeviceStorage();
    setOnline(false);
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

  /** The actions waiting in the phone's outbox once the dialog has written its own. */
  async function kept() {
    const store = TestBed.inject(OutboxStore);
    await until(() => store.entries().length > 0, 'the finish in the outbox');
    return store.entries();
  }

  it('when the farm is metric, then it asks hectares and keeps acres', async () => {
    open('metric');
    expect(el.textContent).toContain('Hectares done');
    expect(inputs()[0].value).toBe('60.7');
    submit();
    const [entry] = await kept();
    // 60.7 ha ÷ 0.40468564224 ha/ac (NIST SP 811, acre = 4046.8564224 m²) = 149.99 ac.
    expect(entry.body.type === 'finish' && entry.body.acres).toBeCloseTo(150, 0);
  });

  it('when finished with no signal, then finish, acres, engine hours and the tap time are kept on the phone under a new id, nothing is sent, and it closes', async () => {
    open('us');
    submit();
    const [entry] = await kept();
    expect(entry.jobId).toBe(7);
    expect(entry.body).toEqual({ type: 'finish', acres: 150, engineHours: 4211, at, clientEventId: entry.clientEventId });
    await until(() => close.mock.calls.length > 0, 'the dialog to close');
    http.expectNone('/api/assignments/7/events');
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

  it('when the end reading is a whole number of hours on, then the hint has the one decimal every hour figure has (8.0, not 8)', async () => {
    open('us', job({ state: 'underway' }), 2781);
    inputs()[1].value = '2789';
    inputs()[1].dispatchEvent(new Event('input'));
    await fixture.whenStable();
    // 2789 − 2781 = 8; hours read to a tenth everywhere (shared/figures.ts), the start grouped by thousands.
    expect(el.querySelector('[data-hint="engine-hours"]')?.textContent).toContain('At the start: 2,781.0 h · 8.0 engine hours on this job');
  });
});
