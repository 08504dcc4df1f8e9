import * as z from 'zod';
import { OPERATIONS } from '../operations';
import { MAX_EDGE_MARGIN_PCT } from '../plan/auto-heading';
import { IMPLEMENT_DEFAULTS, type ImplementKind } from '../plan/implement-defaults';
import { MAX_SPEED_MPS, MAX_SPEED_TEXT } from '../plan/resolve-plan-input';
import type { PlanResult } from '../plan/types';
import { dbId, dbIdNumber } from './common';
import { geometry } from './fields';

/** The heading box's rule, in the words the form shows under it. */
export const HEADING_RANGE = 'Enter a heading from 0 to 179°';
const EDGE_MARGIN_RANGE = `The margin for passes along an edge is 0 to ${MAX_EDGE_MARGIN_PCT} %`;

const kinds = Object.keys(IMPLEMENT_DEFAULTS) as [ImplementKind, ...ImplementKind[]];

const SPEED_ABOVE_ZERO = 'The speed must be above zero';
const SPEED_AT_MOST = `The speed is at most ${MAX_SPEED_TEXT}`;

/**
 * The settings of a pass plan, as the Pass plan screen sends them: SI units, as they are stored
 * (width in metres, speed in metres per second); the screens convert for display only.
 */
export const planSettings = z.object({
  widthM: z.number().positive('The working width must be greater than zero').max(100, 'The working width is at most 100 m (328 ft)'),
  headlandPasses: z
    .number()
    .int('Headland passes are a whole number')
    .min(0, 'Headland passes are 0 to 50')
    .max(50, 'Headland passes are 0 to 50')
    .optional(),
  headingDeg: z.union([z.literal('auto'), z.number().min(0, HEADING_RANGE).lt(180, HEADING_RANGE)], { message: HEADING_RANGE }).optional(),
  edgeMarginPct: z.number().min(0, EDGE_MARGIN_RANGE).max(MAX_EDGE_MARGIN_PCT, EDGE_MARGIN_RANGE).optional(),
  speedMps: z
    .number()
    .positive(SPEED_ABOVE_ZERO)
    .max(MAX_SPEED_MPS, SPEED_AT_MOST)
    .meta({ description: 'Working speed, metres per second (1 mph = 0.447 04 m/s exactly).' })
    .optional(),
  /**
   * The speed in mph, as clients written before plans stored SI sent it; converted exactly to
   * `speedMps` on arrival, so such a client's plan keeps its speed. Send one of the two.
   */
  speedMph: z
    .number()
    .positive(SPEED_ABOVE_ZERO)
    .max(60, SPEED_AT_MOST)
    .meta({ deprecated: true, description: 'Deprecated: send speedMps. Working speed, mph, converted exactly to m/s.' })
    .optional(),
  efficiency: z
    .number()
    .gt(0, 'Field efficiency is above 0 and at most 100 %')
    .max(1, 'Field efficiency is above 0 and at most 100 %')
    .optional(),
  turnSeconds: z.number().min(0, 'A turn takes 0 to 600 seconds').max(600, 'A turn takes 0 to 600 seconds').optional(),
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
  /** The chosen implement's name and working width, m (null without one); the plan's width may differ. */
  implementName: string | null;
  implementWidthM: number | null;
  widthM: number;
  headlandPasses: number;
  /** null: auto (the heading with the least field time, along an edge when nearly as fast). */
  headingDeg: number | null;
  coverage: 'gaps-ok' | 'full';
  /** Working speed, metres per second. */
  speedMps: number;
  efficiency: number;
  turnSeconds: number;
  summary: PlanSummary;
  updatedAt: string;
}
