export { planPasses } from './plan-passes';
export type { PassProperties, PlanInput, PlanResult } from './types';
export {
  effectiveCapacityAcPerH,
  effectiveCapacityHaPerH,
  fieldCapacityAcPerH,
  fieldCapacityHaPerH,
  theoreticalCapacityAcPerH,
} from './field-capacity';
export {
  DEFAULT_EFFICIENCY,
  DEFAULT_SPEED_MPS,
  DEFAULT_TURN_SECONDS,
  IMPLEMENT_DEFAULTS,
  implementDefaults,
  type ImplementDefaults,
  type ImplementKind,
} from './implement-defaults';
