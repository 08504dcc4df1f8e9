// What the farm's own work costs: the rules and the published defaults. A finished job costs
//   machine:  engine hours (meter at finish − meter at start; the hours worked when a reading is
//             missing) × the machine's hourly cost (ownership and operating, fuel apart)
//   labour:   hours worked × the operator's hourly labour cost (a mentor riding along is not counted)
//   fuel:     acres done × gallons per acre for the operation × the farm's diesel price
// A machine or person without a rate adds nothing, and the report counts those jobs so the owner
// sees the total is short. Rates and the price are whole cents (shared/money.ts for rounding).
import { OPERATIONS, type Operation } from './operations';
import type { SourceKind } from './weather/limits';

export interface CostSource {
  kind: SourceKind;
  /** The citation, or why the number was chosen. */
  note: string;
}

const SEEN = (note: string): CostSource => ({ kind: 'published', note });
const MEMORY = (note: string): CostSource => ({ kind: 'from memory', note });

const MISSOURI_G1208 =
  'J. C. Frisby, "Fuel Requirement Estimates for Selected Field Operations", University of Missouri Extension G1208 (1993), Table 1';
const NEBRASKA = 'University of Nebraska–Lincoln CropWatch, "Fuel Requirements" (typical diesel use by tillage system)';
const RECALLED =
  'Recalled from extension fuel tables such as Iowa State University PM 709 "Fuel Required for Field Operations"; not confirmed';

/** Diesel used per acre by operation, US gallons per acre, with where each number comes from. */
export const FUEL_DEFAULTS: Readonly<Record<Operation, { galPerAcre: number; source: CostSource }>> = {
  harrowing: { galPerAcre: 0.3, source: SEEN(`${MISSOURI_G1208}: harrow, spike-tooth, 0.30 gal/ac`) },
  tillage: { galPerAcre: 0.6, source: SEEN(`${MISSOURI_G1208}: field cultivator, 0.60 gal/ac`) },
  seeding: { galPerAcre: 0.5, source: MEMORY(`${RECALLED}: air seeding about 0.4 to 0.6 gal/ac`) },
  spraying: { galPerAcre: 0.11, source: SEEN(`${NEBRASKA}: spray, 0.11 gal/ac`) },
  swathing: { galPerAcre: 0.35, source: MEMORY(`${RECALLED}: swathing about 0.3 to 0.4 gal/ac`) },
  combining: { galPerAcre: 1.15, source: MEMORY(`${RECALLED}: combining small grain about 1.0 to 1.3 gal/ac`) },
  baling: { galPerAcre: 0.4, source: MEMORY(`${RECALLED}: baling about 0.4 gal/ac`) },
};

/** The defaults alone, operation → gallons per acre. */
export const DEFAULT_FUEL_GAL_PER_ACRE = Object.fromEntries(OPERATIONS.map((o) => [o, FUEL_DEFAULTS[o].galPerAcre])) as Record<
  Operation,
  number
>;

/** Bounds on what the owner may type: an hourly rate up to $5,000 and fuel up to $50 a gallon and 10 gal/ac. */
export const COST_LIMITS = { hourlyCentsMax: 500_000, fuelPriceCentsMax: 5_000, galPerAcreMax: 10 } as const;
