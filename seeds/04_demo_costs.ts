// The demo farm's work costs, so the season page shows what the work cost. Every rate is invented
// for the fictional farm (plausible for a large grain farm, not taken from any survey); fuel per
// acre keeps the published defaults of shared/costs.ts.
import type { DemoStep } from './steps';

/** Dollars per engine hour, ownership and operating (fuel apart), by machine name; whole cents. */
const MACHINE_CENTS: Record<string, number> = {
  '4WD No. 1': 11_850,
  '4WD No. 2': 10_400,
  'MFWD No. 1': 4_275,
  Combine: 21_500,
  Sprayer: 9_650,
  Swather: 6_800,
};

/** Dollars per hour worked, by e-mail; the owner's own time is costed too. */
const LABOUR_CENTS: Record<string, number> = {
  'ingrid@tamarack-ridge.example': 3_500,
  'tomas@tamarack-ridge.example': 2_875,
  'ada@tamarack-ridge.example': 2_650,
  'milo@tamarack-ridge.example': 1_800,
};

/** Diesel, cents per US gallon. */
const FUEL_PRICE_CENTS = 372;

export const seedDemoCosts: DemoStep = async (tx, { farmId, users }) => {
  await tx('cost_settings').insert({ farm_id: farmId, fuel_price_cents: FUEL_PRICE_CENTS, fuel_gal_per_acre: JSON.stringify({}) });
  const machines: Array<{ id: number; name: string }> = await tx('machines').where({ farm_id: farmId }).select('id', 'name');
  const machineRows = machines
    .filter((m) => MACHINE_CENTS[m.name] !== undefined)
    .map((m) => ({ machine_id: m.id, farm_id: farmId, hourly_cents: MACHINE_CENTS[m.name] }));
  if (machineRows.length) await tx('machine_costs').insert(machineRows);
  const memberships: Array<{ id: number; user_id: number }> = await tx('memberships').where({ farm_id: farmId }).select('id', 'user_id');
  const labourRows = Object.entries(LABOUR_CENTS).flatMap(([email, cents]) => {
    const m = memberships.find((x) => x.user_id === users[email]);
    return m ? [{ membership_id: m.id, farm_id: farmId, hourly_cents: cents }] : [];
  });
  if (labourRows.length) await tx('labour_costs').insert(labourRows);
};
