// What custom work is charged per operation when the owner has not set a rate: per acre or per
// hour, whole cents. One named survey is the source of every default:
//   USDA NASS (Northern Plains Regional Field Office) with North Dakota State University Extension,
//   "North Dakota 2020 Custom Rates" (statewide averages, fuel and labour included).
// Only the seeding figure was seen, and only as reported in a secondary summary; every other figure
// is a value recalled from memory, not read, and says so. Each default carries its source to the
// screen, and the owner's own rate overrides it.
import type { Operation } from './operations';
import type { SourceKind } from './weather/limits';

export const RATE_UNITS = ['acre', 'hour'] as const;
export type RateUnit = (typeof RATE_UNITS)[number];

export interface RateSource {
  kind: SourceKind;
  /** The citation, or why the number was chosen. */
  note: string;
}

export const ND_CUSTOM_RATES_2020 =
  'USDA NASS with North Dakota State University Extension, "North Dakota 2020 Custom Rates", statewide average';
const SEEN_SECONDARY = (what: string): RateSource => ({
  kind: 'published',
  note: `${ND_CUSTOM_RATES_2020}: ${what} (read in a secondary summary of the survey, not in the survey itself)`,
});
const RECALLED = (what: string): RateSource => ({
  kind: 'from memory',
  note: `${ND_CUSTOM_RATES_2020}: ${what}; values recalled from memory, not read`,
});

export interface RateDefault {
  unit: RateUnit;
  rateCents: number;
  source: RateSource;
}

/** The default rate of each operation, with where it comes from. */
export const RATE_DEFAULTS: Readonly<Record<Operation, RateDefault>> = {
  harrowing: { unit: 'acre', rateCents: 500, source: RECALLED('harrowing about $5 an acre') },
  tillage: { unit: 'acre', rateCents: 1300, source: RECALLED('field cultivating about $13 an acre') },
  seeding: {
    unit: 'acre',
    rateCents: 1782,
    source: SEEN_SECONDARY('small-grain seeding with fertilizer, average $17.82 an acre (range $7–30)'),
  },
  spraying: { unit: 'acre', rateCents: 700, source: RECALLED('ground spraying about $7 an acre') },
  swathing: { unit: 'acre', rateCents: 1500, source: RECALLED('swathing small grain about $15 an acre') },
  combining: { unit: 'acre', rateCents: 3200, source: RECALLED('combining small grain about $32 an acre') },
  baling: { unit: 'hour', rateCents: 9000, source: RECALLED('baling by the hour about $90 (the survey also gives rates per bale)') },
};

/** Bounds on what the owner may type: up to $1,000 an acre or $5,000 an hour. */
export const RATE_LIMITS = { acreCentsMax: 100_000, hourCentsMax: 500_000 } as const;
