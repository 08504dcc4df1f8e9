import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { By } from '@angular/platform-browser';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter } from '@angular/router';
import type { Me } from '@shared/schemas/auth';
import type { FieldSummary } from '@shared/schemas/fields';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { FieldMapStub } from '../../../shared/map/field-map/field-map-stub';
import { CROP_COLOURS } from '../../../shared/map/crop-colours';
import { FieldsPage } from './fields-page';

const me = (role: Me['role'], units: 'us' | 'metric' = 'us'): Me => ({
  user: { id: 1, email: 'ingrid@example.test', name: 'Ingrid Sorensen' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units, timeZone: 'America/Chicago' },
  membershipId: 1,
  role,
});

const square = {
  type: 'Polygon' as const,
  coordinates: [
    [
      [-99.9, 47.6],
      [-99.89, 47.6],
      [-99.89, 47.61],
      [-99.9, 47.6],
    ],
  ],
};
const FIELDS: FieldSummary[] = [
  { id: 3, name: 'Slough Quarter', acres: 151.26, hectares: 61.21, crop: 'canola', hazardCount: 2, lastOperation: null, boundary: square },
  {
    id: 1,
    name: 'Home Section',
    acres: 638.9,
    hectares: 258.55,
    crop: null,
    hazardCount: 0,
    lastOperation: { operation: 'seeding', date: '2026-05-02' },
    boundary: square,
  },
  { id: 2, name: 'Draw Half', acres: 312.4, hectares: 126.42, crop: 'durum', hazardCount: 1, lastOperation: null, boundary: square },
];
const YEAR = new Date().getFullYear();

describe('FieldsPage', () => {
  let fixture: ComponentFixture<FieldsPage>;
  let httpTesting: HttpTestingController;
  let page: HTMLElement;

  async function open(role: Me['role'], units: 'us' | 'metric' = 'us'): Promise<void> {
    TestBed.configureTestingModule({
      imports: [FieldsPage],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.overrideComponent(FieldsPage, { remove: { imports: [FieldMap] }, add: { imports: [FieldMapStub] } });
    TestBed.inject(AuthStore).signedInAs(me(role, units));
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(FieldsPage);
    page = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    const req = httpTesting.expectOne(`/api/fields?season=${YEAR}`);
    req.flush(FIELDS);
    await fixture.whenStable();
  }

  afterEach(() => httpTesting.verify());

  const rows = () =>
    [...page.querySelectorAll('tr.mat-mdc-row:not(.empty)')].map((tr) =>
      [...tr.querySelectorAll('td')].map((td) => td.textContent?.trim() ?? ''),
    );
  const buttonTexts = () => [...page.querySelectorAll('a, button')].map((b) => b.textContent?.replace(/\s+/g, ' ').trim() ?? '');

  it('when the fields load, then each shows with acres, crop, hazards and last operation, sorted by name', async () => {
    await open('owner');
    expect(page.querySelectorAll('h1')).toHaveLength(1);
    expect(rows()).toEqual([
      ['Draw Half', '312.4 ac', 'Durum', '1', '—'],
      ['Home Section', '638.9 ac', '—', '0', 'seeding · 2026-05-02'],
      ['Slough Quarter', '151.3 ac', 'Canola', '2', '—'],
    ]);
    expect(page.querySelector('h2')?.textContent).toContain('3 fields, 1,102.6 ac');
    const map = fixture.debugElement.query(By.directive(FieldMapStub)).componentInstance as FieldMapStub;
    expect(map.fields().map((f) => f.name)).toEqual(['Slough Quarter', 'Home Section', 'Draw Half']);
  });

  it('when the fields load, then each is given its crop colour and the key lists the crops present with their counts', async () => {
    await open('owner');
    const map = fixture.debugElement.query(By.directive(FieldMapStub)).componentInstance as FieldMapStub;
    // Our own palette (shared/map/crop-colours.ts): each crop its colour, no crop no fill.
    expect(map.fields().map((f) => [f.name, f.colour])).toEqual([
      ['Slough Quarter', CROP_COLOURS.canola],
      ['Home Section', null],
      ['Draw Half', CROP_COLOURS.durum],
    ]);
    const key = page.querySelector('app-colour-legend ul');
    expect(key?.getAttribute('aria-label')).toBe(`Crops ${YEAR}`);
    expect([...(key?.querySelectorAll('li') ?? [])].map((li) => li.textContent?.replace(/\s+/g, ' ').trim())).toEqual([
      'Durum (1)',
      'Canola (1)',
      'Not planned (1)',
    ]);
  });

  it('when the farm is metric, then areas show in hectares', async () => {
    await open('viewer', 'metric');
    expect(rows()[0][1]).toBe('126.4 ha');
    expect(page.textContent).toContain('Hectares');
  });

  it('when a filter is typed, then only matching names or crops stay', async () => {
    await open('owner');
    const box = page.querySelector('input[matinput]') as HTMLInputElement;
    box.value = 'CANO';
    box.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(rows().map((r) => r[0])).toEqual(['Slough Quarter']);
  });

  it('when an operator opens Fields, then only Download GeoJSON shows of the actions', async () => {
    await open('operator');
    const texts = buttonTexts();
    expect(texts.some((t) => t.includes('Download GeoJSON'))).toBe(true);
    for (const owner of ['New field', 'Upload boundaries', "Copy last season's crops", 'Metric'])
      expect(texts.some((t) => t.includes(owner))).toBe(false);
  });

  it('when a row or an outline is clicked, then the field opens', async () => {
    await open('viewer');
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    (page.querySelectorAll('tr.mat-mdc-row')[1] as HTMLElement).click();
    expect(navigate).toHaveBeenCalledWith(['/fields', 1]);
    (fixture.debugElement.query(By.directive(FieldMapStub)).componentInstance as FieldMapStub).fieldSelected.emit(3);
    expect(navigate).toHaveBeenCalledWith(['/fields', 3]);
  });

  it('when the owner copies last season, then it posts the previous year and reloads the list', async () => {
    await open('owner');
    ([...page.querySelectorAll('button')].find((b) => b.textContent?.includes('Copy last season')) as HTMLButtonElement).click();
    const req = httpTesting.expectOne(`/api/crop-plans/${YEAR}/copy`);
    expect(req.request.body).toEqual({ from: YEAR - 1 });
    req.flush({ copied: 2 });
    TestBed.tick();
    httpTesting.expectOne(`/api/fields?season=${YEAR}`).flush(FIELDS);
    await fixture.whenStable();
    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain(`Copied 2 crop plans from ${YEAR - 1}.`);
  });

  it('when the list cannot load, then the server message shows', async () => {
    TestBed.configureTestingModule({
      imports: [FieldsPage],
      providers: [provideRouter([]), provideHttpClient(withInterceptors([errorInterceptor])), provideHttpClientTesting()],
    });
    TestBed.overrideComponent(FieldsPage, { remove: { imports: [FieldMap] }, add: { imports: [FieldMapStub] } });
    TestBed.inject(AuthStore).signedInAs(me('owner'));
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(FieldsPage);
    page = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    httpTesting
      .expectOne(`/api/fields?season=${YEAR}`)
      .flush({ error: { code: 'internal', message: 'The database is resting.' } }, { status: 500, statusText: 'Server Error' });
    await fixture.whenStable();
    expect(page.querySelector('[role="alert"]')?.textContent).toContain('The database is resting.');
  });
});
