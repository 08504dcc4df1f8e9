import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { provideRouter } from '@angular/router';
import type { Me, UnitSystem } from '@shared/schemas/auth';
import type { Implement, Machine } from '@shared/schemas/fleet';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { ImplementForm, type ImplementFormData } from './implement-form';

const me = (units: UnitSystem): Me => ({
  user: { id: 1, email: 'ingrid@example.test', name: 'Ingrid Sorensen' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units, timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
});

const TRACTOR: Machine = {
  id: 7,
  name: 'Big four',
  kind: 'tractor-4wd',
  powerHp: 520,
  engineHours: 1000,
  serviceIntervalHours: 250,
  hoursAtLastService: 900,
  serviceDueInHours: 150,
  serviceWarning: null,
  notes: null,
};

const HARROW: Implement = {
  id: 21,
  name: 'Heavy harrow',
  kind: 'harrow',
  widthM: 25.6032,
  transportWidthM: 6.096,
  operations: ['harrowing'],
  machineIds: [7],
  minPowerHp: null,
  notes: null,
};

describe('ImplementForm', () => {
  let fixture: ComponentFixture<ImplementForm>;
  let httpTesting: HttpTestingController;
  let el: HTMLElement;
  let close: jest.Mock;

  async function open(units: UnitSystem, implement: Implement | null = null): Promise<void> {
    close = jest.fn();
    const data: ImplementFormData = { implement, machines: [TRACTOR] };
    TestBed.configureTestingModule({
      imports: [ImplementForm],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
        { provide: MAT_DIALOG_DATA, useValue: data },
        { provide: MatDialogRef, useValue: { close } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs(me(units));
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ImplementForm);
    el = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
  }

  afterEach(() => {
    httpTesting.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((o) => (o.innerHTML = ''));
  });

  function field(label: RegExp): HTMLElement {
    const found = [...el.querySelectorAll('mat-form-field')].find((f) => label.test(f.querySelector('mat-label')?.textContent ?? ''));
    if (!found) throw new Error(`no field labelled ${label}`);
    return found as HTMLElement;
  }

  function type(label: RegExp, value: string): void {
    const input = field(label).querySelector('input, textarea') as HTMLInputElement;
    input.value = value;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
  }

  async function choose(label: RegExp, option: string): Promise<void> {
    (field(label).querySelector('.mat-mdc-select-trigger') as HTMLElement).click();
    await fixture.whenStable();
    const found = [...document.querySelectorAll('mat-option')].find((o) => o.textContent?.trim() === option);
    if (!found) throw new Error(`no option ${option}`);
    (found as HTMLElement).click();
    await fixture.whenStable();
  }

  const checkboxes = () => [...el.querySelectorAll('mat-checkbox')].map((c) => c.textContent?.trim());

  async function save(): Promise<void> {
    // What was typed is rendered first, as in a browser: the button may have come back on.
    await fixture.whenStable();
    (el.querySelector('button[type="submit"]') as HTMLButtonElement).click();
    await fixture.whenStable();
  }

  it('when the owner of a US farm types 84 ft, then 25.6032 m is posted and the dialog closes with the saved implement', async () => {
    await open('us');
    expect(field(/Working width/).textContent).toContain('(ft)');
    type(/Name/, 'Heavy harrow');
    await choose(/Kind/, 'Harrow');
    type(/Working width/, '84');
    type(/Transport width/, '20');
    await fixture.whenStable();
    expect(checkboxes()).toEqual(['Harrowing']);
    await save();

    const req = httpTesting.expectOne('/api/fleet/implements');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({
      name: 'Heavy harrow',
      kind: 'harrow',
      widthM: 25.6032,
      transportWidthM: 6.096,
      operations: ['harrowing'],
      machineIds: [],
      minPowerHp: null,
      notes: null,
    });
    req.flush({ ...HARROW, machineIds: [] }, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    expect(close).toHaveBeenCalledWith({ ...HARROW, machineIds: [] });
  });

  it('when an implement of 25.6032 m is edited on a US farm, then it shows 84 ft and an untouched width is sent back exactly', async () => {
    await open('us', HARROW);
    expect((field(/Working width/).querySelector('input') as HTMLInputElement).value).toBe('84');
    expect((field(/Transport width/).querySelector('input') as HTMLInputElement).value).toBe('20');
    type(/Name/, 'Heavy harrow 2');
    await save();
    const req = httpTesting.expectOne('/api/fleet/implements/21');
    expect(req.request.method).toBe('PATCH');
    expect(req.request.body).toMatchObject({ name: 'Heavy harrow 2', widthM: 25.6032, transportWidthM: 6.096, machineIds: [7] });
    req.flush({ ...HARROW, name: 'Heavy harrow 2' });
  });

  it('when the farm is metric, then the width is typed in metres and 25.6 m posts as 25.6', async () => {
    await open('metric', HARROW);
    expect((field(/Working width/).querySelector('input') as HTMLInputElement).value).toBe('25.603');
    expect(field(/Working width/).textContent).toContain('(m)');
    type(/Working width/, '25.6');
    await save();
    const req = httpTesting.expectOne('/api/fleet/implements/21');
    expect(req.request.body).toMatchObject({ widthM: 25.6 });
    req.flush({ ...HARROW, widthM: 25.6 });
  });

  it('when the width is negative, then the form says so, keeps what was typed and posts nothing', async () => {
    await open('us');
    type(/Name/, 'Backwards drill');
    await choose(/Kind/, 'Air drill');
    type(/Working width/, '-60');
    await save();
    httpTesting.expectNone('/api/fleet/implements');
    expect(field(/Working width/).textContent).toContain('Working width must be more than 0');
    expect((field(/Name/).querySelector('input') as HTMLInputElement).value).toBe('Backwards drill');
    expect(close).not.toHaveBeenCalled();
    // The message above names the box by its label, and Save is off until the width is fixed.
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Check Working width.');
    const button = el.querySelector('button[type="submit"]') as HTMLButtonElement;
    expect(button.disabled).toBe(true);
    type(/Working width/, '60');
    await fixture.whenStable();
    expect(button.disabled).toBe(false);
    expect(el.querySelector('[role="alert"]')).toBeNull();
  });

  it('when the server refuses a field, then its message shows on that field and the dialog stays open', async () => {
    await open('us');
    type(/Name/, 'Heavy harrow');
    await choose(/Kind/, 'Harrow');
    type(/Working width/, '84');
    await save();
    httpTesting.expectOne('/api/fleet/implements').flush(
      {
        error: {
          code: 'name_taken',
          message: 'There is already an implement called "Heavy harrow"; choose another name',
          fields: { name: 'Name already used' },
        },
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    expect(field(/Name/).textContent).toContain('Name already used');
    // The refusal names the box by its label, and Save stays off until the name is changed.
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Check Name: Name already used');
    expect((el.querySelector('button[type="submit"]') as HTMLButtonElement).disabled).toBe(true);
    expect(close).not.toHaveBeenCalled();

    // A message that fits no field shows above the form.
    type(/Name/, 'Heavy harrow B');
    await save();
    httpTesting
      .expectOne('/api/fleet/implements')
      .flush(
        { error: { code: 'forbidden', message: 'Your role on this farm does not allow that' } },
        { status: 403, statusText: 'Forbidden' },
      );
    await fixture.whenStable();
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Your role on this farm does not allow that');
  });

  it('when the kind changes, then only its operations are offered and others are dropped', async () => {
    await open('us');
    expect(checkboxes()).toEqual([]);
    await choose(/Kind/, 'Disk');
    expect(checkboxes()).toEqual(['Disking / tillage']);
    await choose(/Kind/, 'Sprayer boom');
    expect(checkboxes()).toEqual(['Spraying']);
    expect(el.querySelector('mat-checkbox input')).toHaveProperty('checked', true);
  });

  it('when the transport width is above 8.5 ft and it folds, then the road and power-line cautions show', async () => {
    await open('us');
    expect(el.querySelector('[role="note"]')).toBeNull();
    type(/Working width/, '60');
    type(/Transport width/, '8');
    await fixture.whenStable();
    expect(el.querySelector('[role="note"]')?.textContent).toContain('power lines');
    expect(el.querySelector('[role="note"]')?.textContent).not.toContain('slow-moving-vehicle');
    type(/Transport width/, '15');
    await fixture.whenStable();
    expect(el.querySelector('[role="note"]')?.textContent).toContain('slow-moving-vehicle emblem');
  });
});
