import 'jest-canvas-mock';
import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import { OPERATIONS } from '@shared/operations';
import type { Me } from '@shared/schemas/auth';
import type { SeasonIndex, SeasonSummary } from '@shared/schemas/season';
import { provideCharts, withDefaultRegisterables } from 'ng2-charts';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { SeasonPage } from './season-page';
import { ZERO_OPERATION } from '../testing/season-fixtures';

// jsdom has no ResizeObserver; chart.js watches its canvas with one.
globalThis.ResizeObserver ??= class {
  observe(): void {}
  unobserve(): void {}
  disconnect(): void {}
};

const me = (units: 'us' | 'metric'): Me => ({
  user: { id: 5, email: 'walt@example.test', name: 'Walt Sorensen' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units, timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'viewer',
});

const INDEX: SeasonIndex = {
  current: 2026,
  latestWorked: 2026,
  seasons: [
    { year: 2026, acresFinished: 300, jobs: 3 },
    { year: 2025, acresFinished: 120, jobs: 1 },
  ],
};

function season(
  year: number,
  harrowAcres: number,
  harrowHours: number,
  rainedOff: Array<{ day: string; operation: 'harrowing' | 'spraying' }> = [],
): SeasonSummary {
  const lost = (op?: string) => {
    const jobs = rainedOff.filter((j) => !op || j.operation === op);
    return { weatherDaysLost: new Set(jobs.map((j) => j.day)).size, jobsCalledOffForWeather: jobs.length };
  };
  return {
    year,
    operations: OPERATIONS.map((operation) => ({
      ...ZERO_OPERATION,
      operation,
      acresPlanned: operation === 'harrowing' ? 400 : 0,
      acresCovered: operation === 'harrowing' ? harrowAcres : 0,
      acresFinished: operation === 'harrowing' ? harrowAcres : 0,
      hoursLogged: operation === 'harrowing' ? harrowHours : 0,
      acresPerHour: operation === 'harrowing' ? harrowAcres / harrowHours : null,
      progress: operation === 'harrowing' ? harrowAcres / 400 : 0,
      jobsFinished: operation === 'harrowing' ? 2 : 0,
      jobsCalledOff: lost(operation).jobsCalledOffForWeather,
      ...lost(operation),
    })),
    weekly: [
      { operation: 'harrowing', week: `${year}-04-20`, acresFinished: harrowAcres / 2, cumulativeAcres: harrowAcres / 2 },
      { operation: 'harrowing', week: `${year}-04-27`, acresFinished: harrowAcres / 2, cumulativeAcres: harrowAcres },
    ],
    byField: [
      {
        fieldId: 1,
        field: 'North Quarter',
        crop: 'durum',
        acres: 400,
        operations: { harrowing: { acres: harrowAcres, hours: harrowHours, costCents: 0, dateFinished: null, jobs: 2, measured: null } },
        totalAcres: harrowAcres,
        totalHours: harrowHours,
        costCents: 0,
        costPerAcreCents: null,
      },
    ],
    byPerson: [
      {
        membershipId: 2,
        name: 'Tomas Reyes',
        operations: { harrowing: { acres: harrowAcres, hours: harrowHours } },
        totalAcres: harrowAcres,
        totalHours: harrowHours,
        acresPerHour: harrowAcres / harrowHours,
      },
    ],
    byMachine: [],
    totals: {
      acresFinished: harrowAcres,
      hoursLogged: harrowHours,
      engineHours: 0,
      acresPerHour: harrowAcres / harrowHours,
      jobsFinished: 2,
      jobsCalledOff: rainedOff.length,
      ...lost(),
      fieldsWorked: 1,
      costCents: 0,
      costPerAcreCents: null,
      jobsUnpriced: 0,
    },
  };
}

describe('SeasonPage', () => {
  let fixture: ComponentFixture<SeasonPage>;
  let http: HttpTestingController;
  let page: HTMLElement;

  async function open(units: 'us' | 'metric', query: { year?: string; compare?: string } = {}): Promise<void> {
    TestBed.configureTestingModule({
      imports: [SeasonPage],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        provideCharts(withDefaultRegisterables()),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs(me(units));
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SeasonPage);
    if (query.year) fixture.componentRef.setInput('year', query.year);
    if (query.compare) fixture.componentRef.setInput('compare', query.compare);
    page = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    http.expectOne('/api/season').flush(INDEX);
    // Not whenStable: the summary request it starts keeps the app busy until a test answers it.
    await new Promise((resolve) => setTimeout(resolve));
    TestBed.tick();
  }

  afterEach(() => http.verify());

  const text = () => page.textContent?.replace(/\s+/g, ' ') ?? '';

  it('when the season opens, then it shows the newest worked season with a chart, tables with totals and CSV links', async () => {
    await open('us');
    http.expectOne('/api/season/2026/summary').flush(season(2026, 300, 10));
    await fixture.whenStable();
    expect(page.querySelector('h1')?.textContent).toContain('2026');
    expect(page.querySelectorAll('app-week-chart canvas')).toHaveLength(1);
    expect(page.querySelector('mat-progress-bar[mode="determinate"]')?.getAttribute('aria-valuenow')).toBe(
      String(Math.round((300 / 400) * 100)),
    );
    expect(text()).toContain('75 % of 400.0 ac planned covered');
    const links = [...page.querySelectorAll<HTMLAnchorElement>('a[download]')].map((a) => a.getAttribute('href'));
    expect(links).toEqual(['weekly', 'operations', 'fields', 'people', 'machines'].map((t) => `/api/season/2026/export/${t}.csv`));
    const footer = page.querySelector('[aria-label="Work per field"] tr.totals')!;
    expect(footer.textContent).toContain('1 fields');
  });

  it('when jobs were called off for weather, then a table shows the days lost per operation, on screen and on paper', async () => {
    await open('us', { year: '2026' });
    const rainedOff = [
      { day: '2026-06-10', operation: 'spraying' as const },
      { day: '2026-06-10', operation: 'spraying' as const },
      { day: '2026-06-11', operation: 'spraying' as const },
      { day: '2026-06-10', operation: 'harrowing' as const },
    ];
    http.expectOne('/api/season/2026/summary').flush(season(2026, 300, 10, rainedOff));
    await fixture.whenStable();
    const section = page.querySelector('section[aria-labelledby="weather-heading"]')!;
    expect(section.querySelector('h2')?.textContent).toContain('Days lost to weather');
    // Printed with the report: not hidden from paper, and sharing the page before it.
    expect(section.closest('.no-print')).toBeNull();
    expect(section.classList).toContain('follows');
    const cells = (sel: string) =>
      [...section.querySelectorAll(sel)].map((r) => [...r.querySelectorAll('td')].map((td) => td.textContent?.trim()));
    // Worked by hand: spraying 10 and 11 June (3 jobs), harrowing 10 June; the farm lost 2 days.
    expect(cells('tr.mat-mdc-row')).toEqual([
      ['Harrowing', '1', '1'],
      ['Spraying', '2', '3'],
    ]);
    expect(cells('tr.totals')).toEqual([['Whole farm', '2', '4']]);
  });

  it('when nothing was called off for weather, then the weather table says so', async () => {
    await open('us', { year: '2026' });
    http.expectOne('/api/season/2026/summary').flush(season(2026, 300, 10));
    await fixture.whenStable();
    const section = page.querySelector('section[aria-labelledby="weather-heading"]')!;
    expect(section.textContent).toContain('No job was called off for weather this season.');
  });

  it('when the farm is metric, then areas show in hectares', async () => {
    await open('metric', { year: '2026' });
    http.expectOne('/api/season/2026/summary').flush(season(2026, 300, 10));
    await fixture.whenStable();
    expect(text()).toContain(`${(300 * 0.40468564224).toFixed(1)} ha finished`);
    expect(text()).toContain('Area (ha)');
  });

  it('when another season is chosen to compare, then both load and show side by side, older first', async () => {
    await open('us', { year: '2026', compare: '2025' });
    http.expectOne('/api/season/2026/summary').flush(season(2026, 300, 10));
    http.expectOne('/api/season/2025/summary').flush(season(2025, 120, 6));
    await fixture.whenStable();
    expect(page.querySelector('#compare-heading')?.textContent).toContain('2025 beside 2026');
    const compare = page.querySelector('app-compare-chart');
    expect(compare?.querySelector('canvas')).not.toBeNull();
    const headers = [...page.querySelectorAll('[aria-label="Seasons 2025 and 2026 side by side"] th')].map((th) => th.textContent?.trim());
    expect(headers.slice(0, 4)).toEqual(['Operation', '2025 (ac)', '2026 (ac)', 'Change (ac)']);
    const firstRow = [...page.querySelectorAll('[aria-label="Seasons 2025 and 2026 side by side"] tr.mat-mdc-row td')].map((td) =>
      td.textContent?.trim(),
    );
    expect(firstRow.slice(0, 4)).toEqual(['Harrowing', '120.0', '300.0', (300 - 120).toFixed(1)]);
  });

  it('when the server refuses, then its message shows', async () => {
    await open('us', { year: '2026' });
    http
      .expectOne('/api/season/2026/summary')
      .flush(
        { error: { code: 'forbidden', message: 'Your role on this farm does not allow that' } },
        { status: 403, statusText: 'Forbidden' },
      );
    await fixture.whenStable();
    expect(page.querySelector('[role="alert"]')?.textContent).toContain('Your role on this farm does not allow that');
  });
});
