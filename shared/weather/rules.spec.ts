import { mphToKmh } from '../units';
import { boundaryCentre, gridCellOf } from './grid';
import { DEFAULT_LIMITS, LIMIT_SOURCES, SPRAY_LABEL_CAUTION, seedCropOf, WEATHER_OPERATIONS } from './limits';
import { judgeHarrowing, judgeHarvest, judgeHour, judgeSeeding, judgeSpraying, judgeWindow, type WeatherHour } from './rules';
import { sunDayAt } from './sun';
import { deltaTC } from './wet-bulb';

const L = DEFAULT_LIMITS;
/** The forecast point of the hours below: 50° N, 100° W (the farm's clock is UTC−5 in May). */
const PLACE = { latitude: 50, longitude: -100 };

/** A day of hours that are good for everything, from midnight at UTC−5; `change` edits some. */
function day(change: Record<number, Partial<WeatherHour>> = {}): WeatherHour[] {
  return Array.from({ length: 48 }, (_, i) => ({
    time: `2026-05-${String(14 + Math.floor(i / 24)).padStart(2, '0')}T${String(i % 24).padStart(2, '0')}:00:00-05:00`,
    temperatureC: 20,
    relativeHumidityPct: 50,
    dewPointC: 9.3,
    precipitationMm: 0,
    precipitationProbabilityPct: 0,
    windSpeedKmh: 10,
    windGustKmh: 12,
    windDirectionDeg: 200,
    cloudCoverPct: 50,
    soilTemperatureC: 10,
    ...change[i],
  }));
}

describe('the good day used below', () => {
  it('when nothing is changed, then every operation is go (the spraying verdict keeps only the label caution)', () => {
    const v = judgeHour(day(), 10, L, 'us', 'canola', PLACE);
    for (const op of WEATHER_OPERATIONS) expect(v[op].verdict).toBe('go');
    expect(v.spraying.reasons).toEqual([SPRAY_LABEL_CAUTION]);
  });
});

describe('spraying', () => {
  const spray = (h: Record<number, Partial<WeatherHour>>, i = 10) => judgeSpraying(day(h), i, L.spraying, 'us', PLACE);

  it('when wind is exactly 10 mph, then go; just over, then no-go with the reason in words (labels as reported by extension: 3–10 mph)', () => {
    expect(spray({ 10: { windSpeedKmh: mphToKmh(10) } }).verdict).toBe('go');
    const over = spray({ 10: { windSpeedKmh: mphToKmh(10.1) } });
    expect(over.verdict).toBe('no-go');
    expect(over.reasons[0]).toBe('wind 10.1 mph at 10:00, above the spraying limit of 10.0 mph');
  });

  it('when wind is exactly 3 mph, then go; just under, then no-go (labels as reported by extension; NPSA "Evaluate the Weather": not under 3 mph)', () => {
    expect(spray({ 10: { windSpeedKmh: mphToKmh(3) } }).verdict).toBe('go');
    const under = spray({ 10: { windSpeedKmh: mphToKmh(2.9) } });
    expect(under.verdict).toBe('no-go');
    expect(under.reasons[0]).toBe('wind 2.9 mph at 10:00, below the spraying minimum of 3.0 mph');
  });

  it('when gusts pass the limit while the mean wind is inside it, then caution (common practice, no published source)', () => {
    const v = spray({ 10: { windGustKmh: mphToKmh(15) } });
    expect(v.verdict).toBe('caution');
    expect(v.reasons[0]).toMatch(/^gusts 15.0 mph at 10:00/);
  });

  it('when rain comes exactly 4 h after the hour, then no-go; 5 h after, then go (rain-free hours: common practice, no published source)', () => {
    const at4 = spray({ 14: { precipitationMm: 0.2 } });
    expect(at4.verdict).toBe('no-go');
    expect(at4.reasons[0]).toBe('rain 0.01 in at 14:00, within 4.0 h of spraying at 10:00');
    expect(spray({ 15: { precipitationMm: 5 } }).verdict).toBe('go');
    // Just under the amount that counts as rain.
    expect(spray({ 12: { precipitationMm: 0.19 } }).verdict).toBe('go');
  });

  it('when Delta T is in the bands, then 2–8 go, 8–10 caution, over 10 or under 2 no-go (GRDC spray-application guidance, from memory)', () => {
    // Delta T of 20 °C and 50 % is 6.3 °C (Stull 2011 worked example): exactly at a good limit of 6.3 → go, just above → caution.
    const dt = deltaTC(20, 50);
    const at = judgeSpraying(day(), 10, { ...L.spraying, deltaTGoodMaxC: dt }, 'metric', PLACE);
    expect(at.verdict).toBe('go');
    const over = judgeSpraying(day(), 10, { ...L.spraying, deltaTGoodMaxC: dt - 0.01 }, 'metric', PLACE);
    expect(over.verdict).toBe('caution');
    expect(over.reasons[0]).toMatch(/^Delta T 6.3 °C at 10:00, over 6.3 °C/);
    // The same at the no-go edges.
    expect(judgeSpraying(day(), 10, { ...L.spraying, deltaTCautionMaxC: dt, deltaTGoodMaxC: dt - 1 }, 'metric', PLACE).verdict).toBe(
      'caution',
    );
    expect(judgeSpraying(day(), 10, { ...L.spraying, deltaTCautionMaxC: dt - 0.01, deltaTGoodMaxC: dt - 1 }, 'metric', PLACE).verdict).toBe(
      'no-go',
    );
    expect(judgeSpraying(day(), 10, { ...L.spraying, deltaTMinC: dt }, 'metric', PLACE).verdict).toBe('go');
    expect(judgeSpraying(day(), 10, { ...L.spraying, deltaTMinC: dt + 0.01 }, 'metric', PLACE).verdict).toBe('no-go');
    // With the default bands: hot and dry (30 °C, 20 %) is over 10; humid (15 °C, 92 %) is under 2.
    expect(deltaTC(30, 20)).toBeGreaterThan(10);
    expect(spray({ 10: { temperatureC: 30, relativeHumidityPct: 20 } }).verdict).toBe('no-go');
    expect(deltaTC(15, 92)).toBeLessThan(2);
    expect(spray({ 10: { temperatureC: 15, relativeHumidityPct: 92 } }).verdict).toBe('no-go');
  });

  describe('inversion risk: wind under 3 mph with clear sky from 2 h before sunset to 2 h after sunrise at the field (common practice, no published source)', () => {
    const calmClear = { windSpeedKmh: mphToKmh(2), cloudCoverPct: 30 };
    const MIN = 60_000;
    const H = 3_600_000;
    /** An instant written on a clock `offsetH` hours from UTC, as the forecast hours are: 2026-06-21T19:52:00-05:00. */
    const onClock = (ms: number, offsetH: number, to: 'up' | 'nearest' = 'up') => {
      // Up to the whole minute, so an instant on or after a limit stays on or after it.
      const whole = (to === 'up' ? Math.ceil(ms / MIN) : Math.round(ms / MIN)) * MIN;
      const local = new Date(whole + offsetH * H).toISOString().slice(0, 19);
      return `${local}${offsetH < 0 ? '-' : '+'}${String(Math.abs(offsetH)).padStart(2, '0')}:00`;
    };
    /** The spraying verdict of one calm, clear hour at `time` (its neighbours good). */
    const sprayAt = (time: string) => {
      const hours = day({ 10: { ...calmClear, time } });
      return judgeSpraying(hours, 10, L.spraying, 'us', PLACE);
    };
    const inversion = (time: string) => sprayAt(time).reasons.find((r) => r.startsWith('inversion risk'));
    // Sunrise and sunset at 50° N, 100° W, from suncalc (checked against the NOAA equations in sun.spec.ts).
    const june = sunDayAt(Date.parse('2026-06-21T18:40:00Z'), PLACE);
    const december = sunDayAt(Date.parse('2026-12-21T18:40:00Z'), PLACE);

    it('when the hour is a minute before or at 2 h before sunset, then outside and inside, with the sunset named on the farm’s clock', () => {
      const from = june.sunset! - 2 * H;
      expect(inversion(onClock(from - MIN, -5))).toBeUndefined();
      const at = onClock(from, -5);
      expect(inversion(at)).toBe(
        `inversion risk at ${at.slice(11, 16)}: wind 2.0 mph under clear sky (30 % cloud), from 2.0 h before sunset (${onClock(june.sunset!, -5, 'nearest').slice(11, 16)})`,
      );
      expect(sprayAt(at).verdict).toBe('no-go');
    });

    it('when the hour is a minute before or at 2 h after sunrise, then inside and outside', () => {
      const until = sunDayAt(june.sunrise! + 24 * H, PLACE).sunrise! + 2 * H;
      expect(inversion(onClock(until - MIN, -5))).toMatch(/, until 2.0 h after sunrise \(0\d:\d\d\)$/);
      expect(inversion(onClock(until, -5))).toBeUndefined();
    });

    it('when it is a June day at 50° N, then 17:00 and 19:00 are not yet inversion hours and 08:00 no longer is (sunset near 21:50, sunrise near 05:30)', () => {
      // The farm's clock in June is UTC−5; the hours a fixed 16:00–10:00 window would have flagged.
      expect(onClock(june.sunset!, -5, 'nearest').slice(11, 16)).toMatch(/^21:5\d$/);
      for (const t of [
        '2026-06-21T17:00:00-05:00',
        '2026-06-21T19:00:00-05:00',
        '2026-06-22T08:00:00-05:00',
        '2026-06-22T09:00:00-05:00',
      ]) {
        expect(inversion(t)).toBeUndefined();
        // Still no-go, for the wind under the spraying minimum.
        expect(sprayAt(t).reasons[0]).toMatch(/^wind 2.0 mph at \d\d:00, below the spraying minimum/);
      }
      for (const t of ['2026-06-21T20:00:00-05:00', '2026-06-22T02:00:00-05:00', '2026-06-22T07:00:00-05:00'])
        expect(inversion(t)).toMatch(/^inversion risk/);
    });

    it('when it is a December day at 50° N, then 15:00 is already an inversion hour (sunset near 16:50 on a UTC−6 clock)', () => {
      expect(onClock(december.sunset!, -6, 'nearest').slice(11, 16)).toMatch(/^16:[45]\d$/);
      expect(inversion('2026-12-21T15:00:00-06:00')).toMatch(/^inversion risk at 15:00: .*from 2.0 h before sunset \(16:[45]\d\)$/);
      expect(inversion('2026-12-21T14:00:00-06:00')).toBeUndefined();
    });

    it('when the cloud is just over the clear-sky limit or the wind reaches 3 mph, then no inversion reason', () => {
      const night = '2026-06-21T23:00:00-05:00';
      expect(inversion(night)).toMatch(/^inversion risk/);
      expect(
        judgeSpraying(day({ 10: { ...calmClear, cloudCoverPct: 31, time: night } }), 10, L.spraying, 'us', PLACE).reasons[0],
      ).not.toMatch(/^inversion/);
      expect(
        judgeSpraying(day({ 10: { windSpeedKmh: mphToKmh(3), cloudCoverPct: 0, time: night } }), 10, L.spraying, 'us', PLACE).reasons[0],
      ).not.toMatch(/^inversion/);
    });

    it('when the owner sets 0 h, then the window is sunset to sunrise', () => {
      const lim = { ...L.spraying, inversionBeforeSunsetHours: 0, inversionAfterSunriseHours: 0 };
      const judge = (ms: number) =>
        judgeSpraying(day({ 10: { ...calmClear, time: onClock(ms, -5) } }), 10, lim, 'us', PLACE).reasons[0].startsWith('inversion');
      expect(judge(june.sunset! - MIN)).toBe(false);
      expect(judge(june.sunset!)).toBe(true);
    });
  });

  it('when any spraying verdict is given, then the label caution goes with it, last', () => {
    for (const h of [{}, { 10: { windSpeedKmh: 40 } }, { 10: { windGustKmh: 30 } }] as Record<number, Partial<WeatherHour>>[]) {
      const v = spray(h);
      expect(v.reasons[v.reasons.length - 1]).toBe(
        'The label is the law; forecast wind is at 10 m — measure at boom height before you spray.',
      );
    }
  });

  it('when the farm is metric, then the reason is in km/h', () => {
    expect(judgeSpraying(day({ 10: { windSpeedKmh: 20 } }), 10, L.spraying, 'metric', PLACE).reasons[0]).toBe(
      'wind 20.0 km/h at 10:00, above the spraying limit of 16.1 km/h',
    );
  });
});

describe('harrowing straw (common practice, no published source; the owner sets the numbers)', () => {
  const harrow = (h: Record<number, Partial<WeatherHour>>, i = 10) => judgeHarrowing(day(h), i, L.harrowing, 'metric');

  it('when it rains 0.2 mm in the hour, then no-go; 0.19 mm, then go', () => {
    expect(harrow({ 10: { precipitationMm: 0.2 } }).verdict).toBe('no-go');
    expect(harrow({ 10: { precipitationMm: 0.19 } }).verdict).toBe('go');
  });

  it('when it rained 6 h before, then no-go (straw wet); 7 h before, then go', () => {
    const v = harrow({ 4: { precipitationMm: 1 } });
    expect(v.verdict).toBe('no-go');
    expect(v.reasons[0]).toBe('straw still wet at 10:00 from rain at 04:00 (within 6.0 h)');
    expect(harrow({ 3: { precipitationMm: 1 } }).verdict).toBe('go');
  });

  it('when air is within 1 °C of its dew point, then no-go (dew); 1.1 °C, then go', () => {
    expect(harrow({ 10: { temperatureC: 10, dewPointC: 9 } }).verdict).toBe('no-go');
    expect(harrow({ 10: { temperatureC: 10, dewPointC: 8.9 } }).verdict).toBe('go');
  });

  it('when colder than 5 °C, then caution; exactly 5 °C, then go', () => {
    const cold = harrow({ 10: { temperatureC: 4.9, dewPointC: -5 } });
    expect(cold.verdict).toBe('caution');
    expect(cold.reasons[0]).toBe('cold at 10:00: 4.9 °C, under 5.0 °C; straw stays tough');
    expect(harrow({ 10: { temperatureC: 5, dewPointC: -5 } }).verdict).toBe('go');
  });
});

describe('seeding', () => {
  const seed = (h: Record<number, Partial<WeatherHour>>, crop = seedCropOf('Canola')) => judgeSeeding(day(h), 10, L.seeding, 'us', crop);

  it('when soil is exactly at the canola minimum of 5 °C, then go; just under, then no-go (minimum from memory)', () => {
    expect(LIMIT_SOURCES.seeding.soilMinC.canola.kind).toBe('from memory');
    expect(seed({ 10: { soilTemperatureC: 5 } }).verdict).toBe('go');
    const cold = seed({ 10: { soilTemperatureC: 4.99 } });
    expect(cold.verdict).toBe('no-go');
    expect(cold.reasons[0]).toBe('soil 41.0 °F at 10:00, under the canola minimum of 41.0 °F');
  });

  it('when the crop is barley, then its own minimum of 3 °C applies (from memory)', () => {
    expect(seed({ 10: { soilTemperatureC: 3 } }, 'barley').verdict).toBe('go');
    expect(seed({ 10: { soilTemperatureC: 2.9 } }, 'barley').verdict).toBe('no-go');
  });

  it('when 5 mm falls in the hour, then no-go (heavy rain); 4.9 mm, then go (common practice, no published source)', () => {
    expect(seed({ 10: { precipitationMm: 5 } }).verdict).toBe('no-go');
    expect(seed({ 10: { precipitationMm: 4.9 } }).verdict).toBe('go');
  });

  it('when the field has no crop in the table, then caution saying so', () => {
    const v = seed({}, null);
    expect(v.verdict).toBe('caution');
    expect(v.reasons[0]).toMatch(/no crop/);
  });
});

describe('swathing and combining (common practice, no published source; the owner sets the numbers)', () => {
  const combine = (h: Record<number, Partial<WeatherHour>>, i = 20) => judgeHarvest(day(h), i, L.combining, 'metric', 'combining');
  const swath = (h: Record<number, Partial<WeatherHour>>, i = 20) => judgeHarvest(day(h), i, L.swathing, 'metric', 'swathing');

  it('when rain fell 12 h before combining, then no-go; 13 h before, then go', () => {
    expect(combine({ 8: { precipitationMm: 2 } }).verdict).toBe('no-go');
    expect(combine({ 7: { precipitationMm: 2 } }).verdict).toBe('go');
    // Swathing waits 4 h.
    expect(swath({ 16: { precipitationMm: 2 } }).verdict).toBe('no-go');
    expect(swath({ 15: { precipitationMm: 2 } }).verdict).toBe('go');
  });

  it('when it rains in the hour, then no-go', () => {
    expect(combine({ 20: { precipitationMm: 0.2 } }).reasons[0]).toBe('rain 0.2 mm at 20:00: no combining in rain');
  });

  it('when humidity reaches 70 %, then combining is caution; 69.9 %, then go', () => {
    expect(combine({ 20: { relativeHumidityPct: 70 } }).verdict).toBe('caution');
    expect(combine({ 20: { relativeHumidityPct: 69.9 } }).verdict).toBe('go');
  });

  it('when air is within 2 °C of its dew point, then caution (dew); 2.1 °C, then go', () => {
    expect(swath({ 20: { temperatureC: 12, dewPointC: 10 } }).verdict).toBe('caution');
    expect(swath({ 20: { temperatureC: 12, dewPointC: 9.9 } }).verdict).toBe('go');
  });
});

describe('a window of hours', () => {
  it('when one hour is no-go, then the window is no-go with that hour’s reason first and the label caution last', () => {
    const hours = day({ 14: { windSpeedKmh: mphToKmh(14) } });
    const v = judgeWindow([10, 12, 14, 16].map((i) => judgeSpraying(hours, i, L.spraying, 'us', PLACE)));
    expect(v.verdict).toBe('no-go');
    expect(v.reasons[0]).toBe('wind 14.0 mph at 14:00, above the spraying limit of 10.0 mph');
    expect(v.reasons[v.reasons.length - 1]).toBe(SPRAY_LABEL_CAUTION);
  });

  it('when there are no hours, then caution', () => {
    expect(judgeWindow([]).verdict).toBe('caution');
  });
});

describe('every default has a source of an allowed kind', () => {
  it('when the sources are listed, then each key of the defaults has one', () => {
    const kinds = new Set(['published', 'from memory', 'common practice, no published source']);
    for (const op of WEATHER_OPERATIONS) {
      const sources = LIMIT_SOURCES[op] as unknown as Record<string, { kind?: string } & Record<string, { kind: string }>>;
      for (const [key, value] of Object.entries(DEFAULT_LIMITS[op])) {
        if (typeof value === 'object') for (const k of Object.keys(value)) expect(kinds.has(sources[key][k].kind)).toBe(true);
        else expect(kinds.has(sources[key].kind!)).toBe(true);
      }
    }
  });
});

describe('forecast points', () => {
  it('when two fields are about a kilometre apart in one cell, then they share the point (0.05° grid, the rule in grid.ts)', () => {
    const a = gridCellOf(50.101, -101.51);
    const b = gridCellOf(50.11, -101.52);
    expect([a.latIndex, a.lonIndex]).toEqual([b.latIndex, b.lonIndex]);
    expect(a.latitude).toBe(50.1);
    expect(a.longitude).toBe(-101.5);
  });

  it('when a field is 0.05° away, then it has a point of its own', () => {
    expect(gridCellOf(50.15, -101.5).latIndex).not.toBe(gridCellOf(50.1, -101.5).latIndex);
  });

  it('when the boundary is a square, then its centre is the middle of its box', () => {
    const centre = boundaryCentre({
      type: 'Polygon',
      coordinates: [
        [
          [-101, 50],
          [-100, 50],
          [-100, 51],
          [-101, 51],
          [-101, 50],
        ],
      ],
    });
    expect(centre).toEqual([-100.5, 50.5]);
  });
});
