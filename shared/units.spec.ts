import fc from 'fast-check';
import { ACRE_M2, HA_M2, acresToHa, haToAcres } from './units';

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
