import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { By } from '@angular/platform-browser';
import { Router, provideRouter } from '@angular/router';
import { fieldAcres } from '@shared/geo/geodesic-area';
import type { Me } from '@shared/schemas/auth';
import type { Polygon } from 'geojson';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { formatArea } from '../../../shared/units/units';
import { BoundaryEditor } from '../boundary-editor/boundary-editor';
import { BoundaryEditorStub } from '../boundary-editor/boundary-editor-stub';
import { NewField } from './new-field';

const OWNER: Me = {
  user: { id: 1, email: 'i@example.test', name: 'Ingrid Sorensen' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
};
const YEAR = new Date().getFullYear();

// An irregular quarter near 47.6° N with a slough cut out of it.
const outer = [
  [-99.91, 47.6],
  [-99.9035, 47.6],
  [-99.903, 47.6045],
  [-99.9102, 47.6036],
  [-99.91, 47.6],
];
const slough = [
  [-99.907, 47.601],
  [-99.906, 47.601],
  [-99.906, 47.602],
  [-99.907, 47.601],
];
const drawn: Polygon = { type: 'Polygon', coordinates: [outer, slough] };

describe('NewField', () => {
  let fixture: ComponentFixture<NewField>;
  let httpTesting: HttpTestingController;
  let page: HTMLElement;
  let editor: BoundaryEditorStub;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [NewField],
      providers: [provideRouter([]), provideHttpClient(withInterceptors([errorInterceptor])), provideHttpClientTesting()],
    });
    TestBed.overrideComponent(NewField, { remove: { imports: [BoundaryEditor] }, add: { imports: [BoundaryEditorStub] } });
    TestBed.inject(AuthStore).signedInAs(OWNER);
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(NewField);
    page = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    httpTesting.expectOne(`/api/fields?season=${YEAR}`).flush([]);
    await fixture.whenStable();
    editor = fixture.debugElement.query(By.directive(BoundaryEditorStub)).componentInstance as BoundaryEditorStub;
  });

  afterEach(() => httpTesting.verify());

  const area = () => page.querySelector('[data-testid="live-area"]')?.textContent?.trim();
  const type = (value: string) => {
    const input = page.querySelector('input[formcontrolname="name"]') as HTMLInputElement;
    input.value = value;
    input.dispatchEvent(new Event('input'));
  };
  const save = () => ([...page.querySelectorAll('button')].find((b) => b.textContent?.includes('Save field')) as HTMLButtonElement).click();

  it('when a polygon with a hole is drawn, then the live area is the shared ellipsoidal acres, hole taken off', async () => {
    expect(area()).toBe('—');
    editor.changed.emit(drawn);
    await fixture.whenStable();
    const expected = fieldAcres(drawn);
    expect(expected).toBeLessThan(fieldAcres({ type: 'Polygon', coordinates: [outer] }));
    expect(area()).toBe(formatArea(expected, 'us'));
    expect(page.textContent).toContain('1 part, 1 hole');
  });

  it('when the drawing crosses itself, then the problem shows live and no acres', async () => {
    type('Bowtie');
    editor.changed.emit({ type: 'Polygon', coordinates: [[outer[0], outer[2], outer[1], outer[3], outer[0]]] });
    await fixture.whenStable();
    expect(area()).toBe('—');
    expect(page.querySelector('.problem')?.textContent).toContain("field 'Bowtie' crosses itself");
  });

  it('when saved, then name and boundary are posted and the new field opens', async () => {
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    editor.changed.emit(drawn);
    type('  Slough Quarter ');
    save();
    const req = httpTesting.expectOne('/api/fields');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ name: 'Slough Quarter', boundary: drawn });
    req.flush({ id: 42, name: 'Slough Quarter' }, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    expect(navigate).toHaveBeenCalledWith(['/fields', 42], { state: { overlaps: [] } });
  });

  it('when the saved field overlaps another, then the new field opens carrying the overlap and the snack bar says so', async () => {
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    editor.changed.emit(drawn);
    type('Slough Quarter');
    save();
    const overlaps = [{ fieldId: 7, name: 'Home Section', areaM2: 50_000, acres: 12.36 }];
    httpTesting.expectOne('/api/fields').flush({ id: 42, name: 'Slough Quarter', overlaps }, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    expect(navigate).toHaveBeenCalledWith(['/fields', 42], { state: { overlaps } });
    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain('It overlaps other fields');
  });

  it('when the server refuses the boundary, then its message shows and the name and drawing stay', async () => {
    editor.changed.emit(drawn);
    type('Slough Quarter');
    save();
    httpTesting
      .expectOne('/api/fields')
      .flush(
        { error: { code: 'bad_boundary', message: "Ring 1 of field 'Slough Quarter' crosses itself near 47.60100° N, 99.90600° W" } },
        { status: 422, statusText: 'Unprocessable Entity' },
      );
    await fixture.whenStable();
    expect(page.querySelector('[role="alert"]')?.textContent).toContain('crosses itself near 47.60100° N');
    expect((page.querySelector('input[formcontrolname="name"]') as HTMLInputElement).value).toBe('Slough Quarter');
    expect(area()).toBe(formatArea(fieldAcres(drawn), 'us'));
  });

  it('when nothing is drawn, then nothing is posted and the page says to draw', async () => {
    type('Empty');
    save();
    await fixture.whenStable();
    httpTesting.expectNone('/api/fields');
    expect(page.querySelector('[role="alert"]')?.textContent).toContain('Draw the boundary on the map first');
  });
});
