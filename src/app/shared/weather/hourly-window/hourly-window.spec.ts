import { type ComponentFixture, TestBed } from '@angular/core/testing';
import type { JobWeather } from '@shared/schemas/run-sheet';
import { DEFAULT_LIMITS } from '@shared/weather/limits';
import { judgeHarrowing, judgeSpraying, type WeatherHour } from '@shared/weather/rules';
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
  verdict: { verdict: 'no-go', reasons: ['wind 18.6 mph at 11:00, above the spraying limit of 10.0 mph'] },
  hours: [
    hour('10'),
    hour('11', {
      windSpeedKmh: 30,
      verdict: { verdict: 'no-go', reasons: ['wind 18.6 mph at 11:00, above the spraying limit of 10.0 mph'] },
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
    // 20 °C = 68 °F; 16.09344 km/h = 10 mph; 30 km/h = 18.64 mph; 5 °C difference = 9 °F (NIST SP 811, B.8; 1959 mile).
    expect(cells('Temp')).toEqual(['68.0 °F', '68.0 °F']);
    expect(cells('Wind')[0]).toBe('10.0 mph ↑SWfrom the south-west');
    expect(cells('Wind')[1]).toContain('18.6 mph');
    expect(cells('Gusts')).toEqual(['18.6 mph', '18.6 mph']);
    expect(cells('Rain')).toEqual(['0.00 in 5 %', '0.00 in 5 %']);
    expect(cells('Delta T')).toEqual(['9.0 °F', '9.0 °F']);
    expect(cells('Verdict')).toEqual(['Go', 'No-go']);
    expect(el.querySelector('.window-verdict')?.textContent).toContain('wind 18.6 mph at 11:00, above the spraying limit of 10.0 mph');
    // Issued 12:00 UTC = 07:00 in Chicago in May (CDT, UTC−5).
    expect(el.querySelector('.age')?.textContent?.trim()).toBe('Forecast from 07:00, 2.0 h old');
  });

  it('when the job has its own hours, then the header names them; without, then it names the working day', () => {
    create({ ...WEATHER, over: 'job', from: '08:00', to: '12:00' });
    expect(el.querySelector('h3')?.textContent?.trim()).toBe('Weather, 08:00–12:00');
    expect(el.querySelector('.strip')?.getAttribute('aria-label')).toBe('Hourly forecast, 08:00–12:00');
    fixture.componentRef.setInput('weather', { ...WEATHER, over: 'working-day', from: '07:00', to: '19:00' });
    fixture.detectChanges();
    expect(el.querySelector('h3')?.textContent?.trim()).toBe('Weather, working day 07:00–19:00');
  });

  it('when the farm is metric and the job is not spraying, then °C, km/h and mm, and no Delta T row', () => {
    create(WEATHER, 'metric', false);
    expect(cells('Temp')[0]).toBe('20.0 °C');
    expect(cells('Wind')[1]).toContain('30.0 km/h');
    expect(cells('Rain')[0]).toBe('0.0 mm 5 %');
    expect(cells('Delta T')).toEqual([]);
  });

  it('when a cold morning gives a reason an hour, then three show and the rest fold under "N more reasons"', () => {
    const reasons = Array.from({ length: 18 }, (_, i) => `soil ${(26 + i / 10).toFixed(1)} °F at ${String(6 + i).padStart(2, '0')}:00`);
    create({ ...WEATHER, verdict: { verdict: 'no-go', reasons } });
    const shown = [...el.querySelectorAll('.reasons > li:not(.more)')].map((li) => li.textContent?.trim());
    expect(shown).toEqual(reasons.slice(0, 3));
    const more = el.querySelector('.reasons > li.more details') as HTMLDetailsElement;
    expect(more.open).toBe(false);
    expect(more.querySelector('summary')?.textContent?.trim()).toBe('15 more reasons');
    expect([...more.querySelectorAll('li')].map((li) => li.textContent?.trim())).toEqual(reasons.slice(3));
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

  describe('the same hour in the strip and in the reasons the server writes (shared/weather/rules.ts)', () => {
    // One forecast hour the server judges (server/weather/weather.service.ts calls these rules) and
    // the strip shows: each figure must read alike in both, digits and unit words.
    const forecast = (over: Partial<WeatherHour>): WeatherHour[] =>
      ['09', '10', '11'].map((h) => ({
        time: `2026-05-14T${h}:00:00-05:00`,
        temperatureC: 20,
        relativeHumidityPct: 60,
        dewPointC: 12,
        precipitationMm: 0,
        precipitationProbabilityPct: 5,
        windSpeedKmh: 10,
        windGustKmh: 12,
        windDirectionDeg: 180,
        cloudCoverPct: 80,
        soilTemperatureC: 10,
        ...(h === '10' ? over : {}),
      }));
    const PLACE = { latitude: 47.5, longitude: -97 };
    const shown = (hours: WeatherHour[], reasons: string[], units: 'us' | 'metric') => {
      const h = hours[1];
      create(
        {
          ...WEATHER,
          verdict: { verdict: 'no-go', reasons },
          hours: [hour('10', { ...h, time: h.time, deltaTC: 5, verdict: { verdict: 'no-go', reasons } })],
        },
        units,
      );
      return el.querySelector('.window-verdict')?.textContent ?? '';
    };

    it.each(['us', 'metric'] as const)(
      'when wind and gusts are over the limit (%s), then the strip’s wind and gust read as in the reason',
      (units) => {
        // 27.4 km/h = 17.03 mph, 35.3 km/h = 21.93 mph (1 mile = 1.609344 km, 1959 agreement).
        const hours = forecast({ windSpeedKmh: 27.4, windGustKmh: 35.3 });
        const v = judgeSpraying(hours, 1, DEFAULT_LIMITS.spraying, units, PLACE);
        const reasons = shown(hours, v.reasons, units);
        const wind = cells('Wind')[0]!.split(' ').slice(0, 2).join(' ');
        expect(wind).toBe(units === 'us' ? '17.0 mph' : '27.4 km/h');
        expect(reasons).toContain(`wind ${wind} at 10:00`);
        // The limit in the reason is written the same way: 10 mph exactly (the default).
        expect(reasons).toContain(units === 'us' ? 'limit of 10.0 mph' : 'limit of 16.1 km/h');
      },
    );

    it.each(['us', 'metric'] as const)(
      'when it rains and is cold (%s), then the strip’s rain and temperature read as in the reason',
      (units) => {
        // 0.6 mm = 0.0236 in → 0.02 in; 3.2 °C = 37.76 °F → 37.8 °F (NIST SP 811, B.8).
        const hours = forecast({ precipitationMm: 0.6, temperatureC: 3.2, dewPointC: -4 });
        const v = judgeHarrowing(hours, 1, DEFAULT_LIMITS.harrowing, units);
        const reasons = shown(hours, v.reasons, units);
        const rain = cells('Rain')[0]!.split(' ').slice(0, 2).join(' ');
        expect(rain).toBe(units === 'us' ? '0.02 in' : '0.6 mm');
        expect(reasons).toContain(`rain ${rain} at 10:00`);
        expect(cells('Temp')[0]).toBe(units === 'us' ? '37.8 °F' : '3.2 °C');
        expect(reasons).toContain(`cold at 10:00: ${cells('Temp')[0]}`);
      },
    );
  });
});
