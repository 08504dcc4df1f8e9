import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import type { Board } from '@shared/schemas/board';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { ADA, CREW, IMPLEMENTS, MACHINES, MILO, TOMAS, board, card } from '../testing/board-fixtures';
import { AssignmentForm, type AssignmentFormData, canWork, changesFrom } from './assignment-form';

describe('AssignmentForm', () => {
  let fixture: ComponentFixture<AssignmentForm>;
  let http: HttpTestingController;
  let boards: Board[];
  const close = jest.fn();

  function open(over: Partial<AssignmentFormData> = {}, units: 'us' | 'metric' = 'us'): void {
    boards = [];
    const data: AssignmentFormData = {
      day: '2031-05-15',
      version: 4,
      fields: [{ id: 101, name: 'North Section', acres: 640 }],
      crew: CREW,
      machines: MACHINES,
      implements: IMPLEMENTS,
      boardChanged: (b) => boards.push(b),
      ...over,
    };
    TestBed.configureTestingModule({
      imports: [AssignmentForm],
      providers: [
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
        { provide: MAT_DIALOG_DATA, useValue: data },
        { provide: MatDialogRef, useValue: { close } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 1, email: 'i@example.test', name: 'Ingrid' },
      farm: { id: 1, name: 'F', units, timeZone: 'America/Chicago' },
      membershipId: 1,
      role: 'owner',
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(AssignmentForm);
    fixture.detectChanges();
  }

  afterEach(() => {
    http.verify();
    close.mockReset();
    document.querySelectorAll('.cdk-overlay-container').forEach((e) => (e.innerHTML = ''));
  });

  type Form = AssignmentForm & { form: { patchValue: (v: object) => void } };
  const form = () => (fixture.componentInstance as Form).form;
  const submit = () => (fixture.nativeElement.querySelector('button[type="submit"]') as HTMLButtonElement).click();

  async function options(label: string): Promise<string[]> {
    const field = [...fixture.nativeElement.querySelectorAll('mat-form-field')].find(
      (f: Element) => f.querySelector('mat-label')?.textContent?.trim() === label,
    );
    (field.querySelector('.mat-mdc-select-trigger') as HTMLElement).click();
    await fixture.whenStable();
    const names = [...document.querySelectorAll('mat-option')].map((o) => o.textContent?.trim() ?? '');
    document.querySelectorAll('.cdk-overlay-container').forEach((e) => (e.innerHTML = ''));
    return names;
  }

  it('when an operation is chosen, then only implements that do it are offered, a lone one is chosen, and so is the only machine it fits', async () => {
    open({ operatorId: TOMAS.membershipId });
    form().patchValue({ operation: 'spraying' });
    await fixture.whenStable();
    expect(await options('Implement')).toEqual(['120 ft boom']);
    expect(fixture.componentInstance['form'].getRawValue()).toMatchObject({ implementId: 23, machineId: 3 });
  });

  it('when the operator is learning the operation, then the form asks for a mentor and offers only mentors for it', async () => {
    open({ operatorId: MILO.membershipId });
    form().patchValue({ operation: 'harrowing' });
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('Milo Sorensen is learning harrowing: choose a mentor');
    expect((fixture.nativeElement as HTMLElement).querySelector('.needs-mentor')?.textContent).toContain('choose a mentor');
    expect(await options('Mentor')).toEqual(['No mentor', 'Tomas Reyes']);
    expect(await options('Operator')).toContain('Milo Sorensen (learning)');
  });

  it("when a learner's card is given to a qualified operator, then the mentor is cleared, none is offered and the form says why", async () => {
    open({ assignment: card(3, MILO, 1, { mentor: TOMAS }) });
    await fixture.whenStable();
    expect(fixture.componentInstance['form'].getRawValue().mentorId).toBe(TOMAS.membershipId);
    form().patchValue({ operatorId: TOMAS.membershipId, operation: 'seeding' });
    form().patchValue({ operation: 'harrowing' });
    await fixture.whenStable();
    expect(fixture.componentInstance['form'].getRawValue().mentorId).toBeNull();
    expect(fixture.nativeElement.textContent).toContain('Tomas Reyes is qualified for harrowing: no mentor needed.');
    // Said plainly, not in the error colour kept for a card that needs a mentor.
    expect((fixture.nativeElement as HTMLElement).querySelector('.needs-mentor')).toBeNull();
    expect(await options('Mentor')).toEqual(['No mentor']);
    submit();
    const req = http.expectOne('/api/assignments/3');
    // Only what changed: the operator, and the mentor no longer needed.
    expect(req.request.body).toEqual({ version: 4, operatorId: TOMAS.membershipId, mentorId: null });
    req.flush(board([card(3, TOMAS, 1)], { version: 5 }));
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('mat-error')).toBeNull();
  });

  it('when the mentor was made the operator, then the form refuses it before sending, and moving the card on clears the stale error', async () => {
    open({ assignment: card(3, MILO, 1, { mentor: TOMAS }) });
    await fixture.whenStable();
    // Made the mentor the operator by hand: the shared rule refuses it before sending.
    form().patchValue({ mentorId: TOMAS.membershipId });
    fixture.componentInstance['form'].controls.operatorId.setValue(TOMAS.membershipId, { emitEvent: false });
    submit();
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('The mentor must be someone other than the operator');
    http.expectNone('/api/assignments/3');
    // To Ada, not trained for harrowing: the mentor is still needed and kept. Back to the mentor: dropped, and the error goes.
    form().patchValue({ operatorId: ADA.membershipId });
    await fixture.whenStable();
    expect(fixture.componentInstance['form'].getRawValue().mentorId).toBe(TOMAS.membershipId);
    form().patchValue({ operatorId: TOMAS.membershipId });
    await fixture.whenStable();
    expect(fixture.componentInstance['form'].getRawValue().mentorId).toBeNull();
    expect(fixture.nativeElement.textContent).not.toContain('The mentor must be someone other than the operator');
  });

  it('when the end time is before the start, then Save is off with the box named by its label until either time fixes it', async () => {
    open({ assignment: card(3, MILO, 1) });
    await fixture.whenStable();
    form().patchValue({ startTime: '13:00', endTime: '09:00' });
    await fixture.whenStable();
    submit();
    await fixture.whenStable();
    http.expectNone('/api/assignments/3');
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Check End time.');
    const save = el.querySelector('button[type="submit"]') as HTMLButtonElement;
    expect(save.disabled).toBe(true);
    // Fixed in the other box: the end time's mark goes and Save comes back.
    form().patchValue({ startTime: '08:00' });
    await fixture.whenStable();
    expect(save.disabled).toBe(false);
    expect(el.textContent).not.toContain('Must be after the start time');
  });

  it('when a new card is saved, then it posts the board version and the whole card, and closes with the board', async () => {
    open({ operatorId: MILO.membershipId });
    form().patchValue({
      fieldId: 101,
      operation: 'harrowing',
      mentorId: TOMAS.membershipId,
      startTime: '08:00',
      note: ' South half first ',
    });
    await fixture.whenStable();
    submit();
    const req = http.expectOne('/api/assignments');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({
      version: 4,
      date: '2031-05-15',
      fieldId: 101,
      operation: 'harrowing',
      operatorId: MILO.membershipId,
      machineId: 1,
      implementId: 21,
      mentorId: TOMAS.membershipId,
      startTime: '08:00',
      endTime: null,
      note: 'South half first',
    });
    const saved = board([card(1, MILO, 1)], { version: 5 });
    req.flush(saved);
    await fixture.whenStable();
    expect(close).toHaveBeenCalledWith(saved);
    expect(boards).toEqual([saved]);
  });

  it('when the server refuses the card, then its message shows and the dialog keeps everything typed', async () => {
    open({ operatorId: MILO.membershipId });
    form().patchValue({ fieldId: 101, operation: 'harrowing', machineId: 1, note: 'Keep this' });
    await fixture.whenStable();
    submit();
    http
      .expectOne('/api/assignments')
      .flush(
        { error: { code: 'invalid_input', message: 'That machine is not on this farm', fields: { machineId: 'Not on this farm' } } },
        { status: 422, statusText: 'Unprocessable Entity' },
      );
    await fixture.whenStable();
    expect(close).not.toHaveBeenCalled();
    expect(fixture.nativeElement.textContent).toContain('Not on this farm');
    expect(fixture.componentInstance['form'].getRawValue().note).toBe('Keep this');
  });

  it('when the board went stale under the dialog, then the changes show and Save again uses the new version', async () => {
    open({ operatorId: MILO.membershipId });
    form().patchValue({ fieldId: 101, operation: 'harrowing', machineId: 1 });
    await fixture.whenStable();
    submit();
    const current = board([], { version: 8 });
    http.expectOne('/api/assignments').flush(
      {
        error: {
          code: 'stale_board',
          message: 'The board changed since you loaded it.',
          current,
          changes: [{ version: 8, at: '2031-05-14T18:00:00Z', by: 'Ingrid Sorensen', summary: 'Published', assignmentIds: [] }],
        },
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    expect(boards).toEqual([current]);
    expect(fixture.nativeElement.querySelector('[role="alert"]').textContent).toContain('Ingrid Sorensen: Published');
    submit();
    expect(http.expectOne('/api/assignments').request.body.version).toBe(8);
  });

  it('when the farm is metric, then the area is asked in hectares, sent in acres, and left alone it is not sent', async () => {
    const a = card(3, TOMAS, 1, { acresPlanned: 160 });
    open({ assignment: a }, 'metric');
    expect(fixture.nativeElement.textContent).toContain('Hectares planned');
    expect(fixture.componentInstance['form'].getRawValue().acresPlanned).toBe(64.75);
    form().patchValue({ note: 'Start at the gate' });
    submit();
    let req = http.expectOne('/api/assignments/3');
    expect(req.request.body).toEqual({ version: 4, note: 'Start at the gate' });
    req.flush(board([a], { version: 5 }));
    await fixture.whenStable();

    form().patchValue({ acresPlanned: 50 });
    submit();
    req = http.expectOne('/api/assignments/3');
    expect(req.request.body.acresPlanned).toBeCloseTo(123.55, 2);
    req.flush(board([a], { version: 6 }));
  });

  it('when a started job is edited, then only what changed is sent', () => {
    const a = card(3, TOMAS, 1, { state: 'underway', note: 'old' });
    const body = {
      version: 2,
      date: a.date,
      fieldId: a.field.id,
      operation: a.operation,
      operatorId: TOMAS.membershipId,
      machineId: 1,
      implementId: 21,
      mentorId: null,
      startTime: null,
      endTime: null,
      note: 'new',
      acresPlanned: 160,
    };
    expect(changesFrom(a, body)).toEqual({ note: 'new' });
    expect(changesFrom(a, { ...body, note: 'old' })).toBeNull();
  });

  it('when a tractor is checked against implements, then named machines, self-propelled ones and power decide', () => {
    expect(canWork(MACHINES[0], IMPLEMENTS[0])).toBe(true);
    expect(canWork(MACHINES[1], IMPLEMENTS[0])).toBe(false);
    expect(canWork(MACHINES[2], IMPLEMENTS[0])).toBe(false);
    expect(canWork(MACHINES[2], IMPLEMENTS[2])).toBe(true);
    expect(canWork(MACHINES[1], IMPLEMENTS[1])).toBe(false);
  });
});
