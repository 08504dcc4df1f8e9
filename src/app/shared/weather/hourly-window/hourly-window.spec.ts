import { type ComponentFixture, TestBed } from '@angular/core/testing';
import type { JobWeather } from '@shared/schemas/run-sheet';
import { AuthStore } from '../../../core/auth/auth-store';
import { HourlyWindow } from './hourly-window';

const hour = (h: string, over: Partial<JobWeather['hours'][0]> = {}): JobWeather['hours'][0] => ({
  time: `2026-05-14T${h}:00:00-05:00`,
  temperatureC: 20,
  windSpeedKmh: 16.09344,
  windGustKmh: 30,
  windDirectionDeg: 225,
  precipitationMm: 0,
  precipitationProbabilityPct: 5,
  deltaTC: 5,
  verdict: { verdict: 'go', reasons: [] },
  ...over,
});

const WEATHER: JobWeather = {
  issuedAt: '2026-05-14T12:00:00Z',
  fetchedAt: '2026-05-14T12:05:00Z',
  ageMinutes: 120,
  stale: false,
  staleReason: null,
  over: 'job',
  from: '10:00',
  to: '12:00',
  verdict: { verdict: 'no-go', reasons: ['wind 18.6 mph at 11:00, above the spraying limit of 10 mph'] },
  hours: [
    hour('10'),
    hour('11', {
      windSpeedKmh: 30,
      verdict: { verdict: 'no-go', reasons: ['wind 18.6 mph at 11:00, above the spraying limit of 10 mph'] },
    }),
  ],
};

describe('HourlyWindow', () => {
  let fixture: ComponentFixture<HourlyWindow>;
  let el: HTMLElement;

  function create(weather: JobWeather, units: 'us' | 'metric' = 'us', deltaT = true): void {
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 2, email: 't@example.test', name: 'Tomas Reyes' },
      farm: { id: 1, name: 'F', units, timeZone: 'America/Chicago' },
      membershipId: 1,
      role: 'operator',
    });
    fixture = TestBed.createComponent(HourlyWindow);
    fixture.componentRef.setInput('weather', weather);
    fixture.componentRef.setInput('key', 7);
    fixture.componentRef.setInput('showDeltaT', deltaT);
    el = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
  }
  const row = (name: string) =>
    [...el.querySelectorAll('tbody tr')].find((r) => r.querySelector('th')?.textContent?.trim() === name)?.querySelectorAll('td') ?? [];
  const cells = (name: string) => [...row(name)].map((c) => c.textContent?.replace(/\s+/g, ' ').trim());

  beforeEach(() => TestBed.configureTestingModule({ imports: [HourlyWindow] }));

  it('when the farm uses US units, then each hour shows °F, mph with compass and words, inches, Delta T in °F and the verdict', () => {
    create(WEATHER);
    expect([...el.querySelectorAll('thead th[scope=col]')].map((t) => t.textContent?.trim())).toEqual(['10:00', '11:00']);
    // 20 °C = 68 °F; 16.09344 km/h = 10 mph; 30 km/h = 18.6 mph → 19; 5 °C difference = 9 °F (NIST SP 811, B.8; 1959 mile).
    expect(cells('Temp')).toEqual(['68 °F', '68 °F']);
    expect(cells('Wind')[0]).toBe('10 mph ↑SWfrom the south-west');
    expect(cells('Wind')[1]).toContain('19 mph');
    expect(cells('Gusts')).toEqual(['19 mph', '19 mph']);
    expect(cells('Rain')).toEqual(['0 in 5 %', '0 in 5 %']);
    expect(cells('Delta T')).toEqual(['9 °F', '9 °F']);
    expect(cells('Verdict')).toEqual(['Go', 'No-go']);
    expect(el.querySelector('.window-verdict')?.textContent).toContain('wind 18.6 mph at 11:00, above the spraying limit of 10 mph');
    // Issued 12:00 UTC = 07:00 in Chicago in May (CDT, UTC−5).
    expect(el.querySelector('.age')?.textContent?.trim()).toBe('Forecast from 07:00, 2 h old');
  });

  it('when the farm is metric and the job is not spraying, then °C, km/h and mm, and no Delta T row', () => {
    create(WEATHER, 'metric', false);
    expect(cells('Temp')[0]).toBe('20 °C');
    expect(cells('Wind')[1]).toContain('30 km/h');
    expect(cells('Rain')[0]).toBe('0 mm 5 %');
    expect(cells('Delta T')).toEqual([]);
  });

  it('when the forecast is stale, then it says so beside its age, with the reason', () => {
    create({ ...WEATHER, stale: true, ageMinutes: 190, staleReason: 'Forecast from 3.2 h ago: no newer forecast has arrived' });
    expect(el.querySelector('.age')?.textContent?.replace(/\s+/g, ' ').trim()).toBe('Forecast from 07:00, 3.2 h old, stale');
    expect(el.querySelector('.stale-reason')?.textContent).toContain('no newer forecast');
  });

  it('when no forecast is stored yet, then the reason is shown and no strip', () => {
    create({
      ...WEATHER,
      issuedAt: null,
      fetchedAt: null,
      ageMinutes: null,
      stale: true,
      staleReason: 'No forecast yet: it is fetched in the background',
      verdict: null,
      hours: [],
    });
    expect(el.querySelector('table')).toBeNull();
    expect(el.querySelector('.stale-reason')?.textContent).toContain('No forecast yet');
  });
});
