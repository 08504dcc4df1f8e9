import * as units from '../units';
import {
  ACRE_MPH_FT,
  effectiveCapacityAcPerH,
  effectiveCapacityHaPerH,
  fieldCapacityAcPerH,
  fieldCapacityHaPerH,
  theoreticalCapacityAcPerH,
} from './field-capacity';
import { IMPLEMENT_DEFAULTS } from './implement-defaults';

describe('units', () => {
  it('when converting feet, acres and miles, then the exact international-foot values hold', () => {
    // Source: NIST & NOAA/NGS, "Deprecation of the U.S. Survey Foot", 85 FR 62698 (2020): 1 ft = 0.3048 m exactly.
    expect(units.FT_M).toBe(0.3048);
    expect(units.ftToM(1)).toBe(0.3048);
    // 1 acre = 43,560 ft² = 4,046.856 422 4 m² (follows from the foot); 1 mile = 5,280 ft = 1,609.344 m.
    expect(units.ACRE_M2).toBe(4046.8564224);
    expect(Math.abs(units.acresToM2(1) - 43_560 * 0.3048 ** 2)).toBeLessThan(1e-9);
    expect(units.MILE_M).toBe(1609.344);
    // Source: SI Brochure: 1 ha = 10,000 m² (from memory).
    expect(units.m2ToHa(10_000)).toBe(1);
    expect(units.acresToHa(1)).toBeCloseTo(0.40468564224, 12);
    // 5 mph = 5 × 1609.344 m / 3600 s (definitions).
    expect(units.mphToMps(5)).toBeCloseTo(2.2352, 12);
    expect(units.kmhToMps(36)).toBeCloseTo(10, 12);
    expect(units.mpsToMph(units.mphToMps(7.3))).toBeCloseTo(7.3, 12);
    expect(units.mToFt(units.ftToM(84))).toBeCloseTo(84, 12);
    expect(units.m2ToAcres(units.acresToM2(160))).toBeCloseTo(160, 10);
  });
});

describe('field capacity', () => {
  it('when the AEN-73 constant is derived, then it is 43,560 / 5,280 = 8.25', () => {
    // Source: Hancock, Swetnam & Benson, AEN-73, University of Kentucky (1991).
    expect(ACRE_MPH_FT).toBe(8.25);
  });

  it('when the Iowa State PM 696 worked examples are computed, then they give 6.4 / 7.8 / 9.0 / 20.4 ac/h', () => {
    // Source: Iowa State University Extension, "Estimating Field Capacity of Farm Machines", PM 696 (rev. 2001):
    // chisel plows 11 ft 3 in, 13 ft 9 in, 16 ft 3 in at 5.5 mph and 85 / 85 / 83 %; spreader 40 ft at 6 mph, 70 %.
    expect(effectiveCapacityAcPerH(11.25, 5.5, 0.85).toFixed(1)).toBe('6.4');
    expect(effectiveCapacityAcPerH(13.75, 5.5, 0.85).toFixed(1)).toBe('7.8');
    expect(effectiveCapacityAcPerH(16.25, 5.5, 0.83).toFixed(1)).toBe('9.0');
    expect(effectiveCapacityAcPerH(40, 6, 0.7).toFixed(1)).toBe('20.4');
  });

  it('when a plan stores SI (width in m, speed in m/s), then its capacity still gives the PM 696 worked examples', () => {
    // Source: Iowa State University Extension, PM 696 (rev. 2001), as above; the inputs are the
    // examples' feet and mph converted by the exact definitions (1 ft = 0.3048 m, 1 mph = 0.447 04 m/s,
    // NIST Handbook 44, Appendix C), so only the published arithmetic is left to check.
    const si = (ft: number, mph: number, e: number) => fieldCapacityAcPerH(units.ftToM(ft), units.mphToMps(mph), e).toFixed(1);
    expect(si(11.25, 5.5, 0.85)).toBe('6.4');
    expect(si(13.75, 5.5, 0.85)).toBe('7.8');
    expect(si(16.25, 5.5, 0.83)).toBe('9.0');
    expect(si(40, 6, 0.7)).toBe('20.4');
    // The same quantity as the AEN-73 form (ft × mph × efficiency ÷ 8.25), to rounding error.
    expect(fieldCapacityAcPerH(units.ftToM(40), units.mphToMps(6), 0.7)).toBeCloseTo(effectiveCapacityAcPerH(40, 6, 0.7), 12);
    // Source: GRDC (Australia): ha/h = km/h × m × efficiency ÷ 10; 12 m at 10 km/h and 80 % is 9.6 ha/h.
    expect(fieldCapacityHaPerH(12, units.kmhToMps(10), 0.8)).toBeCloseTo(9.6, 12);
  });

  it('when a 70 ft harrow runs at 8.3 mph, then it covers about 70 acres an hour before efficiency', () => {
    // A practitioner's figure: common practice, no published source.
    expect(theoreticalCapacityAcPerH(70, 8.3)).toBeGreaterThan(68);
    expect(theoreticalCapacityAcPerH(70, 8.3)).toBeLessThan(72);
  });

  it('when the metric form is used, then ha/h = km/h × m × efficiency / 10 and agrees with the acre form', () => {
    // Source: GRDC (Australia) field-capacity article: ha/h = speed (km/h) × width (m) × efficiency / 10.
    expect(effectiveCapacityHaPerH(12, 10, 0.8)).toBeCloseTo(9.6, 12);
    // The two published forms describe the same quantity: convert the AEN-73 result to hectares.
    const acH = effectiveCapacityAcPerH(40, 6, 0.7);
    const haH = effectiveCapacityHaPerH(units.ftToM(40), units.mphToKmh(6), 0.7);
    expect(units.acresToHa(acH)).toBeCloseTo(haH, 10);
  });

  it('when implement defaults are listed, then each cites its source and lies in the D497 ranges', () => {
    // Ranges: ASABE D497.7 Table 3, from memory (see the table in implement-defaults.ts).
    for (const d of Object.values(IMPLEMENT_DEFAULTS)) {
      expect(d.source).toMatch(/ASABE D497\.7 Table 3, from memory|common practice, no published source/);
      expect(d.efficiency).toBeGreaterThanOrEqual(0.5);
      expect(d.efficiency).toBeLessThanOrEqual(0.9);
      expect(units.mpsToMph(d.speedMps)).toBeGreaterThanOrEqual(2);
      expect(units.mpsToMph(d.speedMps)).toBeLessThanOrEqual(8);
    }
  });
});
