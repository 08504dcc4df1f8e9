import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { JobCoverage, JobCoverageView } from '@shared/schemas/track-coverage';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { FieldMap } from '../field-map/field-map';
import { FieldMapStub } from '../field-map/field-map-stub';
import { JobCoverageMap } from './job-coverage';

const square = (x: number) => ({
  type: 'MultiPolygon' as const,
  coordinates: [
    [
      [
        [x, 47],
        [x + 0.001, 47],
        [x + 0.001, 47.001],
        [x, 47],
      ],
    ],
  ],
});

const VIEW: JobCoverageView = {
  job: {
    id: 7,
    day: '2026-05-10',
    operation: 'seeding',
    state: 'finished',
    coverageRule: 'full',
    acresDone: 150.5,
    acresTyped: 158,
    acresMeasured: true,
  },
  field: {
    id: 3,
    name: 'Coulee Quarter',
    acres: 160,
    boundary: { type: 'Polygon', coordinates: square(0).coordinates[0] },
    hazards: { type: 'FeatureCollection', features: [] },
  },
  coverage: null,
  passes: null,
};

const COVERAGE: JobCoverage = {
  assignmentId: 7,
  fieldAcres: 160,
  workRegionAcres: 158,
  coveredAcres: 150.5,
  skippedAcres: 6.25,
  sliverAcres: 1.25,
  workedTwiceAcres: 3.5,
  skipCount: 2,
  trackLengthM: 12000,
  widthM: 18.288,
  skips: [
    { acres: 5, centroid: [-99.9, 47.6] },
    { acres: 1.25, centroid: [-99.91, 47.61] },
  ],
  skipGeometry: square(2),
  coveredGeometry: square(0),
  twiceGeometry: square(1),
  sourceName: 'seeding.gpx',
  sourceFormat: 'gpx',
  computedAt: '2026-05-10T18:00:00.000Z',
};

describe('JobCoverageMap', () => {
  let fixture: ComponentFixture<JobCoverageMap>;
  let httpTesting: HttpTestingController;
  let el: HTMLElement;

  async function open(view: JobCoverageView): Promise<void> {
    TestBed.configureTestingModule({
      imports: [JobCoverageMap],
      providers: [
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.overrideComponent(JobCoverageMap, { remove: { imports: [FieldMap] }, add: { imports: [FieldMapStub] } });
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 1, email: 'i@example.test', name: 'I' },
      farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
      membershipId: 1,
      role: 'owner',
    });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(JobCoverageMap);
    fixture.componentRef.setInput('assignmentId', 7);
    fixture.componentRef.setInput('open', true);
    el = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    httpTesting.expectOne('/api/assignments/7/coverage').flush(view);
    await fixture.whenStable();
    fixture.detectChanges();
  }

  afterEach(() => httpTesting.verify());
  const text = (selector: string) => el.querySelector(selector)?.textContent?.replace(/\s+/g, ' ').trim();

  it('when it is not open, then nothing is read until the person asks for it', async () => {
    TestBed.configureTestingModule({
      imports: [JobCoverageMap],
      providers: [provideHttpClient(withInterceptors([errorInterceptor])), provideHttpClientTesting()],
    });
    TestBed.overrideComponent(JobCoverageMap, { remove: { imports: [FieldMap] }, add: { imports: [FieldMapStub] } });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(JobCoverageMap);
    fixture.componentRef.setInput('assignmentId', 7);
    el = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    await fixture.whenStable();
    httpTesting.expectNone('/api/assignments/7/coverage');
    (el.querySelector('button.show') as HTMLButtonElement).click();
    fixture.detectChanges();
    httpTesting.expectOne('/api/assignments/7/coverage').flush(VIEW);
    await fixture.whenStable();
    fixture.detectChanges();
    expect(text('.map-stub')).toBe('Coulee Quarter');
  });

  it('when no track was measured, then the field shows and says so', async () => {
    await open(VIEW);
    expect(text('.map-stub')).toBe('Coulee Quarter');
    expect(el.textContent).toContain('No track measured for this job yet.');
    expect(el.querySelector('.key')).toBeNull();
  });

  it('when a seeding track left skips, then the key, the measured acres and each skip are shown', async () => {
    await open({ ...VIEW, coverage: COVERAGE });
    expect([...el.querySelectorAll('.key li')].map((li) => li.textContent!.replace(/\s+/g, ' ').trim())).toEqual([
      'Covered 150.5 ac',
      'Worked twice 3.5 ac',
      'Skipped 6.3 ac',
    ]);
    expect(text('.summary')).toContain('The job counts the measured 150.5 ac; typed at the finish: 158.0 ac.');
    expect(text('.skips')).toContain('2 skips left unworked, 6.3 ac in all');
    expect(el.querySelectorAll('.skips li')).toHaveLength(2);
  });

  it('when the field has a saved plan, then its passes are drawn under the coverage and named in the key', async () => {
    const passes: JobCoverageView['passes'] = {
      type: 'FeatureCollection',
      features: [
        {
          type: 'Feature',
          properties: { pass: 1 },
          geometry: {
            type: 'LineString',
            coordinates: [
              [0, 47],
              [0, 47.001],
            ],
          },
        },
      ],
    };
    await open({ ...VIEW, coverage: COVERAGE, passes });
    expect(el.querySelector('.key li')!.textContent!.replace(/\s+/g, ' ').trim()).toBe('Planned passes');
  });

  it('when the operation may leave gaps, then skips are not flagged one by one', async () => {
    await open({ ...VIEW, job: { ...VIEW.job, operation: 'harrowing', coverageRule: 'gaps-ok' }, coverage: COVERAGE });
    expect(el.querySelector('.skips')).toBeNull();
  });

  it('when a track file is sent and refused, then the reason shows', async () => {
    await open(VIEW);
    const input = el.querySelector('input[type=file]') as HTMLInputElement;
    const file = new File(['hello'], 'notes.txt', { type: 'text/plain' });
    Object.defineProperty(input, 'files', { value: [file] });
    input.dispatchEvent(new Event('change'));
    const req = httpTesting.expectOne('/api/assignments/7/coverage');
    expect(req.request.method).toBe('POST');
    expect((req.request.body as FormData).get('file')).toBeInstanceOf(File);
    req.flush(
      {
        error: { code: 'bad_track', message: 'Furlong reads tracks from GPX (.gpx) and GeoJSON (.geojson) files; "notes.txt" is neither' },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    fixture.detectChanges();
    expect(text('.error')).toContain('"notes.txt" is neither');
  });

  it('when the phone track is measured, then the answer is drawn and says it came from the phone track; with none recorded, the reason shows', async () => {
    await open(VIEW);
    (el.querySelector('button.phone-track') as HTMLButtonElement).click();
    let req = httpTesting.expectOne('/api/assignments/7/coverage/from-phone-track');
    expect(req.request.method).toBe('POST');
    req.flush(
      { error: { code: 'no_phone_track', message: 'No phone track was recorded for this job' } },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    fixture.detectChanges();
    expect(text('.error')).toContain('No phone track was recorded');

    (el.querySelector('button.phone-track') as HTMLButtonElement).click();
    req = httpTesting.expectOne('/api/assignments/7/coverage/from-phone-track');
    req.flush({ ...COVERAGE, sourceName: 'phone track', sourceFormat: 'phone' }, { status: 201, statusText: 'Created' });
    // The view is read again after a measure.
    await new Promise((r) => setTimeout(r, 0));
    fixture.detectChanges();
    httpTesting.expectOne('/api/assignments/7/coverage').flush(VIEW);
    await fixture.whenStable();
    fixture.detectChanges();
    expect(text('.summary')).toContain('(phone track)');
    expect(text('.summary')).toContain('every point taken while the job was underway counts as working');
  });
});
