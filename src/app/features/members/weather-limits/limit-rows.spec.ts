import fc from 'fast-check';
import { weatherLimitsBody } from '@shared/schemas/weather';
import { DEFAULT_LIMITS, WEATHER_OPERATIONS } from '@shared/weather/limits';
import { ApiError } from '../../../core/http/api-error';
import { placeServerErrors } from '../../../shared/forms/field-labels';
import {
  LIMIT_ROWS,
  WEATHER_LIMIT_FIELDS,
  limitsBody,
  rowValues,
  shownRange,
  shownText,
  shownUnit,
  shownValue,
  siValue,
} from './limit-rows';

/** Every key path of a nested object whose value is not an object (`seeding.soilMinC.canola`). */
function leafKeys(obj: object, prefix = ''): string[] {
  return Object.entries(obj).flatMap(([k, v]) =>
    v && typeof v === 'object' ? leafKeys(v as object, `${prefix}${k}.`) : [`${prefix}${k}`],
  );
}

describe('the weather limits table', () => {
  it('when the defaults are listed key by key, then every number has a row and every key a labelled box', () => {
    const numbers = leafKeys(DEFAULT_LIMITS).filter((k) => !k.endsWith('.blocking'));
    expect(LIMIT_ROWS.map((r) => r.key).sort()).toEqual(numbers.sort());
    expect(Object.keys(WEATHER_LIMIT_FIELDS).sort()).toEqual(leafKeys(DEFAULT_LIMITS).sort());
    const labels = Object.values(WEATHER_LIMIT_FIELDS).map((f) => f.label);
    expect(new Set(labels).size).toBe(labels.length);
    for (const op of WEATHER_OPERATIONS) expect(WEATHER_LIMIT_FIELDS[`${op}.blocking`]).toBeDefined();
  });

  it('when the defaults go through the screen unchanged, in either units, then the body is the defaults and the schema takes it', () => {
    for (const system of ['us', 'metric'] as const) {
      const base = rowValues(DEFAULT_LIMITS);
      const shown = Object.fromEntries(LIMIT_ROWS.map((r) => [r.control, shownValue(base[r.control], r.quantity, system)]));
      const blocking = Object.fromEntries(WEATHER_OPERATIONS.map((o) => [`${o}/blocking`, false]));
      const body = limitsBody(DEFAULT_LIMITS, shown, base, blocking, system);
      expect(body).toEqual(DEFAULT_LIMITS);
      expect(weatherLimitsBody.safeParse(body).success).toBe(true);
    }
  });

  it('when any number is typed in the farm units at its precision, then it reads back as the same number after the trip to SI', () => {
    for (const system of ['us', 'metric'] as const) {
      for (const row of LIMIT_ROWS) {
        const { min, max } = shownRange(row, system);
        const scale = 10 ** shownUnit(row.quantity, system).digits;
        fc.assert(
          fc.property(fc.integer({ min: Math.round(min * scale), max: Math.round(max * scale) }), (n) => {
            const typed = n / scale;
            // A base that shows another number, so the typed one is converted.
            const base = Number.NaN;
            const si = siValue(typed, base, row.quantity, system);
            expect(shownValue(si, row.quantity, system)).toBe(typed);
          }),
          { numRuns: 200 },
        );
      }
    }
  });

  it('when any stored SI number is shown and sent back unchanged, then the very same number goes back', () => {
    for (const system of ['us', 'metric'] as const) {
      for (const row of LIMIT_ROWS) {
        fc.assert(
          fc.property(fc.double({ min: -20, max: 60, noNaN: true }), (si) => {
            expect(siValue(shownValue(si, row.quantity, system), si, row.quantity, system)).toBe(si);
          }),
          { numRuns: 50 },
        );
      }
    }
  });

  it('when values are written out, then each carries the farm unit (10 mph = 16.093 44 km/h; 5 °C = 41 °F)', () => {
    const row = (key: string) => LIMIT_ROWS.find((r) => r.key === key)!;
    expect(shownText(16.09344, row('spraying.windMaxKmh').quantity, 'us')).toBe('10.0 mph');
    expect(shownText(5, row('harrowing.coldBelowC').quantity, 'us')).toBe('41.0 °F');
    expect(shownText(2, row('spraying.inversionBeforeSunsetHours').quantity, 'us')).toBe('2.0 h');
    expect(shownText(90, row('swathing.humidityCautionPct').quantity, 'metric')).toBe('90 %');
  });

  it('when the server names a limit in its refusal, then the message names the box by its label, never the key', () => {
    const err = new ApiError(400, 'invalid_input', 'Check the request body: seeding.soilMinC.canola …', {
      'seeding.soilMinC.canola': 'A soil temperature minimum must be at most 30 °C',
    });
    expect(placeServerErrors(err, WEATHER_LIMIT_FIELDS)).toEqual({
      byControl: { 'seeding/soilMinC/canola': 'A soil temperature minimum must be at most 30 °C' },
      message: 'Check Soil temperature minimum, canola (seeding): A soil temperature minimum must be at most 30 °C',
    });
  });
});
