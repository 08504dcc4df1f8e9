import { type ComponentFixture, TestBed } from '@angular/core/testing';
import type { Me } from '@shared/schemas/auth';
import { AuthStore } from '../../../core/auth/auth-store';
import { dayStrip } from '../testing/board-fixtures';
import { DayStrip, stripCell } from './day-strip';

const me = (units: 'us' | 'metric'): Me => ({
  user: { id: 1, email: 'i@example.test', name: 'Ingrid' },
  farm: { id: 1, name: 'F', units, timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
});

describe('DayStrip', () => {
  let fixture: ComponentFixture<DayStrip>;

  function show(units: 'us' | 'metric', strip = dayStrip()): HTMLElement {
    TestBed.configureTestingModule({ imports: [DayStrip] });
    TestBed.inject(AuthStore).signedInAs(me(units));
    fixture = TestBed.createComponent(DayStrip);
    fixture.componentRef.setInput('strip', strip);
    fixture.detectChanges();
    return fixture.nativeElement as HTMLElement;
  }
  const row = (el: HTMLElement, cls: string) => [...el.querySelectorAll(`tr.${cls} td`)].map((td) => td.textContent?.trim());

  it('when the farm uses US units, then each hour shows °F, mph and inches (NIST SP 811: °F = 1.8 °C + 32, 1 mi = 1.609344 km, 1 in = 25.4 mm)', () => {
    const el = show('us');
    expect([...el.querySelectorAll('thead th[scope="col"]')].map((th) => th.textContent?.trim())).toEqual(['07', '08', '09']);
    // 10 °C = 50 °F; 12.5 °C = 54.5 °F; 15 °C = 59 °F.
    expect(row(el, 'temp')).toEqual(['50.0', '54.5', '59.0']);
    // 8 km/h = 4.97 mph; 12 km/h = 7.46 mph; 30 km/h = 18.64 mph; 45 km/h = 27.96 mph.
    expect(row(el, 'wind')).toEqual(['5.0', '7.5', '18.6']);
    // 2.54 mm = 0.1 in, to the hundredth as every rain figure in inches.
    expect(row(el, 'rain')).toEqual(['0.00', '0.00', '0.10']);
    expect(el.querySelector('tr.wind td.windy')?.textContent?.trim()).toBe('18.6');
    expect(el.querySelector('tr.rain td.wet')?.textContent?.trim()).toBe('0.10');
  });

  it('when the farm uses metric units, then °C, km/h and mm', () => {
    const el = show('metric');
    expect(row(el, 'temp')).toEqual(['10.0', '12.5', '15.0']);
    expect(row(el, 'wind')).toEqual(['8.0', '12.0', '30.0']);
    expect(row(el, 'rain')).toEqual(['0.0', '0.0', '2.5']);
  });

  it('when read by a screen reader, then the table has a caption with the units and the point, row and column headers, and each hour in words', () => {
    const el = show('us');
    expect(el.querySelector('caption')?.textContent?.replace(/\s+/g, ' ').trim()).toBe(
      "Hourly forecast at the point of most of the day's fields (North Quarter): temperature in °F, wind in mph, rain in in",
    );
    expect([...el.querySelectorAll('tbody th[scope="row"]')].map((th) => th.textContent?.replace(/\s+/g, ' ').trim())).toEqual([
      'Temp °F',
      'Wind mph',
      'Rain in',
    ]);
    expect(el.querySelectorAll('thead th[scope="col"]')[2].getAttribute('title')).toBe(
      '09:00, 59.0 °F, wind 18.6 mph, gusts 28.0 mph, rain 0.10 in, 80 % chance',
    );
    expect(el.querySelector('.scroller')?.getAttribute('tabindex')).toBe('0');
  });

  it("when the strip comes from the farm's first field and is stale, then it says which point and that it is stale", () => {
    const el = show(
      'us',
      dayStrip({
        basis: 'first-field',
        fieldName: 'Home Quarter',
        stale: true,
        staleReason: 'Forecast from 3.0 h ago: no newer forecast has arrived',
      }),
    );
    expect(el.querySelector('.strip-head')?.textContent?.replace(/\s+/g, ' ')).toContain("at Home Quarter, the farm's first field");
    expect(el.querySelector('.age.stale-forecast')?.textContent?.trim()).toBe(
      'Stale: Forecast from 3.0 h ago: no newer forecast has arrived',
    );
  });

  it('when an hour has no values, then it shows dashes and says so in words', () => {
    const cell = stripCell(
      {
        time: '12:00',
        temperatureC: null,
        windSpeedKmh: null,
        windGustKmh: null,
        precipitationMm: null,
        precipitationProbabilityPct: null,
      },
      'metric',
    );
    expect(cell).toMatchObject({ temperature: '—', wind: '—', rain: '—', windy: false, wet: false });
    expect(cell.words).toBe('12:00, no temperature, no wind forecast, no rain forecast');
  });
});
