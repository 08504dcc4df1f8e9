import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { Me } from '@shared/schemas/auth';
import { NUL_MESSAGE } from '@shared/schemas/common';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import type { HazardFeature } from '../../../shared/map/map-types';
import { HazardForm } from './hazard-form';

const me: Me = {
  user: { id: 1, email: 'owner@example.test', name: 'Demo Owner' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
};

const POINT = { type: 'Point' as const, coordinates: [-97.1, 49.2] };

describe('HazardForm', () => {
  let fixture: ComponentFixture<HazardForm>;
  let http: HttpTestingController;
  let el: HTMLElement;
  let saved: HazardFeature[];
  let scrolled: Element[];

  async function open(hazard: HazardFeature | null = null): Promise<void> {
    TestBed.configureTestingModule({
      imports: [HazardForm],
      providers: [
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs(me);
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(HazardForm);
    fixture.componentRef.setInput('fieldId', 5);
    fixture.componentRef.setInput('hazard', hazard?.properties ?? null);
    fixture.componentRef.setInput('geometry', hazard ? null : POINT);
    fixture.componentRef.setInput('shape', hazard ? '' : 'point');
    saved = [];
    fixture.componentInstance.saved.subscribe((h) => saved.push(h));
    el = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
  }

  beforeEach(() => {
    // jsdom does not lay out or scroll: record which box the form asks to bring into view.
    scrolled = [];
    HTMLElement.prototype.scrollIntoView = function (this: HTMLElement) {
      scrolled.push(this);
    };
  });

  afterEach(() => {
    http.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((o) => (o.innerHTML = ''));
  });

  function field(label: RegExp): HTMLElement {
    const found = [...el.querySelectorAll('mat-form-field')].find((f) => label.test(f.querySelector('mat-label')?.textContent ?? ''));
    if (!found) throw new Error(`no field labelled ${label}`);
    return found as HTMLElement;
  }
  const box = (label: RegExp) => field(label).querySelector('input') as HTMLInputElement;

  function type(label: RegExp, value: string): void {
    const input = box(label);
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

  const saveButton = () => [...el.querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Save hazard') as HTMLButtonElement;
  async function save(): Promise<void> {
    await fixture.whenStable();
    saveButton().click();
    await fixture.whenStable();
  }

  it('when the server refuses the note, then its message shows under Note, named by its label, and Save is off until it changes', async () => {
    await open();
    await choose(/Kind/, 'Rock');
    type(/Clearance/, '20');
    type(/Note/, 'Big one by the slough');
    await save();
    const post = http.expectOne({ method: 'POST', url: '/api/fields/5/hazards' });
    expect(post.request.body).toMatchObject({ kind: 'rock', note: 'Big one by the slough', geometry: POINT });
    expect(post.request.body.clearanceM).toBeCloseTo(6.1, 1);
    // What the server answers for a pasted control character (server/http/validate.ts).
    post.flush(
      { error: { code: 'invalid_input', message: `Check the body: note ${NUL_MESSAGE}`, fields: { note: `This ${NUL_MESSAGE}` } } },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();

    expect(field(/Note/).querySelector('mat-error')?.textContent).toContain(`This ${NUL_MESSAGE}`);
    expect(box(/Note/).getAttribute('aria-invalid')).toBe('true');
    expect(el.querySelector('[role="alert"]')?.textContent).toContain(`Check Note: This ${NUL_MESSAGE}`);
    // No key of the API body reaches the screen.
    expect(el.textContent).not.toMatch(/\bnote \w|clearanceM|Check the body/);
    expect(scrolled).toContain(box(/Note/));
    expect(saveButton().disabled).toBe(true);
    expect(saved).toEqual([]);

    type(/Note/, 'Big one by the slough, west side');
    await fixture.whenStable();
    expect(saveButton().disabled).toBe(false);
  });

  it('when the clearance is left empty, then nothing is sent, Clearance is named and marked, and Save stays off until it is filled', async () => {
    await open();
    await choose(/Kind/, 'Bin or yard site');
    await save();
    http.expectNone('/api/fields/5/hazards');
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Check Clearance.');
    // Material leaves aria-invalid off an empty required box; the field is shown in error.
    expect(field(/Clearance/).classList).toContain('mat-form-field-invalid');
    expect(field(/Clearance/).textContent).toContain('Enter a clearance (0 for none)');
    expect(scrolled).toContain(box(/Clearance/));
    expect(saveButton().disabled).toBe(true);

    type(/Clearance/, '0');
    await fixture.whenStable();
    expect(saveButton().disabled).toBe(false);
    expect(el.querySelector('[role="alert"]')).toBeNull();
    await save();
    http.expectOne({ method: 'POST', url: '/api/fields/5/hazards' }).flush({
      type: 'Feature',
      geometry: POINT,
      properties: { id: 9, fieldId: 5, kind: 'bin', clearanceM: 0, note: null, status: 'confirmed' },
    });
    await fixture.whenStable();
    expect(saved.map((h) => h.properties.id)).toEqual([9]);
  });

  it('when a hazard is edited, then only its kind, clearance and note are sent to its own address', async () => {
    await open({
      type: 'Feature',
      geometry: POINT,
      properties: { id: 4, fieldId: 5, kind: 'power', clearanceM: 15.24, note: null, status: 'confirmed' },
    });
    expect(box(/Clearance/).value).toBe('50');
    type(/Note/, 'Pole leans north');
    await save();
    const patch = http.expectOne({ method: 'PATCH', url: '/api/fields/5/hazards/4' });
    expect(patch.request.body).toEqual({ kind: 'power', clearanceM: 15.24, note: 'Pole leans north' });
    patch.flush({
      type: 'Feature',
      geometry: POINT,
      properties: { id: 4, fieldId: 5, kind: 'power', clearanceM: 15.24, note: 'Pole leans north', status: 'confirmed' },
    });
    await fixture.whenStable();
    expect(saved).toHaveLength(1);
  });
});
