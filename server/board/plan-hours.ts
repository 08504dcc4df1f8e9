import { fieldCapacityAcPerH } from '../../shared/plan/field-capacity';
import { implementDefaults, type ImplementKind } from '../../shared/plan/implement-defaults';
import { roundTo } from '../../shared/round';

export interface PlanHours {
  hours: number;
  source: 'pass-plan' | 'estimate';
}

/**
 * Hours a job should take. With a saved pass plan: its hours for the whole field, scaled to the
 * acres planned (a part-done field needs part of the time). Without: acres ÷ effective field
 * capacity at the implement kind's default speed and efficiency (AEN-73).
 *
 * @param acresPlanned acres the job covers
 * @param fieldAcres the field's acres
 * @param implement working width (m) and kind
 * @param planSummaryHours `summary.hours` of the saved pass plan for this field and operation, if any
 * @example planHours(160, 160, { widthM: 18.288, kind: 'air-drill' }) // { hours: ≈ 5.4, source: 'estimate' }
 */
export function planHours(
  acresPlanned: number,
  fieldAcres: number,
  implement: { widthM: number; kind: ImplementKind },
  planSummaryHours?: unknown,
): PlanHours {
  if (typeof planSummaryHours === 'number' && Number.isFinite(planSummaryHours) && planSummaryHours > 0 && fieldAcres > 0) {
    return { hours: roundTo(planSummaryHours * (acresPlanned / fieldAcres)), source: 'pass-plan' };
  }
  const d = implementDefaults(implement.kind);
  const capacity = fieldCapacityAcPerH(implement.widthM, d.speedMps, d.efficiency);
  return { hours: roundTo(capacity > 0 ? acresPlanned / capacity : 0), source: 'estimate' };
}
