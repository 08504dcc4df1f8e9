import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Me } from '@shared/schemas/auth';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { FieldMapStub } from '../../../shared/map/field-map/field-map-stub';
import type { FieldDetail } from '@shared/schemas/fields';
import { FieldPage } from './field-page';

const me = (role: Me['role']): Me => ({
  user: { id: 1, email: 'a@example.test', name: 'A' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role,
});
const YEAR = new Date().getFullYear();

const FIELD: FieldDetail = {
  id: 7,
  name: 'Draw Half',
  acres: 312.4,
  hectares: 126.42,
  areaM2: 1264200,
  notes: 'Gate on the east side.',
  boundary: {
    type: 'Polygon',
    coordinates: [
      [
        [-99.9, 47.6],
        [-99.89, 47.6],
        [-99.89, 47.61],
        [-99.9, 47.6],
      ],
    ],
  },
  hazards: {
    type: 'FeatureCollection',
    features: [
      {
        type: 'Feature',
        geometry: {
          type: 'LineString',
          coordinates: [
            [-99.9, 47.605],
            [-99.89, 47.605],
          ],
        },
        properties: { id: 31, fieldId: 7, kind: 'power', clearanceM: 30.48, note: 'Sags in summer', status: 'confirmed' },
      },
    ],
  },
  crop: 'durum',
  crops: [{ season: YEAR, crop: 'durum', varietyNote: null }],
  updatedAt: '2026-04-01T12:00:00Z',
};

describe('FieldPage', () => {
  let fixture: ComponentFixture<FieldPage>;
  let httpTesting: HttpTestingController;
  let page: HTMLElement;

  async function open(role: Me['role']): Promise<void> {
    TestBed.configureTestingModule({
      imports: [FieldPage],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.overrideComponent(FieldPage, { remove: { imports: [FieldMap] }, add: { imports: [FieldMapStub] } });
    TestBed.inject(AuthStore).signedInAs(me(role));
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(FieldPage);
    fixture.componentRef.setInput('id', '7');
    page = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    httpTesting.expectOne(`/api/fields/7?season=${YEAR}`).flush(FIELD);
    await fixture.whenStable();
  }

  afterEach(() => httpTesting.verify());

  const buttons = () =>
    [...page.querySelectorAll('button')].map((b) => b.textContent?.replace(/\s+/g, ' ').trim() ?? b.getAttribute('aria-label'));

  it('when a viewer opens a field, then it reads everything with no edit controls at all', async () => {
    await open('viewer');
    expect(page.querySelectorAll('h1')).toHaveLength(1);
    expect(page.querySelector('h1')?.textContent).toBe('Draw Half');
    expect(page.textContent).toContain('312.4 ac');
    expect(page.textContent).toContain('Power pole or line');
    expect(page.textContent).toContain('Clearance 100 ft');
    expect(page.textContent).toContain('Gate on the east side.');
    expect(page.textContent).toMatch(/Look up for power lines/);
    expect(page.querySelectorAll('input, textarea, mat-select, form')).toHaveLength(0);
    expect(buttons()).toEqual([]);
  });

  it('when the owner opens a field, then the edit controls are there', async () => {
    await open('owner');
    const labels = [...page.querySelectorAll('button')].map((b) =>
      (b.getAttribute('aria-label') ?? b.textContent ?? '').replace(/\s+/g, ' ').trim(),
    );
    for (const expected of [
      'editEdit boundary',
      'Save crop',
      'Save name and notes',
      'deleteDelete field',
      'Edit Power pole or line',
      'Remove Power pole or line',
    ])
      expect(labels).toContain(expected);
  });

  it('when the owner saves the name and the server says it is taken, then its message shows and the typing stays', async () => {
    await open('owner');
    const name = page.querySelector('input[formcontrolname="name"]') as HTMLInputElement;
    name.value = 'Home Section';
    name.dispatchEvent(new Event('input'));
    ([...page.querySelectorAll('button')].find((b) => b.textContent?.includes('Save name and notes')) as HTMLButtonElement).click();
    const req = httpTesting.expectOne('/api/fields/7');
    expect(req.request.method).toBe('PATCH');
    expect(req.request.body).toEqual({ name: 'Home Section', notes: 'Gate on the east side.' });
    req.flush(
      {
        error: {
          code: 'name_taken',
          message: 'There is already a field called "Home Section" on this farm; choose another name',
          fields: { name: 'Name already used' },
        },
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    // The refusal names the box by its label and marks it; Save stays off until the name changes.
    expect(page.querySelector('[role="alert"]')?.textContent).toContain('Check Field name: Name already used');
    expect(name.getAttribute('aria-invalid')).toBe('true');
    const save = [...page.querySelectorAll('button')].find((b) => b.textContent?.includes('Save name and notes')) as HTMLButtonElement;
    expect(save.disabled).toBe(true);
    expect(name.value).toBe('Home Section');
  });

  it('when the owner edits a hazard from the list, then its form opens beside the map, not below the page', async () => {
    await open('owner');
    (
      [...page.querySelectorAll('button')].find((b) => b.getAttribute('aria-label') === 'Edit Power pole or line') as HTMLButtonElement
    ).click();
    await fixture.whenStable();
    const form = page.querySelector('app-hazard-form');
    expect(form).not.toBeNull();
    expect(form!.closest('section.map-section')).not.toBeNull();
    expect(page.querySelector('section.map-section')?.classList).toContain('with-form');
    expect(page.querySelector('section.hazards app-hazard-form')).toBeNull();
  });
});
