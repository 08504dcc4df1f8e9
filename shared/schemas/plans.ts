import { z } from 'zod';
import { OPERATIONS } from '../operations';
import { IMPLEMENT_DEFAULTS, type ImplementKind } from '../plan/implement-defaults';
import type { PlanResult } from '../plan/types';
import { dbId, dbIdNumber } from './common';
import { geometry } from './fields';

const kinds = Object.keys(IMPLEMENT_DEFAULTS) as [ImplementKind, ...ImplementKind[]];

/** The settings of a pass plan, as the Pass plan screen sends them. Widths in metres. */
export const planSettings = z.object({
  widthM: z.number().positive('The working width must be greater than zero').max(100, 'The working width is at most 100 m (328 ft)'),
  headlandPasses: z.number().int('Headland passes are a whole number').min(0).max(50).optional(),
  headingDeg: z
    .union([z.literal('auto'), z.number().min(0, 'The heading is from 0° to 179°').lt(180, 'The heading is from 0° to 179°')])
    .optional(),
  speedMph: z.number().positive().max(60).optional(),
  efficiency: z.number().gt(0).max(1, 'Field efficiency is a fraction up to 1 (e.g. 0.75)').optional(),
  turnSeconds: z.number().min(0).max(600).optional(),
  coverage: z.enum(['gaps-ok', 'full']).optional(),
  implementKind: z.enum(kinds).optional(),
  implementId: dbIdNumber.nullable().optional(),
});

export const planPreviewBody = planSettings.extend({
  fieldId: dbIdNumber.optional(),
  boundary: geometry.optional(),
  hazards: z
    .object({ type: z.literal('FeatureCollection'), features: z.array(z.unknown()) })
    .passthrough()
    .optional(),
  operation: z.enum(OPERATIONS).optional(),
  fieldName: z.string().max(120).optional(),
});

/** `GET /api/plans?fieldId=`: the saved plans of one field, or of every field. */
export const planListQuery = z.object({ fieldId: dbId.optional() });

export const planParams = z.object({
  fieldId: dbId,
  operation: z.enum(OPERATIONS, { message: `Operation must be one of: ${OPERATIONS.join(', ')}` }),
});

/** The figures of a plan that are kept with it (PlanResult without its geometries). */
export type PlanSummary = Omit<PlanResult, 'headland' | 'workRegion' | 'hazardZones' | 'passes' | 'unworked' | 'overlap'>;

export interface SavedPlan {
  id: number;
  fieldId: number;
  fieldName: string;
  operation: (typeof OPERATIONS)[number];
  implementId: number | null;
  widthM: number;
  headlandPasses: number;
  /** null: auto (the heading with the fewest turns). */
  headingDeg: number | null;
  coverage: 'gaps-ok' | 'full';
  speedMph: number;
  efficiency: number;
  turnSeconds: number;
  summary: PlanSummary;
  updatedAt: string;
}
