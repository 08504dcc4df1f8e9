// The farm's clock against luxon with the IANA time zone database as the outside reference, and
// against the zone rules the tz database publishes (its "northamerica" file): Saskatchewan
// (America/Regina) keeps Central Standard Time (UTC-6) all year; Manitoba (America/Winnipeg)
// follows the Canada/US rule, clocks forward at 02:00 on the second Sunday of March (2026-03-08)
// and back at 02:00 on the first Sunday of November (2026-11-01).
import fc from 'fast-check';
import { DateTime } from 'luxon';
import { farmTime, zoneAbbreviation, dayClock, daySpan } from './farm-time';

const luxonIn = (at: Date, zone: string) => DateTime.fromJSDate(at, { zone }).setLocale('en-US');

describe('farmTime', () => {
  it('when an instant is shown for a farm in Regina and one in Winnipeg in July, then each reads its own clock', () => {
    const at = '2026-07-15T13:05:00Z';
    // tz database: Regina UTC-6 all year, Winnipeg UTC-5 in summer (CDT).
    expect(farmTime(at, 'America/Regina')).toBe('07:05');
    expect(farmTime(at, 'America/Winnipeg')).toBe('08:05');
    expect(farmTime(at, 'America/Regina')).toBe(luxonIn(new Date(at), 'America/Regina').toFormat('HH:mm'));
    expect(farmTime(at, 'America/Winnipeg')).toBe(luxonIn(new Date(at), 'America/Winnipeg').toFormat('HH:mm'));
  });

  it('when the clocks go forward in Winnipeg (2026-03-08 02:00 CST), then a minute before reads 01:59 CST and the change reads 03:00 CDT; Regina does not change', () => {
    const before = '2026-03-08T07:59:00Z';
    const after = '2026-03-08T08:00:00Z';
    expect(farmTime(before, 'America/Winnipeg', 'clock', { zone: true })).toBe('01:59 CST');
    expect(farmTime(after, 'America/Winnipeg', 'clock', { zone: true })).toBe('03:00 CDT');
    expect(farmTime(after, 'America/Regina', 'clock', { zone: true })).toBe('02:00 CST');
    for (const at of [before, after])
      for (const zone of ['America/Winnipeg', 'America/Regina'])
        expect(farmTime(at, zone, 'clock', { zone: true })).toBe(luxonIn(new Date(at), zone).toFormat('HH:mm ZZZZ'));
  });

  it('when the clocks go back in Winnipeg (2026-11-01 02:00 CDT), then 01:30 comes twice, first CDT then CST', () => {
    expect(farmTime('2026-11-01T06:30:00Z', 'America/Winnipeg', 'clock', { zone: true })).toBe('01:30 CDT');
    expect(farmTime('2026-11-01T07:30:00Z', 'America/Winnipeg', 'clock', { zone: true })).toBe('01:30 CST');
  });

  it('when a stamp crosses midnight at the farm but not in UTC, then the day shown is the farm day', () => {
    // 03:30 UTC on July 1 is 21:30 on June 30 in Regina (UTC-6).
    expect(farmTime('2026-07-01T03:30:00Z', 'America/Regina', 'stamp')).toBe('Jun 30, 21:30');
    expect(farmTime('2026-07-01T03:30:00Z', 'America/Regina', 'weekday')).toBe('Tue, Jun 30, 21:30');
  });

  it('when any instant from 2000 to 2060 is shown in any of several zones, then it agrees with luxon', () => {
    const zones = ['America/Regina', 'America/Winnipeg', 'America/Chicago', 'America/Edmonton', 'Australia/Perth', 'Europe/Kyiv', 'UTC'];
    fc.assert(
      fc.property(
        fc.date({ min: new Date('2000-01-01T00:00:00Z'), max: new Date('2060-12-31T00:00:00Z'), noInvalidDate: true }),
        fc.constantFrom(...zones),
        (at, zone) => {
          const l = luxonIn(at, zone);
          expect(farmTime(at, zone, 'clock')).toBe(l.toFormat('HH:mm'));
          expect(farmTime(at.toISOString(), zone, 'stamp')).toBe(l.toFormat('LLL d, HH:mm'));
          expect(farmTime(at, zone, 'weekday')).toBe(l.toFormat('ccc, LLL d, HH:mm'));
        },
      ),
    );
  });
});

describe('zoneAbbreviation', () => {
  it('when asked in winter and summer, then Winnipeg says CST then CDT and Regina CST both times', () => {
    // tz database abbreviations for the Central zone.
    expect(zoneAbbreviation('America/Winnipeg', '2026-01-15T12:00:00Z')).toBe('CST');
    expect(zoneAbbreviation('America/Winnipeg', '2026-07-15T12:00:00Z')).toBe('CDT');
    expect(zoneAbbreviation('America/Regina', '2026-01-15T12:00:00Z')).toBe('CST');
    expect(zoneAbbreviation('America/Regina', '2026-07-15T12:00:00Z')).toBe('CST');
  });
});

describe('dayClock and daySpan', () => {
  // Clock arithmetic (24 h to a day); no outside source needed beyond the 24-hour clock of ISO 8601.
  it('writes hours past 24 as the next day, and leaves a day time as it is', () => {
    expect(dayClock('08:00')).toBe('08:00');
    expect(dayClock('23:59')).toBe('23:59');
    expect(dayClock('24:00')).toBe('00:00 next day');
    expect(dayClock('25:43')).toBe('01:43 next day');
    expect(dayClock('49:05')).toBe('01:05 2 days later');
    expect(daySpan('08:00', '25:43')).toBe('08:00–01:43 next day');
    expect(dayClock('')).toBe('');
  });
});
