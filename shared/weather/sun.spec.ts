import { inversionHours, sunDayAt, type Place } from './sun';

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;

/**
 * Sunrise and sunset (ms, UTC) by the NOAA Solar Calculator's published equations (NOAA Global
 * Monitoring Laboratory, "NOAA Solar Calculator" spreadsheet, after Meeus, "Astronomical
 * Algorithms"): the sun's apparent longitude and the obliquity give the declination and the
 * equation of time, the hour angle at a zenith of 90.833° (refraction and the sun's radius) gives
 * the half-day. Written here from those formulas, independent of suncalc's own method; evaluated
 * once at noon and again at the event itself.
 */
function noaaSunTimes(dateUtc: string, place: Place): { sunrise: number; sunset: number } {
  const midnight = Date.parse(`${dateUtc}T00:00:00Z`);
  const at = (ms: number) => {
    const jd = ms / 86_400_000 + 2_440_587.5;
    const t = (jd - 2_451_545) / 36_525;
    const l0 = (280.46646 + t * (36_000.76983 + t * 0.0003032)) % 360;
    const m = 357.52911 + t * (35_999.05029 - 0.0001537 * t);
    const e = 0.016708634 - t * (0.000042037 + 0.0000001267 * t);
    const c =
      Math.sin(m * RAD) * (1.914602 - t * (0.004817 + 0.000014 * t)) +
      Math.sin(2 * m * RAD) * (0.019993 - 0.000101 * t) +
      Math.sin(3 * m * RAD) * 0.000289;
    const omega = 125.04 - 1934.136 * t;
    const apparentLong = l0 + c - 0.00569 - 0.00478 * Math.sin(omega * RAD);
    const meanObliq = 23 + (26 + (21.448 - t * (46.815 + t * (0.00059 - t * 0.001813))) / 60) / 60;
    const obliq = meanObliq + 0.00256 * Math.cos(omega * RAD);
    const decl = Math.asin(Math.sin(obliq * RAD) * Math.sin(apparentLong * RAD));
    const y = Math.tan((obliq / 2) * RAD) ** 2;
    const eqTimeMin =
      4 *
      DEG *
      (y * Math.sin(2 * l0 * RAD) -
        2 * e * Math.sin(m * RAD) +
        4 * e * y * Math.sin(m * RAD) * Math.cos(2 * l0 * RAD) -
        0.5 * y * y * Math.sin(4 * l0 * RAD) -
        1.25 * e * e * Math.sin(2 * m * RAD));
    const lat = place.latitude * RAD;
    const haDeg = DEG * Math.acos(Math.cos(90.833 * RAD) / (Math.cos(lat) * Math.cos(decl)) - Math.tan(lat) * Math.tan(decl));
    const noonMin = 720 - 4 * place.longitude - eqTimeMin;
    return { sunriseMin: noonMin - 4 * haDeg, sunsetMin: noonMin + 4 * haDeg };
  };
  const first = at(midnight + 12 * 3_600_000 - place.longitude * 240_000);
  const sunrise = at(midnight + first.sunriseMin * 60_000).sunriseMin;
  const sunset = at(midnight + first.sunsetMin * 60_000).sunsetMin;
  return { sunrise: midnight + sunrise * 60_000, sunset: midnight + sunset * 60_000 };
}

const minutesApart = (a: number | null, b: number) => Math.abs((a ?? NaN) - b) / 60_000;

describe('sunrise and sunset at a field (suncalc)', () => {
  // Places and dates of every season; the date is the solar day's UTC date (solar noon at these
  // longitudes falls on that UTC date).
  const cases: Array<[string, Place, string]> = [
    ['50° N, 100° W, June solstice', { latitude: 50, longitude: -100 }, '2026-06-21'],
    ['50° N, 100° W, December solstice', { latitude: 50, longitude: -100 }, '2026-12-21'],
    ['50° N, 100° W, March equinox', { latitude: 50, longitude: -100 }, '2026-03-20'],
    ['49.7° N, 100.2° W, mid-May', { latitude: 49.7, longitude: -100.2 }, '2026-05-14'],
    ['47° N, 100° W, harvest', { latitude: 47, longitude: -100 }, '2026-08-25'],
    ['58° N, 117° W, June', { latitude: 58, longitude: -117 }, '2026-06-10'],
    ['35° S, 148° E, January', { latitude: -35, longitude: 148 }, '2026-01-15'],
    ['52° N, 1° E, October', { latitude: 52, longitude: 1 }, '2026-10-05'],
  ];

  it.each(cases)(
    'when asked for %s, then sunrise and sunset agree with the NOAA Solar Calculator equations (Meeus) within 2 minutes',
    (_name, place, date) => {
      const noaa = noaaSunTimes(date, place);
      // Asked at local solar noon (suncalc answers for the solar day nearest the instant).
      const day = sunDayAt(Date.parse(`${date}T12:00:00Z`) - place.longitude * 240_000, place);
      expect(minutesApart(day.sunrise, noaa.sunrise)).toBeLessThan(2);
      expect(minutesApart(day.sunset, noaa.sunset)).toBeLessThan(2);
    },
  );

  it('when asked at any hour of one solar day, then the same sunrise and sunset come back (the evening reads that day’s sunset)', () => {
    const place = { latitude: 50, longitude: -100 };
    // Local solar noon at 100° W is about 18:40 UTC; ask from 07:00 to 06:00 UTC the next day.
    const noon = sunDayAt(Date.parse('2026-06-21T18:40:00Z'), place);
    for (const t of ['2026-06-21T07:00:00Z', '2026-06-21T12:00:00Z', '2026-06-22T03:00:00Z', '2026-06-22T06:00:00Z'])
      expect(sunDayAt(Date.parse(t), place)).toEqual(noon);
    // Past solar midnight the next day's sunrise is read.
    expect(sunDayAt(Date.parse('2026-06-22T07:00:00Z'), place).sunrise).toBeGreaterThan(noon.sunset!);
  });
});

describe('the inversion-risk hours (2 h before sunset to 2 h after sunrise: common practice, no published source)', () => {
  const place = { latitude: 50, longitude: -100 };
  const june = sunDayAt(Date.parse('2026-06-21T18:40:00Z'), place);
  const H = 3_600_000;
  const MIN = 60_000;
  const inside = (ms: number) => inversionHours(ms, place, 2, 2).inside;

  it('when an instant is a minute either side of 2 h before sunset, then outside before and inside from it', () => {
    const from = june.sunset! - 2 * H;
    expect(inside(from - MIN)).toBe(false);
    expect(inside(from)).toBe(true);
    expect(inversionHours(from + MIN, place, 2, 2)).toEqual({ inside: true, side: 'evening', sunset: june.sunset });
  });

  it('when an instant is a minute either side of 2 h after the next sunrise, then inside before and outside from it', () => {
    const next = sunDayAt(june.sunrise! + 24 * H, place);
    const until = next.sunrise! + 2 * H;
    expect(inversionHours(until - MIN, place, 2, 2)).toEqual({ inside: true, side: 'morning', sunrise: next.sunrise });
    expect(inside(until)).toBe(false);
  });

  it('when it is the middle of the night, then inside; the middle of the day, then outside', () => {
    const midnight = (june.sunset! + sunDayAt(june.sunrise! + 24 * H, place).sunrise!) / 2;
    expect(inside(midnight - 10 * MIN)).toBe(true);
    expect(inside(midnight + 10 * MIN)).toBe(true);
    expect(inside((june.sunrise! + june.sunset!) / 2)).toBe(false);
  });

  it('when the owner asks for 0 h, then the window is sunset to sunrise exactly', () => {
    expect(inversionHours(june.sunset! - MIN, place, 0, 0).inside).toBe(false);
    expect(inversionHours(june.sunset!, place, 0, 0).inside).toBe(true);
    expect(inversionHours(june.sunrise! - MIN, place, 0, 0).inside).toBe(true);
    expect(inversionHours(june.sunrise!, place, 0, 0).inside).toBe(false);
  });

  it('when the sun does not set (70° N in June) or does not rise (70° N in December), then never and always', () => {
    const north = { latitude: 70, longitude: 20 };
    expect(inversionHours(Date.parse('2026-06-21T23:00:00Z'), north, 2, 2).inside).toBe(false);
    expect(inversionHours(Date.parse('2026-12-21T11:00:00Z'), north, 2, 2)).toEqual({ inside: true, side: 'polar-night' });
  });
});
