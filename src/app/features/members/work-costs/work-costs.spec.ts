import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { FUEL_DEFAULTS } from '@shared/costs';
import { OPERATIONS } from '@shared/operations';
import type { Me, Role } from '@shared/schemas/auth';
import type { CostSettingsAnswer } from '@shared/schemas/costs';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { WorkCostsForm } from './work-costs';

const me = (role: Role): Me => ({
  user: { id: 1, email: 'owner@example.test', name: 'Demo Owner' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role,
});

const answer = (over: Partial<CostSettingsAnswer> = {}): CostSettingsAnswer => ({
  fuelPriceCents: 385,
  fuel: OPERATIONS.map((operation) => ({
    operation,
    galPerAcre: operation === 'seeding' ? 0.55 : FUEL_DEFAULTS[operation].galPerAcre,
    defaultGalPerAcre: FUEL_DEFAULTS[operation].galPerAcre,
    source: FUEL_DEFAULTS[operation].source,
  })),
  machines: [{ machineId: 7, name: 'Field tractor', hourlyCents: 9550 }],
  people: [{ membershipId: 3, name: 'Hired hand', role: 'operator', hourlyCents: null }],
  ...over,
});

describe('WorkCostsForm', () => {
  let fixture: ComponentFixture<WorkCostsForm>;
  let http: HttpTestingController;
  let el: HTMLElement;

  async function open(role: Role, a = answer()): Promise<void> {
    TestBed.configureTestingModule({
      imports: [WorkCostsForm],
      providers: [
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs(me(role));
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(WorkCostsForm);
    el = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    http.expectOne({ method: 'GET', url: '/api/costs' }).flush(a);
    await fixture.whenStable();
    fixture.detectChanges();
  }

  const input = (name: string) => el.querySelector<HTMLInputElement>(`input[name="${name}"]`)!;
  function typeInto(name: string, value: string): void {
    const i = input(name);
    i.value = value;
    i.dispatchEvent(new Event('input'));
  }
  const button = (text: string, within: ParentNode = el) =>
    [...within.querySelectorAll('button')].find((b) => b.textContent!.trim() === text)! as HTMLButtonElement;

  let scrolled: Element[];
  beforeEach(() => {
    // jsdom does not lay out or scroll: record which box the form asks to bring into view.
    scrolled = [];
    HTMLElement.prototype.scrollIntoView = function (this: HTMLElement) {
      scrolled.push(this);
    };
  });

  afterEach(() => http.verify());

  it('when the owner opens it, then each fuel figure shows its default and where that default comes from', async () => {
    await open('owner');
    const harrow = el.querySelector('tr[data-operation="harrowing"]')!;
    expect(harrow.querySelector('.default')!.textContent!.trim()).toBe('0.3');
    expect(harrow.querySelector('.source')!.textContent).toContain('published');
    expect(harrow.querySelector('.source')!.textContent).toContain('G1208');
    expect(el.querySelector('tr[data-operation="seeding"] .source')!.textContent).toContain('from memory');
    expect(input('fuelPrice').value).toBe('3.85');
    expect(input('machine-7').value).toBe('95.50');
    expect(input('person-3').value).toBe('');
  });

  it('when the owner types a price and a fuel figure and saves, then the server gets whole cents and every operation', async () => {
    await open('owner');
    typeInto('fuelPrice', '3.89');
    typeInto('gal-combining', '1.2');
    button('Save fuel').click();
    const req = http.expectOne({ method: 'PUT', url: '/api/costs/fuel' });
    expect(req.request.body.fuelPriceCents).toBe(389);
    expect(req.request.body.galPerAcre).toEqual({
      ...Object.fromEntries(answer().fuel.map((f) => [f.operation, f.galPerAcre])),
      combining: 1.2,
    });
    req.flush(answer({ fuelPriceCents: 389 }));
    await fixture.whenStable();
    fixture.detectChanges();
    expect(el.querySelector('[role="status"]')!.textContent).toContain('Fuel saved');
  });

  it('when the owner sets a person hourly cost and clears a machine one, then each goes to its own address in cents or null', async () => {
    await open('owner');
    typeInto('person-3', '26.50');
    button('Save', el.querySelector('li[data-person="3"]')!).click();
    const p = http.expectOne({ method: 'PUT', url: '/api/costs/people/3' });
    expect(p.request.body).toEqual({ hourlyCents: 2650 });
    p.flush(answer());
    typeInto('machine-7', '');
    button('Save', el.querySelector('li[data-machine="7"]')!).click();
    const m = http.expectOne({ method: 'PUT', url: '/api/costs/machines/7' });
    expect(m.request.body).toEqual({ hourlyCents: null });
    m.flush(answer());
  });

  it('when the owner types something that is not an amount, then nothing is sent, the box is marked and says how to write it, and Save waits', async () => {
    await open('owner');
    const row = el.querySelector('li[data-machine="7"]')!;
    typeInto('machine-7', 'ninety');
    button('Save', row).click();
    await fixture.whenStable();
    http.expectNone('/api/costs/machines/7');
    expect(row.querySelector('[role="alert"]')!.textContent).toContain('95.50');
    expect(input('machine-7').getAttribute('aria-invalid')).toBe('true');
    expect(scrolled).toContain(input('machine-7'));
    expect(button('Save', row).disabled).toBe(true);
    typeInto('machine-7', '90');
    await fixture.whenStable();
    expect(button('Save', row).disabled).toBe(false);
  });

  it('when an hourly cost is beyond what the server takes, then the box says so before anything is sent', async () => {
    await open('owner');
    typeInto('machine-7', '9000');
    button('Save', el.querySelector('li[data-machine="7"]')!).click();
    await fixture.whenStable();
    http.expectNone('/api/costs/machines/7');
    // The limit is the route's own schema (shared/schemas/costs.ts), checked in the form.
    expect(el.querySelector('li[data-machine="7"] [role="alert"]')!.textContent).toContain('not believable');
  });

  it('when the server refuses a rate, then its reason shows under that row, not another, and Save waits for a change', async () => {
    await open(
      'owner',
      answer({
        machines: [
          { machineId: 7, name: 'Field tractor', hourlyCents: 9550 },
          { machineId: 8, name: 'Sprayer', hourlyCents: null },
        ],
      }),
    );
    const row = el.querySelector('li[data-machine="7"]')!;
    typeInto('machine-7', '120');
    button('Save', row).click();
    http.expectOne({ method: 'PUT', url: '/api/costs/machines/7' }).flush(
      {
        error: {
          code: 'invalid_input',
          message: 'Check the body: hourlyCents: Enter the hourly cost in whole cents',
          fields: { hourlyCents: 'Enter the hourly cost in whole cents' },
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    fixture.detectChanges();
    expect(row.querySelector('[role="alert"]')!.textContent).toContain('Enter the hourly cost in whole cents');
    expect(input('machine-7').getAttribute('aria-invalid')).toBe('true');
    expect(input('machine-8').getAttribute('aria-invalid')).toBeNull();
    expect(el.querySelector('li[data-machine="8"] [role="alert"]')).toBeNull();
    expect(el.textContent).not.toContain('hourlyCents');
    expect(scrolled).toContain(input('machine-7'));
    expect(button('Save', row).disabled).toBe(true);
    expect(input('machine-7').value).toBe('120');
    typeInto('machine-7', '121');
    await fixture.whenStable();
    expect(button('Save', row).disabled).toBe(false);
  });

  it('when the server refuses one fuel figure, then its message shows under that operation, named by its label', async () => {
    await open('owner');
    typeInto('gal-combining', '1.25');
    button('Save fuel').click();
    http.expectOne({ method: 'PUT', url: '/api/costs/fuel' }).flush(
      {
        error: {
          code: 'invalid_input',
          message: 'Check the body: galPerAcre.combining: Give fuel use to at most 3 decimals',
          fields: { 'galPerAcre.combining': 'Give fuel use to at most 3 decimals' },
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    fixture.detectChanges();
    const combining = el.querySelector('tr[data-operation="combining"]')!;
    expect(combining.textContent).toContain('Give fuel use to at most 3 decimals');
    expect(input('gal-combining').getAttribute('aria-invalid')).toBe('true');
    expect(el.querySelector('[role="alert"]')!.textContent).toContain('Check Combining fuel: Give fuel use to at most 3 decimals');
    expect(el.textContent).not.toContain('galPerAcre');
    expect(scrolled).toContain(input('gal-combining'));
    expect(button('Save fuel').disabled).toBe(true);
  });

  it('when a fuel figure is left empty, then nothing is sent, the operation is named and Save fuel stays off until it is filled', async () => {
    await open('owner');
    typeInto('gal-seeding', '');
    button('Save fuel').click();
    await fixture.whenStable();
    http.expectNone('/api/costs/fuel');
    expect(el.querySelector('[role="alert"]')!.textContent).toContain('Check Seeding fuel.');
    expect(el.querySelector('tr[data-operation="seeding"]')!.textContent).toContain('Enter the fuel use as gallons per acre');
    expect(input('gal-seeding').getAttribute('aria-invalid')).toBe('true');
    expect(button('Save fuel').disabled).toBe(true);
    typeInto('gal-seeding', '0.5');
    await fixture.whenStable();
    expect(button('Save fuel').disabled).toBe(false);
  });

  it('when a viewer opens it, then the figures are there to read and nothing can be saved', async () => {
    await open('viewer');
    expect(input('machine-7').readOnly).toBe(true);
    expect(input('fuelPrice').readOnly).toBe(true);
    expect(el.querySelectorAll('button')).toHaveLength(0);
  });
});
