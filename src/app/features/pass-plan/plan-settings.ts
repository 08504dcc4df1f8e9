import { OPERATION_INFO, type CoverageRule, type Operation } from '@shared/operations';
import { DEFAULT_TURN_SECONDS, implementDefaults, type ImplementKind } from '@shared/plan/implement-defaults';
import type { PlanInput } from '@shared/plan/types';
import type { UnitSystem } from '@shared/schemas/auth';
import type { Implement } from '@shared/schemas/fleet';
import type { SavedPlan } from '@shared/schemas/plans';
import { roundTo } from '@shared/round';
import { ftToM, mphToKmh, mToFt } from '@shared/units';

/**
 * The Pass plan form as the person sees it: lengths in the farm's unit (ft or m), speed in mph or
 * km/h, field efficiency in per cent. `null` is an empty box.
 */
export interface PlanSettings {
  /** A fleet implement, or null for "another implement" (kind and width typed). */
  implementId: number | null;
  implementKind: ImplementKind;
  /** Working width, ft (US) or m (metric). */
  width: number | null;
  headlandPasses: number | null;
  /** True: the planner picks the heading with the fewest turns. */
  autoHeading: boolean;
  /** Degrees clockwise from true north, 0–179, used when autoHeading is off. */
  headingDeg: number;
  /** mph (US) or km/h (metric). */
  speed: number | null;
  /** Field efficiency, per cent. */
  efficiencyPct: number | null;
  turnSeconds: number | null;
  coverage: CoverageRule;
}

/** The body of `PUT /api/plans/:fieldId/:operation` (planSettings in shared/schemas/plans.ts). */
export interface PlanSettingsBody {
  widthM: number;
  headlandPasses: number;
  headingDeg: number | 'auto';
  speedMph: number;
  efficiency: number;
  turnSeconds: number;
  coverage: CoverageRule;
  implementKind: ImplementKind;
  implementId: number | null;
}

export const DEFAULT_HEADLAND_PASSES = 2;

/** Speed in the farm's unit from mph (one decimal). */
export const speedFromMph = (mph: number, system: UnitSystem): number => roundTo(system === 'metric' ? mphToKmh(mph) : mph, 1);
const speedToMph = (speed: number, system: UnitSystem): number => (system === 'metric' ? speed / mphToKmh(1) : speed);
/** Width in the farm's unit from metres: feet to 0.1 ft, metres to the centimetre. */
export const widthFromMetres = (m: number, system: UnitSystem): number => (system === 'metric' ? roundTo(m, 2) : roundTo(mToFt(m), 1));
const widthToMetres = (width: number, system: UnitSystem): number => (system === 'metric' ? width : ftToM(width));

/** Speed and efficiency of an implement kind, in the form's units. */
export function kindDefaults(kind: ImplementKind, system: UnitSystem): Pick<PlanSettings, 'speed' | 'efficiencyPct'> {
  const d = implementDefaults(kind);
  return { speed: speedFromMph(d.speedMph, system), efficiencyPct: roundTo(d.efficiency * 100, 1) };
}

/** Implements of the fleet that do an operation. */
export const implementsFor = (fleet: readonly Implement[], operation: Operation): Implement[] =>
  fleet.filter((i) => i.operations.includes(operation));

/** A fresh form for an operation: its coverage rule, the first fleet implement that does it (if any). */
export function defaultSettings(operation: Operation, fleet: readonly Implement[], system: UnitSystem): PlanSettings {
  const info = OPERATION_INFO[operation];
  const implement = implementsFor(fleet, operation)[0] ?? null;
  const kind = implement?.kind ?? info.implementKinds[0];
  return {
    implementId: implement?.id ?? null,
    implementKind: kind,
    width: implement ? widthFromMetres(implement.widthM, system) : null,
    headlandPasses: DEFAULT_HEADLAND_PASSES,
    autoHeading: true,
    headingDeg: 0,
    ...kindDefaults(kind, system),
    turnSeconds: DEFAULT_TURN_SECONDS,
    coverage: info.coverage,
  };
}

/** The form for a saved plan. The kind is not stored: it comes from the implement, else the operation. */
export function settingsFromSaved(saved: SavedPlan, fleet: readonly Implement[], system: UnitSystem): PlanSettings {
  const implement = fleet.find((i) => i.id === saved.implementId) ?? null;
  return {
    implementId: implement?.id ?? null,
    implementKind: implement?.kind ?? OPERATION_INFO[saved.operation].implementKinds[0],
    width: widthFromMetres(saved.widthM, system),
    headlandPasses: saved.headlandPasses,
    autoHeading: saved.headingDeg === null,
    headingDeg: saved.headingDeg ?? saved.summary.headingDeg,
    speed: speedFromMph(saved.speedMph, system),
    efficiencyPct: roundTo(saved.efficiency * 100, 1),
    turnSeconds: saved.turnSeconds,
    coverage: saved.coverage,
  };
}

/** Turns an empty or non-numeric box into a message; range checks are the planner's. */
function required(value: number | null, what: string): number {
  if (value === null || !Number.isFinite(value)) throw new Error(`Enter ${what}.`);
  return value;
}

/**
 * The form as the body the API saves: metres, mph, a fraction. Throws an Error naming the empty box.
 *
 * @example settingsBody({ …, width: 60 }, 'us').widthM // 18.288
 */
export function settingsBody(s: PlanSettings, system: UnitSystem): PlanSettingsBody {
  const width = required(s.width, `the working width in ${system === 'metric' ? 'metres' : 'feet'}`);
  return {
    widthM: widthToMetres(width, system),
    headlandPasses: required(s.headlandPasses, 'the number of headland passes (0 for none)'),
    headingDeg: s.autoHeading ? 'auto' : required(s.headingDeg, 'the heading in degrees'),
    speedMph: speedToMph(required(s.speed, `the working speed in ${system === 'metric' ? 'km/h' : 'mph'}`), system),
    efficiency: required(s.efficiencyPct, 'the field efficiency in per cent') / 100,
    turnSeconds: required(s.turnSeconds, 'the seconds per turn'),
    coverage: s.coverage,
    implementKind: s.implementKind,
    implementId: s.implementId,
  };
}

/** What the planner needs for one field, from the form; throws like {@link settingsBody}. */
export function toPlanInput(
  s: PlanSettings,
  field: { name: string; boundary: PlanInput['boundary']; hazards?: PlanInput['hazards'] },
  system: UnitSystem,
): PlanInput {
  const { implementId: _implementId, ...body } = settingsBody(s, system);
  return { ...body, boundary: field.boundary, hazards: field.hazards, fieldName: field.name };
}

/** True when the form would save the same plan as the one saved. */
export function sameAsSaved(s: PlanSettings, saved: SavedPlan, system: UnitSystem): boolean {
  try {
    const b = settingsBody(s, system);
    const close = (a: number, c: number) => Math.abs(a - c) < 1e-6 * Math.max(1, Math.abs(c));
    return (
      Math.abs(b.widthM - saved.widthM) < 0.005 &&
      b.headlandPasses === saved.headlandPasses &&
      (b.headingDeg === 'auto' ? saved.headingDeg === null : saved.headingDeg !== null && close(b.headingDeg, saved.headingDeg)) &&
      Math.abs(b.speedMph - saved.speedMph) < 0.05 &&
      close(b.efficiency, saved.efficiency) &&
      close(b.turnSeconds, saved.turnSeconds) &&
      b.coverage === saved.coverage &&
      (b.implementId ?? null) === (saved.implementId ?? null)
    );
  } catch {
    return false;
  }
}
