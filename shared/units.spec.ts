import fc from 'fast-check';
import { ACRE_M2, HA_M2, INCH_MM, acresToHa, cDiffToF, cToF, fDiffToC, fToC, haToAcres, inToMm, kmhToMph, mmToIn, mphToKmh } from './units';

describe('hectares to acres', () => {
  // Definitions: 1 ha = 10,000 m² (SI Brochure, 9th ed., Table 8); 1 acre = 43,560 ft² with the
  // international foot of 0.3048 m = 4,046.856 422 4 m² (NIST Handbook 44, Appendix C; NIST SP 811).
  it('when the exact definitions are written out, then the constants match them', () => {
    expect(HA_M2).toBe(10_000);
    expect(ACRE_M2).toBe(4046.8564224);
  });

  it('when one acre is given in hectares (0.404 685 642 24 ha, from the definitions), then it is one acre', () => {
    expect(haToAcres(0.40468564224)).toBeCloseTo(1, 12);
  });

  it('when one hectare is converted, then it is 2.471 acres to four figures', () => {
    // NIST Handbook 44, Appendix C: 1 hectare = 2.471 acres (value recalled from memory); the exact
    // quotient 10,000 / 4,046.856 422 4 = 2.471 053 814 671 653 … (computed as a double-precision division).
    expect(haToAcres(1)).toBeCloseTo(2.471, 3);
    expect(haToAcres(1)).toBeCloseTo(2.471053814671653, 12);
  });

  it('when a quarter section (160 acres) is given in hectares (160 × 0.404 685 642 24 = 64.749 702 758 4 ha), then it is 160 acres', () => {
    expect(haToAcres(64.7497027584)).toBeCloseTo(160, 9);
  });

  it('when any area goes to hectares and back, then it is unchanged to 1e-12 of itself', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 1e6, noNaN: true }), (acres) => {
        expect(Math.abs(haToAcres(acresToHa(acres)) - acres)).toBeLessThanOrEqual(acres * 1e-12);
      }),
    );
  });
});

describe('weather units: km/h and mph, °C and °F, mm and inches', () => {
  // 1 mile = 1,609.344 m and 1 inch = 25.4 mm exactly (the international yard and pound of 1959;
  // NIST SP 811, Appendix B: values recalled from memory, and they are the constants units.ts writes out).
  it('when 10 mph is given in km/h (10 × 1.609 344 = 16.093 44), then it is 10 mph, and 100 km/h is 62.137 mph', () => {
    expect(kmhToMph(16.09344)).toBeCloseTo(10, 12);
    expect(mphToKmh(10)).toBeCloseTo(16.09344, 12);
    // 100 / 1.609 344 = 62.137 119 2 … (a double-precision division).
    expect(kmhToMph(100)).toBeCloseTo(62.1371192, 7);
  });

  it('when a speed goes to mph and back, then it is unchanged to 1e-12 of itself', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 500, noNaN: true }), (kmh) => {
        expect(Math.abs(mphToKmh(kmhToMph(kmh)) - kmh)).toBeLessThanOrEqual(kmh * 1e-12);
      }),
    );
  });

  // NIST SP 811, section 4.2.1.1 and Appendix B.9 (from memory): t/°F = 1.8 t/°C + 32. Check
  // values: water freezes at 0 °C = 32 °F and boils at 100 °C = 212 °F at standard pressure, and
  // the scales meet at −40 (general reference values).
  it('when the fixed points of water and the meeting point of the scales are converted, then they match', () => {
    expect(cToF(0)).toBe(32);
    expect(cToF(100)).toBe(212);
    expect(cToF(-40)).toBe(-40);
    expect(fToC(32)).toBe(0);
    expect(fToC(212)).toBe(100);
    expect(fToC(-40)).toBe(-40);
    expect(fToC(41)).toBeCloseTo(5, 12);
  });

  it('when a temperature difference is converted, then it is scaled by 1.8 without the 32 offset (10 °C apart is 18 °F apart)', () => {
    // From the same definition: (1.8 a + 32) − (1.8 b + 32) = 1.8 (a − b).
    expect(cDiffToF(10)).toBe(18);
    expect(fDiffToC(18)).toBe(10);
    expect(cToF(30) - cToF(20)).toBeCloseTo(cDiffToF(10), 12);
  });

  it('when a temperature goes to °F and back, then it is unchanged to 1e-9 °C', () => {
    fc.assert(
      fc.property(fc.double({ min: -60, max: 60, noNaN: true }), (c) => {
        expect(Math.abs(fToC(cToF(c)) - c)).toBeLessThanOrEqual(1e-9);
      }),
    );
  });

  it('when one inch of rain is given in millimetres (25.4 mm), then it is one inch', () => {
    expect(INCH_MM).toBe(25.4);
    expect(mmToIn(25.4)).toBe(1);
    expect(inToMm(0.5)).toBe(12.7);
  });
});
