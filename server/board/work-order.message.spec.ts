// The work order's times against luxon with the IANA tz database as the outside reference: on
// 2026-12-04 America/Chicago keeps Central Standard Time (CST), and clocks went back on 2026-11-01.
import { timesOf } from './work-order.message';

describe('timesOf', () => {
  it('writes a job within the day with the zone once', () => {
    expect(timesOf({ start: '08:00', end: '17:30' }, '2026-12-04', 'America/Chicago')).toBe('08:00–17:30 CST');
  });

  it('writes a job the running order carries past midnight as ending the next day, never 25:43', () => {
    expect(timesOf({ start: '20:00', end: '25:43' }, '2026-12-04', 'America/Chicago')).toBe('20:00–01:43 next day CST');
  });

  it('keeps each end its own zone on the night the clocks go back', () => {
    expect(timesOf({ start: '00:30', end: '03:00' }, '2026-11-01', 'America/Chicago')).toBe('00:30 CDT–03:00 CST');
  });
});
