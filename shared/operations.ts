import type { ImplementKind } from './plan/implement-defaults';

/** Field operations Furlong plans and tracks, in the order of a season. */
export const OPERATIONS = ['harrowing', 'tillage', 'seeding', 'spraying', 'swathing', 'combining', 'baling'] as const;
export type Operation = (typeof OPERATIONS)[number];

export type CoverageRule = 'full' | 'gaps-ok';

export interface OperationInfo {
  label: string;
  /** `full`: no skip allowed (seeding, spraying); `gaps-ok`: corners and strips may stay unworked. */
  coverage: CoverageRule;
  /** Implement kinds that can do it. */
  implementKinds: readonly ImplementKind[];
  /** Plain-words cautions shown on the pass plan, the run sheet and the work order. */
  cautions: readonly string[];
  /** Wind limits for the work, mph, when they apply (spraying), else null. */
  windMph: { min: number; max: number } | null;
}

// Cautions shown wherever a job is planned or done. They defer to local law and licensed practice.
const GENERAL = [
  'No extra riders: only the operator rides on a tractor or self-propelled machine.',
  "Long days: take breaks and hand over when tired. Furlong's plans are aids; your judgement on the ground comes first.",
];
const POWER_LINES = 'Look up before folding, unfolding or raising the implement: keep well clear of overhead power lines and poles.';
const SLOPES = 'Slow down near draws, steep breaks and side slopes: they can tip a tractor. Keep to the clearance shown around them.';
const ROAD =
  'On public roads: lights, flashers and slow-moving-vehicle emblem on, and check the width and escort rules for wide implements where you travel.';
const BINS = 'Keep the clearance around bins, yard sites and power poles shown on the map.';

export const OPERATION_INFO: Readonly<Record<Operation, OperationInfo>> = {
  harrowing: {
    label: 'Harrowing',
    coverage: 'gaps-ok',
    implementKinds: ['harrow'],
    cautions: [POWER_LINES, SLOPES, ROAD, BINS, ...GENERAL],
    windMph: null,
  },
  tillage: {
    label: 'Disking / tillage',
    coverage: 'gaps-ok',
    implementKinds: ['disk', 'cultivator'],
    cautions: [POWER_LINES, SLOPES, ROAD, BINS, ...GENERAL],
    windMph: null,
  },
  seeding: {
    label: 'Seeding',
    coverage: 'full',
    implementKinds: ['air-drill'],
    cautions: [POWER_LINES, SLOPES, ROAD, BINS, 'Treated seed and fertilizer: wear the protection the product label asks for.', ...GENERAL],
    windMph: null,
  },
  spraying: {
    label: 'Spraying',
    coverage: 'full',
    implementKinds: ['sprayer'],
    cautions: [
      'Read and follow the pesticide label: it is the law. Respect its wind limits, buffer zones and re-entry times.',
      'Without label directions, spray only in winds of 3 to 8 mph; below 3 mph check for a temperature inversion (National Pesticide Stewardship Alliance).',
      'Application rules and licences differ by state and province: follow local law and licensed practice.',
      POWER_LINES,
      SLOPES,
      ROAD,
      ...GENERAL,
    ],
    windMph: { min: 3, max: 8 },
  },
  swathing: {
    label: 'Swathing',
    coverage: 'gaps-ok',
    implementKinds: ['swather'],
    cautions: ['Stop the header and the engine before clearing a plug.', SLOPES, ROAD, BINS, ...GENERAL],
    windMph: null,
  },
  combining: {
    label: 'Combining',
    coverage: 'gaps-ok',
    implementKinds: ['combine-header'],
    cautions: [
      'Stop the header and the engine before clearing a plug; keep a fire extinguisher on the machine.',
      POWER_LINES,
      SLOPES,
      ROAD,
      BINS,
      ...GENERAL,
    ],
    windMph: null,
  },
  baling: {
    label: 'Baling',
    coverage: 'gaps-ok',
    implementKinds: ['baler'],
    cautions: ['Stop the PTO and the engine before clearing the pickup.', SLOPES, ROAD, ...GENERAL],
    windMph: null,
  },
};

export const isOperation = (s: string): s is Operation => (OPERATIONS as readonly string[]).includes(s);
