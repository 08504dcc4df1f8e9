/**
 * Exact unit constants and converters used everywhere in Furlong.
 *
 * The foot is the international foot: 1 ft = 0.3048 m exactly. The US survey foot was deprecated
 * from 2023-01-01 (NIST & NOAA/NGS, "Deprecation of the U.S. Survey Foot", 85 FR 62698, 2020).
 */

/** Metres in one international foot, exact (85 FR 62698). */
export const FT_M = 0.3048;
/** Square metres in one acre: 43,560 ft² × 0.3048² m²/ft², exact. */
export const ACRE_M2 = 4046.856_422_4; // = 43,560 × 0.3048² exactly; written as a literal because the float product rounds up
/** Metres in one statute mile: 5,280 ft, exact. */
export const MILE_M = 1609.344; // = 5,280 × 0.3048
/** Square metres in one hectare (SI Brochure). */
export const HA_M2 = 10_000;
/** Seconds in one hour. */
export const HOUR_S = 3_600;

/**
 * Feet to metres.
 * @param ft length in international feet
 * @returns length in metres
 * @example ftToM(60) // 18.288
 */
export const ftToM = (ft: number): number => ft * FT_M;

/**
 * Metres to feet.
 * @param m length in metres
 * @returns length in international feet
 * @example mToFt(18.288) // 60
 */
export const mToFt = (m: number): number => m / FT_M;

/**
 * Square metres to acres.
 * @param m2 area in square metres
 * @returns area in acres
 * @example m2ToAcres(4046.8564224) // 1
 */
export const m2ToAcres = (m2: number): number => m2 / ACRE_M2;

/**
 * Acres to square metres.
 * @param acres area in acres
 * @returns area in square metres
 * @example acresToM2(640) // 2589988.110336
 */
export const acresToM2 = (acres: number): number => acres * ACRE_M2;

/**
 * Square metres to hectares.
 * @param m2 area in square metres
 * @returns area in hectares
 * @example m2ToHa(25_000) // 2.5
 */
export const m2ToHa = (m2: number): number => m2 / HA_M2;

/**
 * Hectares to square metres.
 * @param ha area in hectares
 * @returns area in square metres
 * @example haToM2(2.5) // 25000
 */
export const haToM2 = (ha: number): number => ha * HA_M2;

/**
 * Acres to hectares.
 * @param acres area in acres
 * @returns area in hectares
 * @example acresToHa(1) // 0.40468564224
 */
export const acresToHa = (acres: number): number => (acres * ACRE_M2) / HA_M2;

/**
 * Hectares to acres.
 *
 * Exact definitions: 1 ha = 10,000 m² (a square hectometre; SI Brochure, 9th ed., Table 8) and
 * 1 acre = 43,560 ft² = 4,046.856 422 4 m² with the international foot of 0.3048 m (NIST Handbook 44,
 * Appendix C; NIST SP 811, Appendix B), so 1 ha = 10,000 / 4,046.856 422 4 acres ≈ 2.471 053 8 acres.
 *
 * @param ha area in hectares
 * @returns area in acres
 * @example haToAcres(0.40468564224) // 1
 * @example haToAcres(64.75) // ≈ 160.0 (a quarter section, 160 acres, is 64.75 ha)
 */
export const haToAcres = (ha: number): number => (ha * HA_M2) / ACRE_M2;

/**
 * Miles per hour to metres per second.
 * @param mph speed in statute miles per hour
 * @returns speed in metres per second
 * @example mphToMps(5) // 2.2352
 */
export const mphToMps = (mph: number): number => (mph * MILE_M) / HOUR_S;

/**
 * Metres per second to miles per hour.
 * @param mps speed in metres per second
 * @returns speed in statute miles per hour
 * @example mpsToMph(2.2352) // 5
 */
export const mpsToMph = (mps: number): number => (mps * HOUR_S) / MILE_M;

/**
 * Kilometres per hour to metres per second.
 * @param kmh speed in kilometres per hour
 * @returns speed in metres per second
 * @example kmhToMps(36) // 10
 */
export const kmhToMps = (kmh: number): number => kmh / 3.6;

/**
 * Metres per second to kilometres per hour.
 * @param mps speed in metres per second
 * @returns speed in kilometres per hour
 * @example mpsToKmh(10) // 36
 */
export const mpsToKmh = (mps: number): number => mps * 3.6;

/**
 * Miles per hour to kilometres per hour.
 * @param mph speed in statute miles per hour
 * @returns speed in kilometres per hour
 * @example mphToKmh(5) // 8.04672
 */
export const mphToKmh = (mph: number): number => (mph * MILE_M) / 1000;

/**
 * Miles to metres.
 * @param miles distance in statute miles
 * @returns distance in metres
 * @example milesToM(1) // 1609.344
 */
export const milesToM = (miles: number): number => miles * MILE_M;

/**
 * Kilometres per hour to miles per hour (1 mile = 1,609.344 m exactly, so 1 mph = 1.609 344 km/h).
 * @param kmh speed in kilometres per hour
 * @returns speed in statute miles per hour
 * @example kmhToMph(16.09344) // 10
 */
export const kmhToMph = (kmh: number): number => (kmh * 1000) / MILE_M;

/** Millimetres in one inch, exact (the international inch: 1 in = 25.4 mm). */
export const INCH_MM = 25.4;

/**
 * Millimetres to inches (rain amounts).
 * @param mm length in millimetres
 * @returns length in inches
 * @example mmToIn(25.4) // 1
 */
export const mmToIn = (mm: number): number => mm / INCH_MM;

/**
 * Inches to millimetres (rain amounts).
 * @param inches length in inches
 * @returns length in millimetres
 * @example inToMm(0.5) // 12.7
 */
export const inToMm = (inches: number): number => inches * INCH_MM;

/**
 * A temperature in degrees Celsius to degrees Fahrenheit: t/°F = 1.8 · t/°C + 32.
 * @param c temperature in °C
 * @returns temperature in °F
 * @example cToF(100) // 212
 */
export const cToF = (c: number): number => c * 1.8 + 32;

/**
 * A temperature in degrees Fahrenheit to degrees Celsius: t/°C = (t/°F − 32) / 1.8.
 * @param f temperature in °F
 * @returns temperature in °C
 * @example fToC(41) // 5
 */
export const fToC = (f: number): number => (f - 32) / 1.8;

/**
 * A temperature difference (Delta T, dew-point spread) in kelvins or °C to °F: a degree Fahrenheit
 * is 1/1.8 of a degree Celsius, with no offset for a difference.
 * @param c temperature difference in °C
 * @returns temperature difference in °F
 * @example cDiffToF(10) // 18
 */
export const cDiffToF = (c: number): number => c * 1.8;

/**
 * A temperature difference in °F to °C (no offset).
 * @param f temperature difference in °F
 * @returns temperature difference in °C
 * @example fDiffToC(18) // 10
 */
export const fDiffToC = (f: number): number => f / 1.8;
