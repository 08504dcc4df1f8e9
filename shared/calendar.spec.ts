import fc from 'fast-check';
import { DateTime } from 'luxon';
import { dayIn, yearIn } from './calendar';

describe('a farm calendar', () => {
  // Offsets from the IANA time zone database: America/Chicago keeps CST (UTC−6) in winter and CDT
  // (UTC−5) from the second Sunday of March to the first Sunday of November (15 U.S.C. 260a).
  it('when it is 04:30 UTC on June 10, then it is still June 9 in Chicago (CDT, UTC−5)', () => {
    const at = new Date('2026-06-10T04:30:00Z');
    expect(dayIn('America/Chicago', at)).toBe('2026-06-09');
    expect(dayIn('UTC', at)).toBe('2026-06-10');
  });

  it('when it is 05:30 UTC on New Year’s Day, then Chicago (CST, UTC−6) is still in the old season', () => {
    const at = new Date('2027-01-01T05:30:00Z');
    expect(yearIn('America/Chicago', at)).toBe(2026);
    expect(yearIn('America/Regina', at)).toBe(2026); // Saskatchewan keeps CST all year
    expect(yearIn('Europe/Berlin', at)).toBe(2027);
  });

  it('then it agrees with luxon (a general-purpose date library) for any instant and zone', () => {
    const zones = [
      'America/Chicago',
      'America/Denver',
      'America/Regina',
      'America/Winnipeg',
      'America/Edmonton',
      'Australia/Perth',
      'Pacific/Chatham',
      'UTC',
    ];
    fc.assert(
      fc.property(
        fc.date({ min: new Date('1990-01-01T00:00:00Z'), max: new Date('2060-12-31T23:59:59Z'), noInvalidDate: true }),
        fc.constantFrom(...zones),
        (at, zone) => {
          expect(dayIn(zone, at)).toBe(DateTime.fromJSDate(at).setZone(zone).toISODate());
        },
      ),
      { numRuns: 500 },
    );
  });
});
