import { DateTime } from 'luxon';
import { clockWriter } from './weather.service';

describe('writing forecast hours on the farm clock', () => {
  // March–April and October–November hold the clock changes of both hemispheres.
  const seasons: Array<[string, number]> = [
    ['2026-03-01T00:00:00Z', 61],
    ['2026-10-01T00:00:00Z', 61],
  ];

  it.each(['America/Chicago', 'America/Regina', 'America/St_Johns', 'Europe/London', 'Australia/Lord_Howe', 'UTC'])(
    'when back-to-back runs of three days cross the clock changes in %s, then every hour reads as luxon writes it (reference library)',
    (zone) => {
      for (const [from, days] of seasons)
        for (let day = 0; day < days; day += 3) {
          const first = Date.parse(from) + day * 86_400_000;
          const last = first + 71 * 3_600_000;
          const write = clockWriter(zone, first, last);
          for (let ms = first; ms <= last; ms += 3_600_000)
            expect(write(ms)).toBe(DateTime.fromMillis(ms, { zone }).toISO({ suppressMilliseconds: true }));
        }
    },
  );
});
