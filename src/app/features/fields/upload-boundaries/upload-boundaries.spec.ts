import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Me } from '@shared/schemas/auth';
import type { ImportPreview } from '@shared/schemas/fields';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { FieldMapStub } from '../../../shared/map/field-map/field-map-stub';
import { UploadBoundaries } from './upload-boundaries';

const OWNER: Me = {
  user: { id: 1, email: 'i@example.test', name: 'Ingrid' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
};
const square = {
  type: 'Polygon',
  coordinates: [
    [
      [-99.9, 47.6],
      [-99.89, 47.6],
      [-99.89, 47.61],
      [-99.9, 47.6],
    ],
  ],
};
const PREVIEW: ImportPreview = {
  format: 'kml',
  attributes: ['name', 'legal'],
  nameAttribute: 'name',
  features: [
    { index: 0, name: 'North forty', acres: 40.1, geometry: square, properties: {}, problems: [], errors: [] },
    {
      index: 1,
      name: 'Bowtie',
      acres: null,
      geometry: square,
      properties: {},
      problems: [{ code: 'self-intersection', message: 'Ring 1 crosses itself near 47.60500° N, 99.89500° W', index: 1 }],
      errors: ['Ring 1 crosses itself near 47.60500° N, 99.89500° W'],
    },
    { index: 2, name: 'Home half', acres: 320.2, geometry: square, properties: {}, problems: [], errors: [] },
  ],
};

describe('UploadBoundaries', () => {
  let fixture: ComponentFixture<UploadBoundaries>;
  let httpTesting: HttpTestingController;
  let page: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [UploadBoundaries],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.overrideComponent(UploadBoundaries, { remove: { imports: [FieldMap] }, add: { imports: [FieldMapStub] } });
    TestBed.inject(AuthStore).signedInAs(OWNER);
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(UploadBoundaries);
    page = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    // The farm's fields, for judging new names at once.
    httpTesting
      .expectOne((r) => r.method === 'GET' && r.url.startsWith('/api/fields'))
      .flush([
        { id: 4, name: 'Home Quarter', acres: 160, hectares: 64.7, crop: null, hazardCount: 0, lastOperation: null, boundary: square },
      ]);
    await fixture.whenStable();

    const input = page.querySelector('#boundary-file') as HTMLInputElement;
    Object.defineProperty(input, 'files', { value: [new File(['<kml/>'], 'fields.kml')] });
    input.dispatchEvent(new Event('change'));
    const req = httpTesting.expectOne((r) => r.url === '/api/fields/import');
    expect(req.request.params.get('dryRun')).toBe('true');
    expect((req.request.body as FormData).get('file')).toBeInstanceOf(File);
    req.flush(PREVIEW);
    await fixture.whenStable();
  });

  afterEach(() => httpTesting.verify());

  const saveButton = () => [...page.querySelectorAll('button')].find((b) => b.textContent?.includes('Save')) as HTMLButtonElement;

  it('when the preview arrives, then the feature with an error is unticked, cannot be ticked and shows its error in red', () => {
    const boxes = [...page.querySelectorAll('tbody input[type="checkbox"]')] as HTMLInputElement[];
    expect(boxes.map((b) => [b.checked, b.disabled])).toEqual([
      [true, false],
      [false, true],
      [true, false],
    ]);
    expect(page.querySelector('tbody tr.bad .errors')?.textContent).toContain('crosses itself');
    expect(saveButton().textContent?.trim()).toBe('Save 2 fields');
  });

  it('when a 6-byte file is chosen, then its size says "6 bytes", not "0 kB"', () => {
    expect(page.querySelector('.chosen')?.textContent?.trim()).toBe('fields.kml · 6 bytes');
  });

  it('when the preview arrives, then the map is given every area found, the unusable one too, so it can fit them all', () => {
    expect([...page.querySelectorAll('.map-stub li')].map((li) => li.textContent?.trim())).toEqual(['North forty', 'Bowtie', 'Home half']);
  });

  it('when a row is renamed to a name the farm already has, then the problem shows on the row at once and Save holds back', async () => {
    const name = page.querySelectorAll('input.name')[2] as HTMLInputElement;
    name.value = 'home quarter';
    name.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(page.querySelectorAll('tbody .errors')[2].textContent).toContain('A field called "home quarter" already exists on this farm');
    saveButton().click();
    await fixture.whenStable();
    httpTesting.expectNone((r) => r.url === '/api/fields/import');
    expect(page.querySelector('ul.form-error')?.textContent).toContain('already exists on this farm');
  });

  it('when the server refuses the save, then its message and every problem show and the choices stay', async () => {
    (page.querySelectorAll('tbody input[type="checkbox"]')[2] as HTMLInputElement).click();
    await fixture.whenStable();
    expect(saveButton().textContent?.trim()).toBe('Save 1 field');
    saveButton().click();
    const req = httpTesting.expectOne((r) => r.url === '/api/fields/import');
    expect(req.request.params.has('dryRun')).toBe(false);
    expect(JSON.parse((req.request.body as FormData).get('selection') as string)).toEqual([{ index: 0, name: 'North forty' }]);
    req.flush(
      {
        error: {
          code: 'import_refused',
          message:
            'Nothing was saved. A field called "North forty" already exists on this farm; rename it or untick it (and 1 more problem)',
          problems: [
            { code: 'name-taken', message: 'A field called "North forty" already exists on this farm; rename it or untick it', index: 0 },
            { code: 'no-such-feature', message: 'There is no feature 9 in the file', index: 8 },
          ],
        },
      },
      { status: 422, statusText: 'Unprocessable Entity' },
    );
    await fixture.whenStable();
    const alert = page.querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('Nothing was saved.');
    expect([...(alert?.querySelectorAll('li') ?? [])].map((li) => li.textContent?.trim())).toHaveLength(2);
    expect(saveButton().textContent?.trim()).toBe('Save 1 field');
    expect((page.querySelectorAll('input.name')[0] as HTMLInputElement).value).toBe('North forty');
  });
});
