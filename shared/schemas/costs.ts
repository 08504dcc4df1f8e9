// Costs of the farm's own work: the rates the owner enters and what `GET /api/costs` answers.
// Money is whole cents (shared/money.ts); fuel is US gallons per acre. Only the owner and viewers
// read these; operators see no money.
import * as z from 'zod';
import { COST_LIMITS } from '../costs';
import { OPERATIONS } from '../operations';
import { dbId } from './common';

const hourlyCents = z
  .number({ error: 'Enter the hourly cost as a number of cents' })
  .int('Enter the hourly cost in whole cents')
  .min(0, 'An hourly cost cannot be negative')
  .max(COST_LIMITS.hourlyCentsMax, `An hourly cost above $${COST_LIMITS.hourlyCentsMax / 100} is not believable; check the number`);

/** `PUT /api/costs/machines/:id` and `/people/:id`: the hourly cost in whole cents, or null to clear it. */
export const hourlyCostBody = z.object({ hourlyCents: hourlyCents.nullable() });
export type HourlyCostBody = z.infer<typeof hourlyCostBody>;
export const costItemParams = z.object({ id: dbId });

const galPerAcre = z
  .number({ error: 'Enter the fuel use as gallons per acre' })
  .min(0, 'Fuel use cannot be negative')
  .max(COST_LIMITS.galPerAcreMax, `Fuel use above ${COST_LIMITS.galPerAcreMax} gallons per acre is not believable; check the number`)
  .refine((n) => Math.abs(n * 1000 - Math.round(n * 1000)) < 1e-6, 'Give fuel use to at most 3 decimals');

/** `PUT /api/costs/fuel`: the diesel price (whole cents per US gallon, null when not known) and fuel use per operation. */
export const fuelCostBody = z.object({
  fuelPriceCents: z
    .number({ error: 'Enter the fuel price as a number of cents' })
    .int('Enter the fuel price in whole cents')
    .min(0, 'The fuel price cannot be negative')
    .max(
      COST_LIMITS.fuelPriceCentsMax,
      `A fuel price above $${COST_LIMITS.fuelPriceCentsMax / 100} a gallon is not believable; check the number`,
    )
    .nullable(),
  galPerAcre: z.object(
    Object.fromEntries(OPERATIONS.map((o) => [o, galPerAcre])) as Record<(typeof OPERATIONS)[number], typeof galPerAcre>,
  ),
});
export type FuelCostBody = z.infer<typeof fuelCostBody>;

const source = z.object({ kind: z.enum(['published', 'from memory', 'common practice, no published source']), note: z.string() });

/** What `GET /api/costs` and every `PUT` under it answer. */
export const costSettingsAnswer = z.object({
  fuelPriceCents: z.number().int().nullable(),
  fuel: z.array(
    z.object({
      operation: z.enum(OPERATIONS),
      galPerAcre: z.number(),
      defaultGalPerAcre: z.number(),
      /** Where the default comes from. */
      source,
    }),
  ),
  machines: z.array(z.object({ machineId: z.number().int(), name: z.string(), hourlyCents: z.number().int().nullable() })),
  people: z.array(
    z.object({ membershipId: z.number().int(), name: z.string(), role: z.string(), hourlyCents: z.number().int().nullable() }),
  ),
});
export type CostSettingsAnswer = z.infer<typeof costSettingsAnswer>;
