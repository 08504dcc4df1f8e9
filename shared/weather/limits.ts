// The weather limits per operation: what each rule family (rules.ts) compares the forecast with.
// Every default carries its source, shown in the farm settings and sent by the API. Wind is in
// km/h, temperatures in °C, rain in mm, times in hours, as the forecast rows of the API are; the
// screens convert to the farm's units. The owner may change every number (stored per farm).
import { mphToKmh } from '../units';

/** The operations the weather judges, in the order of a season. */
export const WEATHER_OPERATIONS = ['harrowing', 'seeding', 'spraying', 'swathing', 'combining'] as const;
export type WeatherOperation = (typeof WEATHER_OPERATIONS)[number];

/** Crops with a seeding soil-temperature minimum (the owner may change each number). */
export const SEED_CROPS = ['spring wheat', 'durum', 'barley', 'canola', 'field peas'] as const;
export type SeedCrop = (typeof SEED_CROPS)[number];

/** The label text that goes with every spraying verdict, whatever the verdict. */
export const SPRAY_LABEL_CAUTION = 'The label is the law; forecast wind is at 10 m — measure at boom height before you spray.';

export interface SprayingLimits {
  /** A no-go window makes a board conflict that blocks saving, not only a warning. */
  blocking: boolean;
  windMinKmh: number;
  windMaxKmh: number;
  /** No rain from the hour of spraying through this many hours after it. */
  rainFreeHours: number;
  /** An hour with at least this much precipitation counts as rain. */
  rainMm: number;
  /** A chance of rain at or above this, within the rain-free hours, is a caution. */
  rainChanceCautionPct: number;
  /** Delta T below this is no-go (droplets stay wet and drift far). */
  deltaTMinC: number;
  /** Delta T up to this is good; above it, caution. */
  deltaTGoodMaxC: number;
  /** Delta T above this is no-go (droplets evaporate before they land). */
  deltaTCautionMaxC: number;
  /** Inversion risk: wind under this … */
  inversionWindKmh: number;
  /** … with cloud cover at or under this (clear sky) … */
  inversionCloudMaxPct: number;
  /** … from this many hours before sunset at the field … */
  inversionBeforeSunsetHours: number;
  /** … until this many hours after the next sunrise, not included. */
  inversionAfterSunriseHours: number;
}

export interface HarrowingLimits {
  blocking: boolean;
  /** An hour with at least this much precipitation counts as rain: no-go. */
  rainMm: number;
  /** Straw stays wet this many hours after rain: no-go. */
  wetAfterRainHours: number;
  /** Air temperature minus dew point at or under this: dew on the straw, no-go. */
  dewSpreadC: number;
  /** Colder than this: caution (straw stays tough and does not spread). */
  coldBelowC: number;
}

export interface SeedingLimits {
  blocking: boolean;
  /** Soil temperature near seeding depth at or above which each crop may be seeded. */
  soilMinC: Record<SeedCrop, number>;
  /** An hour with at least this much precipitation is heavy rain: no-go. */
  heavyRainMm: number;
}

export interface HarvestLimits {
  blocking: boolean;
  /** An hour with at least this much precipitation counts as rain: no-go. */
  rainMm: number;
  /** The crop stays wet this many hours after rain: no-go. */
  afterRainHours: number;
  /** Relative humidity at or above this: caution (tough crop). */
  humidityCautionPct: number;
  /** Air temperature minus dew point at or under this: dew, caution. */
  dewSpreadC: number;
}

export interface WeatherLimits {
  harrowing: HarrowingLimits;
  seeding: SeedingLimits;
  spraying: SprayingLimits;
  swathing: HarvestLimits;
  combining: HarvestLimits;
}

/** Where a default comes from, in the three kinds the project allows. */
export type SourceKind = 'published' | 'from memory' | 'common practice, no published source';
export interface LimitSource {
  kind: SourceKind;
  /** The citation, or why the number was chosen. */
  note: string;
}

const COMMON = (note: string): LimitSource => ({ kind: 'common practice, no published source', note });
const MEMORY = (note: string): LimitSource => ({ kind: 'from memory', note });

export const DEFAULT_LIMITS: WeatherLimits = {
  harrowing: { blocking: false, rainMm: 0.2, wetAfterRainHours: 6, dewSpreadC: 1, coldBelowC: 5 },
  seeding: {
    blocking: false,
    soilMinC: { 'spring wheat': 4, durum: 5, barley: 3, canola: 5, 'field peas': 5 },
    heavyRainMm: 5,
  },
  spraying: {
    blocking: false,
    windMinKmh: mphToKmh(3),
    windMaxKmh: mphToKmh(10),
    rainFreeHours: 4,
    rainMm: 0.2,
    rainChanceCautionPct: 50,
    deltaTMinC: 2,
    deltaTGoodMaxC: 8,
    deltaTCautionMaxC: 10,
    inversionWindKmh: mphToKmh(3),
    inversionCloudMaxPct: 30,
    inversionBeforeSunsetHours: 2,
    inversionAfterSunriseHours: 2,
  },
  swathing: { blocking: false, rainMm: 0.2, afterRainHours: 4, humidityCautionPct: 90, dewSpreadC: 2 },
  combining: { blocking: false, rainMm: 0.2, afterRainHours: 12, humidityCautionPct: 70, dewSpreadC: 2 },
};

const WIND_SOURCE: LimitSource = {
  kind: 'published',
  note:
    'Wind 3 to 10 mph: pesticide labels as reported by extension services; without label directions 3 to 8 mph ' +
    '(National Pesticide Stewardship Alliance, "Evaluate the Weather"). The product label comes first.',
};
const DELTA_T_SOURCE = MEMORY('Delta T 2 to 8 °C good, 8 to 10 °C caution, under 2 or over 10 °C no-go: GRDC spray-application guidance');
const INVERSION_SOURCE = COMMON(
  'Inversions form under clear sky and light wind as the ground cools before sunset and last until it warms after sunrise',
);
const INVERSION_HOURS_SOURCE = COMMON(
  'From 2 hours before sunset until 2 hours after sunrise at the field (sunrise and sunset computed for its place and date)',
);
const BLOCKING_SOURCE = COMMON('A no-go forecast warns on the board unless the owner makes it blocking');

type SourcesOf<T> = { [K in keyof T]: T[K] extends Record<string, number> ? { [C in keyof T[K]]: LimitSource } : LimitSource };

/** The source of every default, key for key as in DEFAULT_LIMITS. */
export const LIMIT_SOURCES: { [O in WeatherOperation]: SourcesOf<WeatherLimits[O]> } = {
  harrowing: {
    blocking: BLOCKING_SOURCE,
    rainMm: COMMON('0.2 mm in an hour is the least rain a forecast shows as wet'),
    wetAfterRainHours: COMMON('Straw stays too wet to spread evenly for a few hours after rain'),
    dewSpreadC: COMMON('Dew forms when the air cools to within about 1 °C of its dew point'),
    coldBelowC: COMMON('Cold, damp straw stays tough and does not spread; the owner sets the number'),
  },
  seeding: {
    blocking: BLOCKING_SOURCE,
    soilMinC: {
      'spring wheat': MEMORY('Spring wheat germinates from about 4 °C soil temperature'),
      durum: MEMORY('Durum wants slightly warmer soil than spring wheat, about 5 °C'),
      barley: MEMORY('Barley germinates from about 3 °C soil temperature'),
      canola: MEMORY('Canola seeding from about 5 °C soil temperature'),
      'field peas': MEMORY('Field peas germinate from about 5 °C soil temperature'),
    },
    heavyRainMm: COMMON('5 mm in an hour puddles and seals the seedbed; the owner sets the number'),
  },
  spraying: {
    blocking: BLOCKING_SOURCE,
    windMinKmh: WIND_SOURCE,
    windMaxKmh: WIND_SOURCE,
    rainFreeHours: COMMON('Most products need a few dry hours to be rainfast; the label gives the product’s own time'),
    rainMm: COMMON('0.2 mm in an hour is the least rain a forecast shows as wet'),
    rainChanceCautionPct: COMMON('An even chance of rain or more is worth a second look'),
    deltaTMinC: DELTA_T_SOURCE,
    deltaTGoodMaxC: DELTA_T_SOURCE,
    deltaTCautionMaxC: DELTA_T_SOURCE,
    inversionWindKmh: INVERSION_SOURCE,
    inversionCloudMaxPct: INVERSION_SOURCE,
    inversionBeforeSunsetHours: INVERSION_HOURS_SOURCE,
    inversionAfterSunriseHours: INVERSION_HOURS_SOURCE,
  },
  swathing: {
    blocking: BLOCKING_SOURCE,
    rainMm: COMMON('0.2 mm in an hour is the least rain a forecast shows as wet'),
    afterRainHours: COMMON('A standing crop dries a few hours after rain before it cuts cleanly; the owner sets the number'),
    humidityCautionPct: COMMON('Very humid air keeps the crop tough; the owner sets the number'),
    dewSpreadC: COMMON('Dew forms when the air cools to within about 2 °C of its dew point'),
  },
  combining: {
    blocking: BLOCKING_SOURCE,
    rainMm: COMMON('0.2 mm in an hour is the least rain a forecast shows as wet'),
    afterRainHours: COMMON('Swaths and standing crop need about half a day to dry after rain; the owner sets the number'),
    humidityCautionPct: COMMON('Grain and straw take up moisture in humid air and thresh poorly; the owner sets the number'),
    dewSpreadC: COMMON('Dew forms when the air cools to within about 2 °C of its dew point'),
  },
};

/** The seeding crop of a crop-plan name ("Canola", "spring wheat"), if the table has it. */
export function seedCropOf(crop: string | null | undefined): SeedCrop | null {
  if (!crop) return null;
  const name = crop.trim().toLowerCase().replace(/\s+/g, ' ');
  const aliases: Record<string, SeedCrop> = {
    wheat: 'spring wheat',
    'hard red spring wheat': 'spring wheat',
    peas: 'field peas',
    'durum wheat': 'durum',
  };
  return (SEED_CROPS as readonly string[]).includes(name) ? (name as SeedCrop) : (aliases[name] ?? null);
}
