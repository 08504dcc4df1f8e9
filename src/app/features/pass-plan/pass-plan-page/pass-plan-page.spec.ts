import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter } from '@angular/router';
import type { Me } from '@shared/schemas/auth';
import { mphToMps } from '@shared/units';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { FieldMapStub } from '../../../shared/map/field-map/field-map-stub';
import { PLAN_DEBOUNCE_MS, PLAN_WORKER } from '../live-planner';
import type { PlanReply, PlanRequest, PlanWorkerPort } from '../plan-messages';
import { FIELD, planResult, savedPlan } from '../plan-fixtures';
import { PassPlanPage } from './pass-plan-page';

const me = (role: Me['role']): Me => ({
  user: { id: role === 'owner' ? 1 : 2, email: `${role}@example.test`, name: role === 'owner' ? 'Ingrid Sorensen' : 'Tomas Reyes' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role,
});

class FakeWorker implements PlanWorkerPort {
  sent: PlanRequest[] = [];
  onmessage: ((event: MessageEvent<PlanReply>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  postMessage(request: PlanRequest): void {
    this.sent.push(request);
  }
  terminate(): void {
    /* nothing to end */
  }
  reply(reply: PlanReply): void {
    this.onmessage?.({ data: reply } as MessageEvent<PlanReply>);
  }
  last(): PlanRequest {
    const request = this.sent.at(-1);
    if (!request) throw new Error('nothing was sent to the planner');
    return request;
  }
}

const pause = () => new Promise((resolve) => setTimeout(resolve, PLAN_DEBOUNCE_MS + 40));

describe('PassPlanPage', () => {
  let fixture: ComponentFixture<PassPlanPage>;
  let http: HttpTestingController;
  let worker: FakeWorker;
  let page: HTMLElement;

  async function open(role: Me['role'], saved: 'none' | 'saved'): Promise<void> {
    TestBed.inject(AuthStore).signedInAs(me(role));
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(PassPlanPage);
    page = fixture.nativeElement as HTMLElement;
    fixture.componentRef.setInput('field', '7');
    fixture.componentRef.setInput('operation', 'harrowing');
    // Not whenStable: the page stays busy until its requests are answered.
    fixture.detectChanges();
    http.expectOne('/api/fields').flush([{ id: 7, name: 'Home Quarter', acres: 160 }]);
    http.expectOne('/api/fields/7').flush(FIELD);
    http
      .expectOne('/api/fleet/implements')
      .flush({ error: { code: 'not_found', message: 'Not here yet' } }, { status: 404, statusText: 'Not Found' });
    http.expectOne('/api/plans?fieldId=7').flush(saved === 'saved' ? [savedPlan()] : []);
    const plan = http.expectOne('/api/plans/7/harrowing');
    if (saved === 'saved') plan.flush(savedPlan());
    else
      plan.flush(
        { error: { code: 'not_found', message: 'A saved harrowing plan for that field was not found' } },
        { status: 404, statusText: 'Not Found' },
      );
    await fixture.whenStable();
  }

  function type(label: string, value: string): void {
    const field = [...page.querySelectorAll('mat-form-field')].find((f) => f.querySelector('mat-label')?.textContent?.trim() === label);
    const input = field?.querySelector('input');
    if (!input) throw new Error(`no field labelled ${label}`);
    input.value = value;
    input.dispatchEvent(new Event('input'));
  }

  const buttons = () => [...page.querySelectorAll('button')].map((b) => b.textContent?.trim());
  const figure = (key: string) => page.querySelector(`[data-key="${key}"] .value`)?.textContent?.trim();

  beforeEach(() => {
    worker = new FakeWorker();
    TestBed.configureTestingModule({
      imports: [PassPlanPage],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: PLAN_WORKER, useValue: () => worker },
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.overrideComponent(PassPlanPage, { remove: { imports: [FieldMap] }, add: { imports: [FieldMapStub] } });
  });

  afterEach(() => {
    http.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((el) => (el.innerHTML = ''));
  });

  it('when the owner opens a field with no plan and no fleet, then one h1, the cautions, and a prompt for the width', async () => {
    await open('owner', 'none');
    expect(page.querySelectorAll('h1')).toHaveLength(1);
    expect(page.querySelector('[role="alert"]')?.textContent).toContain('Enter the working width in feet.');
    expect(worker.sent).toHaveLength(0);
    expect(page.textContent).toContain('Cautions for harrowing');
    expect(page.textContent).toContain("Furlong's plans are aids: the operator's judgement on the ground comes first.");
    expect(page.textContent).toContain('overhead power lines');
    expect(page.textContent).toContain('Not saved yet.');
  });

  it('when the farm switches units imperial → metric → imperial on a saved plan, then the boxes follow and the planned width and speed stay as stored', async () => {
    await open('owner', 'saved');
    const box = (label: string) =>
      [...page.querySelectorAll('mat-form-field')]
        .find((f) => f.querySelector('mat-label')?.textContent?.trim() === label)
        ?.querySelector('input');
    const auth = TestBed.inject(AuthStore);
    const switchTo = async (units: 'us' | 'metric') => {
      auth.signedInAs({ ...me('owner'), farm: { ...me('owner').farm, units } });
      await fixture.whenStable();
      await pause();
    };
    // The saved plan: 25.6032 m (84 ft, 1 ft = 0.3048 m, 85 FR 62698) at 7 mph, stored in m/s.
    expect(box('Working width (ft)')?.value).toBe('84');
    await switchTo('metric');
    expect(box('Working width (m)')?.value).toBe('25.6');
    expect(worker.last().input).toMatchObject({ widthM: 25.6032, speedMps: mphToMps(7) });
    await switchTo('us');
    expect(box('Working width (ft)')?.value).toBe('84');
    expect(worker.last().input).toMatchObject({ widthM: 25.6032, speedMps: mphToMps(7) });
  });

  it('when the owner types a width, then the worker plans it in metres and the figures show', async () => {
    await open('owner', 'none');
    type('Working width (ft)', '84');
    await fixture.whenStable();
    await pause();
    const request = worker.last();
    // 84 ft × 0.3048 m/ft = 25.6032 m (85 FR 62698).
    expect(request.input.widthM).toBeCloseTo(25.6032, 9);
    expect(request.input).toMatchObject({
      headingDeg: 'auto',
      headlandPasses: 2,
      implementKind: 'harrow',
      coverage: 'gaps-ok',
      fieldName: 'Home Quarter',
    });
    expect(request.input.hazards).toBe(FIELD.hazards);

    worker.reply({ id: request.id, result: planResult() });
    await fixture.whenStable();
    expect(figure('passes')).toBe('31');
    expect(figure('field')).toBe('159.6 ac');
    expect(page.querySelector('[role="alert"]')).toBeNull();
  });

  it('when the planner refuses a setting, then its message replaces the numbers and the map is marked out of date', async () => {
    await open('owner', 'none');
    type('Working width (ft)', '84');
    await fixture.whenStable();
    await pause();
    worker.reply({ id: worker.last().id, result: planResult() });
    await fixture.whenStable();

    type('Headland passes', '40');
    await fixture.whenStable();
    await pause();
    worker.reply({ id: worker.last().id, error: "40 headland passes of 84 ft cover all of field 'Home Quarter'; use fewer" });
    await fixture.whenStable();
    expect(page.querySelector('app-plan-summary [role="alert"]')?.textContent).toContain('40 headland passes of 84 ft cover all');
    expect(figure('passes')).toBeUndefined();
    expect(page.textContent).toContain('Out of date: the map shows the last plan that worked.');
  });

  it('when the owner saves, then the settings go to the API in metres and the download link appears', async () => {
    await open('owner', 'none');
    type('Working width (ft)', '84');
    await fixture.whenStable();
    (page.querySelector('.save-bar button') as HTMLButtonElement).click();

    const req = http.expectOne('/api/plans/7/harrowing');
    expect(req.request.method).toBe('PUT');
    expect(req.request.body).toMatchObject({
      headingDeg: 'auto',
      headlandPasses: 2,
      // The harrow's default, 7 mph (ASABE D497.7 Table 3, from memory), sent in m/s: 7 × 0.447 04.
      speedMps: mphToMps(7),
      efficiency: 0.85,
      turnSeconds: 20,
      coverage: 'gaps-ok',
      implementKind: 'harrow',
      implementId: null,
    });
    expect(req.request.body.widthM).toBeCloseTo(25.6032, 9);
    req.flush(savedPlan({ headingDeg: null }));
    fixture.detectChanges();
    http.expectOne('/api/plans?fieldId=7').flush([savedPlan()]);
    await fixture.whenStable();

    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain('Pass plan saved for Home Quarter, harrowing.');
    expect(page.querySelector('a[download]')?.getAttribute('href')).toBe('/api/plans/7/harrowing/passes.geojson');
    expect(page.querySelector('.save-state')?.textContent?.trim()).toBe('Saved.');
  });

  it('when the server refuses a box, then the message names it by its label, marks it, and no internal name shows', async () => {
    await open('owner', 'none');
    type('Working width (ft)', '84');
    await fixture.whenStable();
    (page.querySelector('.save-bar button') as HTMLButtonElement).click();
    http.expectOne('/api/plans/7/harrowing').flush(
      {
        error: {
          code: 'invalid_input',
          message: 'Check the form: widthM: The working width is at most 100 m (328 ft)',
          fields: { widthM: 'The working width is at most 100 m (328 ft)' },
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(page.querySelector('.save-bar [role="alert"]')?.textContent?.trim()).toBe(
      'Check Working width: The working width is at most 100 m (328 ft)',
    );
    const width = page.querySelector('input[name="width"]') as HTMLInputElement;
    expect(width.value).toBe('84');
    expect(width.getAttribute('aria-invalid')).toBe('true');
    expect(page.textContent).not.toMatch(/widthM|headingDeg/);
    await new Promise((resolve) => setTimeout(resolve, 0));
    expect(document.activeElement).toBe(width);
  });

  it('when a box holds a value the server would refuse, then it is marked as typed and Save is off', async () => {
    await open('owner', 'none');
    type('Working width (ft)', '400');
    await fixture.whenStable();
    const save = page.querySelector('.save-bar button') as HTMLButtonElement;
    expect(save.disabled).toBe(true);
    expect(page.querySelector('.save-bar .blocked')?.textContent?.trim()).toBe(
      'Check Working width: The working width is at most 100 m (328 ft)',
    );
    expect((page.querySelector('input[name="width"]') as HTMLInputElement).getAttribute('aria-invalid')).toBe('true');
    type('Working width (ft)', '84');
    await fixture.whenStable();
    expect(save.disabled).toBe(false);
    expect(page.querySelector('.save-bar .blocked')).toBeNull();
  });

  it('when the owner changed a setting and has not saved, then leaving the page asks first', async () => {
    await open('owner', 'saved');
    expect(fixture.componentInstance.hasUnsavedChanges()).toBe(false);
    type('Headland passes', '3');
    await fixture.whenStable();
    expect(fixture.componentInstance.hasUnsavedChanges()).toBe(true);
    type('Headland passes', '2');
    await fixture.whenStable();
    expect(fixture.componentInstance.hasUnsavedChanges()).toBe(false);
  });

  it('when the owner picks another operation, then the address changes to it', async () => {
    await open('owner', 'none');
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    (page.querySelectorAll('mat-select .mat-mdc-select-trigger')[1] as HTMLElement).click();
    await fixture.whenStable();
    const seeding = [...document.querySelectorAll('mat-option')].find((o) => o.textContent?.trim() === 'Seeding') as HTMLElement;
    seeding.click();
    await fixture.whenStable();
    expect(navigate).toHaveBeenCalledWith([], expect.objectContaining({ queryParams: { field: 7, operation: 'seeding' } }));
  });

  it('when an operator opens a saved plan, then it shows read-only with its figures and no save button', async () => {
    await open('operator', 'saved');
    await pause();
    expect(worker.sent).toHaveLength(0);
    expect(buttons()).not.toContain('Save plan');
    expect(page.querySelectorAll('input[name="width"]')).toHaveLength(0);
    expect(page.querySelector('[aria-label="Plan settings"]')?.textContent).toContain('84.0 ft');
    expect(figure('passes')).toBe('31');
    expect(page.querySelector('a[download]')?.textContent).toContain('Download passes (GeoJSON)');
    expect(page.textContent).toContain("Only the farm's owner changes a pass plan.");
  });

  it('when an operator opens a field with no saved plan, then it says so plainly', async () => {
    await open('operator', 'none');
    expect(page.textContent).toContain('No harrowing plan is saved for Home Quarter yet.');
    expect(buttons()).not.toContain('Save plan');
    expect(page.querySelector('.form-error')).toBeNull();
  });
});
