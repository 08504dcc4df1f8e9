import fc from 'fast-check';
import { roundTo } from './round';
import {
  FIGURE_DECIMALS,
  billedQuantity,
  compassPoint,
  compassWords,
  formatPassHeading,
  cropName,
  csvNumber,
  figure,
  formatAcres,
  formatArea,
  formatAge,
  formatAreaRate,
  formatCount,
  formatDistance,
  formatEngineHours,
  formatHeading,
  formatHectares,
  formatHours,
  formatLength,
  formatPercent,
  formatRain,
  formatSpeed,
  formatTemperature,
  formatTemperatureDifference,
  formatWidth,
  formatWind,
  weatherNumber,
} from './figures';

// Outside references:
// - ECMA-402 (Intl.NumberFormat), roundingMode "halfExpand": ties away from zero, on the exact value
//   of the Number. `ref` below is a plain en-US formatter built here, not the module's.
// - ECMA-262 Number.prototype.toFixed, which rounds the exact binary value (shown where it differs).
// - Unit definitions: 1 ft = 0.3048 m, 1 acre = 4,046.856 422 4 m², 1 mile = 1,609.344 m (NIST
//   Handbook 44, Appendix C; NIST SP 811, Appendix B).
const ref = (decimals: number, n: number) =>
  new Intl.NumberFormat('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals }).format(n);

describe('figures', () => {
  it('when the same acres go to the app, a mail or a CSV, then each shows one decimal (822.66 ac → 822.7 ac)', () => {
    expect(formatAcres(822.66)).toBe('822.7 ac');
    expect(formatAcres(378.09)).toBe('378.1 ac');
    expect(formatAcres(1234.56)).toBe('1,234.6 ac');
    expect(csvNumber(1234.56, FIGURE_DECIMALS.area)).toBe('1234.6');
    expect(formatArea(822.66, 'us')).toBe('822.7 ac');
    // 640 ac = 258.998 811 033 6 ha (NIST SP 811 acre and hectare).
    expect(formatArea(640, 'metric')).toBe('259.0 ha');
    expect(formatHectares(64.75)).toBe('64.8 ha');
  });

  it('when hours are shown, then worked, planned and engine hours all have one decimal (55.18 h → 55.2 h)', () => {
    expect(formatHours(55.18)).toBe('55.2 h');
    expect(formatHours(5)).toBe('5.0 h');
    expect(formatEngineHours(1234.56)).toBe('1,234.6 h');
  });

  it('when a width is shown, then feet have one decimal and metres two (60 ft = 18.288 m exactly)', () => {
    expect(formatWidth(18.288, 'us')).toBe('60.0 ft');
    expect(formatWidth(18.288, 'metric')).toBe('18.29 m');
    // 84 ft = 25.6032 m.
    expect(formatWidth(25.6032, 'us')).toBe('84.0 ft');
  });

  it('when a hazard clearance is shown, then it is whole feet or whole metres, in one unit (100 ft = 30.48 m exactly)', () => {
    expect(formatLength(30.48, 'us')).toBe('100 ft');
    // Not "30.5 m" (the tenth the work-order mail wrote beside the feet).
    expect(formatLength(30.48, 'metric')).toBe('30 m');
    // 10 m = 32.808 ft; 3 m = 9.843 ft.
    expect(formatLength(10, 'us')).toBe('33 ft');
    expect(formatLength(3, 'us')).toBe('10 ft');
    // 1 mile = 5,280 ft = 1,609.344 m: grouped like every figure for people.
    expect(formatLength(1609.344, 'us')).toBe('5,280 ft');
    expect(FIGURE_DECIMALS.length).toBe(0);
  });

  it('when a speed stored in m/s is shown, then mph or km/h have one decimal', () => {
    // 1 mile = 1,609.344 m exactly (NIST Handbook 44, Appendix C), so 1 mph = 0.447 04 m/s and
    // 1 m/s = 3.6 km/h (SI Brochure, from memory).
    expect(formatSpeed(2.2352, 'us')).toBe('5.0 mph'); // 5 mph
    expect(formatSpeed(2.2352, 'metric')).toBe('8.0 km/h'); // 8.046 72 km/h
    expect(formatSpeed(2.90576, 'metric')).toBe('10.5 km/h'); // 6.5 mph = 10.460 736 km/h
    expect(formatSpeed(2.45872, 'us')).toBe('5.5 mph'); // 5.5 mph
    expect(formatSpeed(10 / 3.6, 'metric')).toBe('10.0 km/h');
    expect(formatSpeed(10 / 3.6, 'us')).toBe('6.2 mph'); // 10 km/h = 6.213 7 mph
  });

  it('when a distance driven or a work rate is shown, then miles or kilometres and ac/h or ha/h have one decimal', () => {
    // 1 mile = 1,609.344 m exactly (NIST Handbook 44, Appendix C).
    expect(formatDistance(1609.344, 'us')).toBe('1.0 mi');
    expect(formatDistance(1609.344, 'metric')).toBe('1.6 km');
    expect(formatDistance(20_000, 'us')).toBe('12.4 mi'); // 12.427 4 mi
    expect(formatDistance(1_234_560, 'metric')).toBe('1,234.6 km');
    // Worked example of the field-capacity rule, 60 ft × 5 mph × 0.70 ÷ 8.25 = 25.45 ac/h (the rule
    // of Hancock, Swetnam and Benson, AEN-73, University of Kentucky, 1991; the arithmetic is ours).
    expect(formatAreaRate((60 * 5 * 0.7) / 8.25, 'us')).toBe('25.5 ac/h');
    // The metric rule, 18.29 m × 8 km/h × 0.70 ÷ 10 = 10.24 ha/h (same rule in SI units).
    expect(formatAreaRate((18.29 * 8 * 0.7) / 10, 'metric')).toBe('10.2 ha/h');
    expect(formatCount(1234)).toBe('1,234');
    expect(formatCount(96.5)).toBe('97');
    for (const n of [null, undefined, Number.NaN]) {
      expect(formatDistance(n, 'us')).toBe('—');
      expect(formatAreaRate(n, 'metric')).toBe('—');
      expect(formatCount(n)).toBe('—');
    }
  });

  it('when a forecast age is shown, then whole minutes under an hour and hours with one decimal after, like every hour figure', () => {
    expect(formatAge(25)).toBe('25 min');
    expect(formatAge(0)).toBe('0 min');
    expect(formatAge(-2)).toBe('0 min'); // clocks a little apart
    expect(formatAge(59.4)).toBe('59 min');
    expect(formatAge(59.6)).toBe('1.0 h'); // never "60 min"
    expect(formatAge(90)).toBe('1.5 h');
    expect(formatAge(120)).toBe('2.0 h'); // as formatHours(2), not "2 h"
    expect(formatAge(700)).toBe('11.7 h'); // 700 min = 11.666… h, not rounded to "12 h"
    expect(formatAge(120)).toBe(formatHours(2));
    expect(formatAge(null)).toBe('—');
  });

  it('when a value is exactly half way, then it rounds away from zero (ECMA-402 halfExpand), unlike roundTo for negatives', () => {
    // 0.25, 0.125 and 2.5 are exact binary fractions, so these are true ties.
    expect(figure(0.25, 1)).toBe('0.3');
    expect(figure(-0.25, 1)).toBe('-0.3');
    expect(figure(0.125, 2)).toBe('0.13');
    expect(figure(-0.125, 2)).toBe('-0.13');
    expect(figure(2.5, 0)).toBe('3');
    expect(figure(-2.5, 0)).toBe('-3');
    expect(String(roundTo(-0.125, 2))).toBe('-0.12'); // Math.round takes ties up, not away from zero
  });

  it('when a value is written as a tie (822.65), then that written decimal rounds away from zero, not the binary value behind it', () => {
    // The double nearest 822.65 is 822.649 999…; ECMA-262 toFixed rounds that exact value down, while
    // ICU (behind Intl.NumberFormat) rounds the shortest decimal that reads back as the same double.
    expect((822.65).toFixed(1)).toBe('822.6');
    expect(ref(1, 822.65)).toBe('822.7');
    expect(formatAcres(822.65)).toBe('822.7 ac');
    expect(csvNumber(822.65, 1)).toBe('822.7');
    expect(figure(1.005, 2)).toBe('1.01');
  });

  it('when a value rounds to zero, then it shows without a minus sign', () => {
    expect(figure(-0.04, 1)).toBe('0.0');
    expect(csvNumber(-0.004, 2)).toBe('0.00');
  });

  it('when there is no value, then people read a dash and a CSV cell is empty', () => {
    for (const n of [null, undefined, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(formatAcres(n)).toBe('—');
      expect(formatHours(n)).toBe('—');
      expect(formatWidth(n, 'us')).toBe('—');
      expect(formatSpeed(n, 'metric')).toBe('—');
      expect(formatLength(n, 'us')).toBe('—');
      expect(csvNumber(n, 1)).toBe('');
    }
  });

  it('when any value is formatted, then it equals the en-US Intl.NumberFormat reference and the CSV digits are the same number', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e9, max: 1e9, noNaN: true }), fc.integer({ min: 0, max: 3 }), (n, d) => {
        const shown = figure(n, d);
        const expected = ref(d, n);
        // The reference writes "-0.0" for a negative value that rounds to zero; the module drops the sign.
        expect(shown).toBe(/^-0(\.0+)?$/.test(expected) ? expected.slice(1) : expected);
        expect(csvNumber(n, d)).toBe(shown.replaceAll(',', ''));
      }),
    );
  });

  it('when a crop is typed in any case, then it reads in sentence case', () => {
    expect(cropName('spring wheat')).toBe('Spring wheat');
    expect(cropName('Spring Wheat')).toBe('Spring wheat');
    expect(cropName('  SPRING   wheat ')).toBe('Spring wheat');
    expect(cropName('durum')).toBe('Durum');
    expect(cropName('')).toBeNull();
    expect(cropName(null)).toBeNull();
  });
});

describe('weather figures and headings', () => {
  it('when a temperature is shown, then °F for US units and °C for metric, one decimal', () => {
    // °F = °C × 9/5 + 32 (NIST SP 811, appendix B.8): 20 °C = 68 °F; 3.2 °C = 37.76 °F.
    expect(formatTemperature(20, 'us')).toBe('68.0 °F');
    expect(formatTemperature(3.2, 'us')).toBe('37.8 °F');
    expect(formatTemperature(20, 'metric')).toBe('20.0 °C');
    // −40 is the same on both scales (NIST SP 811, B.8 formula).
    expect(formatTemperature(-40, 'us')).toBe('-40.0 °F');
    expect(formatTemperature(null, 'us')).toBe('—');
  });

  it('when a temperature difference is shown, then × 9/5 without the 32 in °F', () => {
    // A temperature interval of 1 °C = 1.8 °F (NIST SP 811, B.8).
    expect(formatTemperatureDifference(5, 'us')).toBe('9.0 °F');
    expect(formatTemperatureDifference(5, 'metric')).toBe('5.0 °C');
  });

  it('when a wind speed is shown, then mph for US units and km/h for metric, one decimal', () => {
    // 30 km/h ÷ 1.609344 km/mile (international mile, 1959 agreement) = 18.64 mph.
    expect(formatWind(30, 'us')).toBe('18.6 mph');
    expect(formatWind(30, 'metric')).toBe('30.0 km/h');
    // 16.09344 km/h is exactly 10 mph (same definition).
    expect(formatWind(16.09344, 'us')).toBe('10.0 mph');
    expect(weatherNumber(30, 'wind', 'us')).toBe('18.6');
    expect(formatWind(undefined, 'metric')).toBe('—');
  });

  it('when rain is shown, then inches to the hundredth for US units and mm to the tenth for metric', () => {
    // 1 in = 25.4 mm exactly (international inch, 1959 agreement); 2.5 mm = 0.0984 in.
    expect(formatRain(25.4, 'us')).toBe('1.00 in');
    expect(formatRain(2.5, 'us')).toBe('0.10 in');
    expect(formatRain(2.5, 'metric')).toBe('2.5 mm');
    expect(formatRain(0, 'metric')).toBe('0.0 mm');
  });

  it('when a share is shown, then whole per cent with a space before the sign', () => {
    expect(formatPercent(49.6)).toBe('50 %');
    expect(formatPercent(5)).toBe('5 %');
    expect(formatPercent(null)).toBe('—');
  });

  it('when a heading is shown, then one decimal within the turn, 180° of a plan reading 0°', () => {
    expect(formatHeading(81.37, 180)).toBe('81.4°');
    expect(formatHeading(90, 180)).toBe('90.0°');
    expect(formatHeading(179.97, 180)).toBe('0.0°');
    expect(formatHeading(270, 180)).toBe('90.0°');
    expect(formatHeading(-90)).toBe('270.0°');
    expect(formatHeading(359.96)).toBe('0.0°');
    expect(formatHeading(null)).toBe('—');
  });

  it('when a wind direction is given, then the nearest of eight compass points and its words', () => {
    // Meteorological convention: the direction the wind blows from, clockwise from north (WMO No. 8, ch. 5).
    expect([0, 44, 45, 90, 135, 180, 200, 225, 270, 315, 337, 338, 360].map((d) => compassPoint(d))).toEqual([
      'N',
      'NE',
      'NE',
      'E',
      'SE',
      'S',
      'S',
      'SW',
      'W',
      'NW',
      'NW',
      'N',
      'N',
    ]);
    expect(compassPoint(null)).toBeNull();
    expect(compassWords(225)).toBe('from the south-west');
  });

  it('writes the way passes run as the two opposite compass points of their line', () => {
    // Bearings clockwise from true north (0° north, 90° east), eight points 45° apart, as above.
    expect(formatPassHeading(0)).toBe('0.0° (north–south)');
    expect(formatPassHeading(90)).toBe('90.0° (east–west)');
    expect(formatPassHeading(45)).toBe('45.0° (north-east–south-west)');
    expect(formatPassHeading(135)).toBe('135.0° (south-east–north-west)');
    expect(formatPassHeading(100)).toBe('100.0° (east–west)');
    expect(formatPassHeading(179.9)).toBe('179.9° (north–south)');
    expect(formatPassHeading(270)).toBe('90.0° (east–west)');
    expect(formatPassHeading(null)).toBe('—');
  });
});

describe('billed quantities', () => {
  // Worked by hand: the invoice line's amount is quantity × rate (shared/invoice-math.ts), so the
  // figure shown must carry every stored decimal (numeric(12,4)) for the reader to redo it.
  it('shows every decimal the amount was worked from: at least two, up to four', () => {
    expect(billedQuantity(100.25, 'acre')).toBe('100.25 ac');
    expect(billedQuantity(78.4, 'acre')).toBe('78.40 ac');
    expect(billedQuantity(118.4567, 'acre')).toBe('118.4567 ac');
    expect(billedQuantity(118.456, 'acre')).toBe('118.456 ac');
    expect(billedQuantity(3.75, 'hour')).toBe('3.75 h');
    expect(billedQuantity(40)).toBe('40.00');
    expect(billedQuantity(1234.5)).toBe('1,234.50');
  });

  it('shows a figure that, parsed back, is the quantity to its four stored decimals', () => {
    // Property: for any quantity numeric(12,4) holds, the text read back (grouping removed) is
    // the same number (common practice for a lossless display, no published source).
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 999_999_999_999 }), (tenThousandths) => {
        const q = tenThousandths / 10_000;
        return Number(billedQuantity(q).replace(/,/g, '')) === q;
      }),
    );
  });
});
