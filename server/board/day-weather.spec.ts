import { DateTime } from 'luxon';
import { DEFAULT_LIMITS, type WeatherLimits } from '../../shared/weather/limits';
import type { ConflictCard } from './conflicts';
import type { DayContext } from './day-context';
import { hoursToRead } from './day-weather';

// Worked by hand: the rules look back for rain as many hours as the longest "still wet" limit and
// ahead as many as spraying's rain-free hours; the board reads those hours around its day and no more.
const day = (cards: Array<{ start: number; end: number }>, dayHoursLimit = 14) =>
  ({ farm: { dayHoursLimit }, cards: cards as unknown as ConflictCard[] }) as unknown as DayContext;
const midnight = DateTime.fromISO('2027-06-14', { zone: 'America/Chicago' }).startOf('day').toMillis();
const hoursFrom = (d: Date) => (d.getTime() - midnight) / 3_600_000;

describe('the forecast hours a board day reads', () => {
  it('when the limits are the defaults, then it reads from 12 h before midnight (combining stays wet 12 h) to 24 h + 4 rain-free hours + 1 after', () => {
    const { from, to } = hoursToRead(day([{ start: 480, end: 720 }]), midnight, DEFAULT_LIMITS);
    expect(DEFAULT_LIMITS.combining.afterRainHours).toBe(12);
    expect(DEFAULT_LIMITS.spraying.rainFreeHours).toBe(4);
    expect(hoursFrom(from)).toBe(-12);
    expect(hoursFrom(to)).toBe(29);
  });

  it('when a card runs past midnight, then the hours reach past its end by the rain-free hours', () => {
    const { to } = hoursToRead(day([{ start: 1200, end: 26 * 60 + 30 }]), midnight, DEFAULT_LIMITS);
    expect(hoursFrom(to)).toBe(26.5 + 5);
  });

  it('when the owner sets 30 h for straw to dry and 36 rain-free hours, then the hours cover both (more than a day either side)', () => {
    const limits: WeatherLimits = {
      ...DEFAULT_LIMITS,
      harrowing: { ...DEFAULT_LIMITS.harrowing, wetAfterRainHours: 30 },
      spraying: { ...DEFAULT_LIMITS.spraying, rainFreeHours: 36 },
    };
    const { from, to } = hoursToRead(day([]), midnight, limits);
    expect(hoursFrom(from)).toBe(-30);
    expect(hoursFrom(to)).toBe(24 + 37);
  });
});
