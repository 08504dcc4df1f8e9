import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Me, Role } from '@shared/schemas/auth';
import type { Implement, Machine } from '@shared/schemas/fleet';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { FleetPage } from './fleet-page';

const me = (role: Role): Me => ({
  user: { id: 1, email: 'someone@example.test', name: 'Someone' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role,
});

const MACHINES: Machine[] = [
  {
    id: 7,
    name: 'Big four',
    kind: 'tractor-4wd',
    powerHp: 520,
    engineHours: 1160,
    serviceIntervalHours: 250,
    hoursAtLastService: 900,
    serviceDueInHours: -10,
    serviceWarning: 'Service overdue by 10 h',
    notes: null,
  },
];
const IMPLEMENTS: Implement[] = [
  {
    id: 21,
    name: 'Heavy harrow',
    kind: 'harrow',
    widthM: 25.6032,
    transportWidthM: 6.096,
    operations: ['harrowing'],
    machineIds: [7],
    minPowerHp: null,
    notes: null,
  },
  {
    id: 22,
    name: 'Air drill',
    kind: 'air-drill',
    widthM: 18.288,
    transportWidthM: null,
    operations: ['seeding'],
    machineIds: [],
    minPowerHp: 400,
    notes: null,
  },
];

describe('FleetPage', () => {
  let fixture: ComponentFixture<FleetPage>;
  let httpTesting: HttpTestingController;
  let page: HTMLElement;

  async function openAs(role: Role): Promise<void> {
    TestBed.configureTestingModule({
      imports: [FleetPage],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs(me(role));
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(FleetPage);
    page = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    httpTesting.expectOne('/api/fleet/machines').flush(MACHINES);
    httpTesting.expectOne('/api/fleet/implements').flush(IMPLEMENTS);
    await fixture.whenStable();
  }

  afterEach(() => {
    httpTesting.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((el) => (el.innerHTML = ''));
  });

  /** Each button's accessible name: its aria-label, or its text without the icon ligature. */
  const buttons = (root: ParentNode = page) =>
    [...root.querySelectorAll('button')].map(
      (b) => b.getAttribute('aria-label') ?? (b.textContent ?? '').replace(b.querySelector('mat-icon')?.textContent ?? '', '').trim(),
    );
  const implementRow = (name: string) =>
    [...page.querySelectorAll('app-implements-table tr.mat-mdc-row')].find(
      (tr) => tr.querySelector('.name')?.textContent?.trim() === name,
    ) as HTMLElement;

  it('when a viewer opens Fleet, then both lists show and there is no way to add, edit or delete', async () => {
    await openAs('viewer');
    expect(page.querySelectorAll('h1')).toHaveLength(1);
    expect(page.textContent).toContain('Big four');
    expect(page.textContent).toContain('Service overdue by 10 h');
    expect(implementRow('Heavy harrow').textContent).toContain('84.0 ft');
    expect(buttons()).toEqual([]);
    expect(page.querySelectorAll('.mat-column-actions')).toHaveLength(0);
    expect(page.textContent).toContain('Only an owner can change the fleet.');
  });

  it('when the owner opens Fleet, then there are Add buttons and edit and delete on each row', async () => {
    await openAs('owner');
    expect(buttons()).toEqual(
      expect.arrayContaining(['Add machine', 'Add implement', 'Edit Big four', 'Delete Big four', 'Edit Heavy harrow', 'Delete Air drill']),
    );
  });

  it('then implements show widths in feet, operations, what pulls them and the road caution', async () => {
    await openAs('operator');
    const harrow = implementRow('Heavy harrow');
    expect(harrow.querySelector('.mat-column-width')?.textContent?.trim()).toBe('84.0 ft');
    expect(harrow.querySelector('.mat-column-transportWidth')?.textContent?.trim()).toBe('20.0 ft');
    expect(harrow.querySelector('.mat-column-operations')?.textContent?.trim()).toBe('Harrowing');
    expect(harrow.querySelector('.mat-column-pulledBy')?.textContent?.trim()).toBe('Big four');
    expect(harrow.textContent).toContain('Wide on the road');
    expect(implementRow('Air drill').querySelector('.mat-column-pulledBy')?.textContent?.trim()).toBe('Any tractor of 400 hp or more');
    expect(page.querySelector('[role="note"]')?.textContent).toContain('slow-moving-vehicle emblem');
  });

  it('when the owner adds an implement in the dialog, then it is posted and listed', async () => {
    await openAs('owner');
    [...page.querySelectorAll('button')].find((b) => b.textContent?.includes('Add implement'))!.click();
    await fixture.whenStable();
    const dialog = document.querySelector('mat-dialog-container') as HTMLElement;
    expect(dialog.textContent).toContain('Add an implement');
    const input = (label: string) =>
      [...dialog.querySelectorAll('mat-form-field')]
        .find((f) => f.querySelector('mat-label')?.textContent?.includes(label))!
        .querySelector('input')!;
    input('Name').value = 'Light harrow';
    input('Name').dispatchEvent(new Event('input'));
    input('Working width').value = '50';
    input('Working width').dispatchEvent(new Event('input'));
    (dialog.querySelector('.mat-mdc-select-trigger') as HTMLElement).click();
    await fixture.whenStable();
    ([...document.querySelectorAll('mat-option')].find((o) => o.textContent?.trim() === 'Harrow') as HTMLElement).click();
    await fixture.whenStable();
    (dialog.querySelector('button[type="submit"]') as HTMLButtonElement).click();
    await fixture.whenStable();

    const req = httpTesting.expectOne('/api/fleet/implements');
    expect(req.request.body).toMatchObject({ name: 'Light harrow', kind: 'harrow', widthM: 15.24, operations: ['harrowing'] });
    req.flush(
      { ...IMPLEMENTS[0], id: 23, name: 'Light harrow', widthM: 15.24, transportWidthM: null, machineIds: [] },
      { status: 201, statusText: 'Created' },
    );
    // The dialog reports its result after its (disabled) exit animation, a macrotask later.
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
    expect(implementRow('Light harrow').querySelector('.mat-column-width')?.textContent?.trim()).toBe('50.0 ft');
    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain('Light harrow is saved.');
  });
});
