import { OPERATION_INFO, type CoverageRule, type Operation } from '@shared/operations';
import { DEFAULT_TURN_SECONDS, implementDefaults, type ImplementKind } from '@shared/plan/implement-defaults';
import type { PlanInput } from '@shared/plan/types';
import type { UnitSystem } from '@shared/schemas/auth';
import type { Implement } from '@shared/schemas/fleet';
import { DEFAULT_EDGE_MARGIN_PCT } from '@shared/plan/auto-heading';
import { HEADING_RANGE, planSettings, type SavedPlan } from '@shared/schemas/plans';
import { type FormFields, type PlacedProblems, schemaProblems } from '../../shared/forms/field-labels';
import { roundTo } from '@shared/round';
import { formatSpeed, formatWidth } from '@shared/figures';
import { ftToM, kmhToMps, mphToMps, mpsToKmh, mpsToMph, mToFt } from '@shared/units';

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
  /** True: the planner picks the heading with the least field time (along an edge when nearly as fast). */
  autoHeading: boolean;
  /** Degrees clockwise from true north, 0–179, used when autoHeading is off. */
  headingDeg: number;
  /** mph (US) or km/h (metric). */
  speed: number | null;
  /** Field efficiency, per cent. */
  efficiencyPct: number | null;
  turnSeconds: number | null;
  coverage: CoverageRule;
  /** Auto heading keeps the passes along a long edge when at most this many per cent slower. */
  edgeMarginPct: number | null;
  /**
   * The stored width behind the width box, metres. The box shows it rounded in the farm's unit; as
   * long as the box still shows that, the body sends this exact value, so viewing a saved plan in
   * other units (or switching units and back) never changes its width.
   */
  widthM?: number;
  /** The stored speed behind the speed box, m/s; kept like {@link PlanSettings.widthM}. */
  speedMps?: number;
}

/** The body of `PUT /api/plans/:fieldId/:operation` (planSettings in shared/schemas/plans.ts). */
export interface PlanSettingsBody {
  widthM: number;
  headlandPasses: number;
  headingDeg: number | 'auto';
  /** Metres per second, as stored. */
  speedMps: number;
  efficiency: number;
  turnSeconds: number;
  coverage: CoverageRule;
  implementKind: ImplementKind;
  implementId: number | null;
  edgeMarginPct: number;
}

/**
 * Each key of the plan's API body (preview and save) and the box it is typed in, by its label: a
 * refusal names the box, never the key. The spec checks every key of the schemas is here.
 */
export const PASS_PLAN_FIELDS: FormFields = {
  widthM: { control: 'width', label: 'Working width' },
  headlandPasses: { control: 'headlandPasses', label: 'Headland passes' },
  headingDeg: { control: 'heading', label: 'Heading' },
  edgeMarginPct: { control: 'edgeMargin', label: 'Keep passes along an edge' },
  speedMps: { control: 'speed', label: 'Speed' },
  speedMph: { control: 'speed', label: 'Speed' },
  efficiency: { control: 'efficiency', label: 'Field efficiency' },
  turnSeconds: { control: 'turnSeconds', label: 'Seconds per turn' },
  coverage: { control: 'coverage', label: 'Coverage' },
  implementKind: { control: 'implementKind', label: 'Implement kind' },
  implementId: { control: 'implement', label: 'Implement' },
  fieldId: { control: 'field', label: 'Field' },
  boundary: { control: 'field', label: 'Field' },
  hazards: { control: 'field', label: 'Field' },
  fieldName: { control: 'field', label: 'Field' },
  operation: { control: 'operation', label: 'Operation' },
};

export const DEFAULT_HEADLAND_PASSES = 2;

/** Speed in the farm's unit (mph or km/h, one decimal) from the stored m/s. */
export const speedFromMps = (mps: number, system: UnitSystem): number => roundTo(system === 'metric' ? mpsToKmh(mps) : mpsToMph(mps), 1);
const speedToMps = (speed: number, system: UnitSystem): number => (system === 'metric' ? kmhToMps(speed) : mphToMps(speed));
/** Width in the farm's unit from metres: feet to 0.1 ft, metres to the centimetre. */
export const widthFromMetres = (m: number, system: UnitSystem): number => (system === 'metric' ? roundTo(m, 2) : roundTo(mToFt(m), 1));
const widthToMetres = (width: number, system: UnitSystem): number => (system === 'metric' ? width : ftToM(width));

/** Speed and efficiency of an implement kind, in the form's units (and the speed as stored). */
export function kindDefaults(kind: ImplementKind, system: UnitSystem): Pick<PlanSettings, 'speed' | 'speedMps' | 'efficiencyPct'> {
  const d = implementDefaults(kind);
  return { speed: speedFromMps(d.speedMps, system), speedMps: d.speedMps, efficiencyPct: roundTo(d.efficiency * 100, 1) };
}

/** The width the form stands for, metres: the stored one while the box shows it, else what was typed. */
function exactWidthM(s: PlanSettings, system: UnitSystem): number | null {
  if (s.width === null || !Number.isFinite(s.width)) return null;
  return s.widthM !== undefined && s.width === widthFromMetres(s.widthM, system) ? s.widthM : widthToMetres(s.width, system);
}

/** The speed the form stands for, m/s: the stored one while the box shows it, else what was typed. */
function exactSpeedMps(s: PlanSettings, system: UnitSystem): number | null {
  if (s.speed === null || !Number.isFinite(s.speed)) return null;
  return s.speedMps !== undefined && s.speed === speedFromMps(s.speedMps, system) ? s.speedMps : speedToMps(s.speed, system);
}

/**
 * The form's width and speed written as every width and speed is (shared/figures.ts), from the
 * values it stands for: the stored ones while the boxes show them, else what was typed.
 *
 * @example settingsFigures({ …, width: 60, speed: 7 }, 'us') // { width: '60.0 ft', speed: '7.0 mph' }
 */
export function settingsFigures(s: PlanSettings, system: UnitSystem): { width: string; speed: string } {
  return { width: formatWidth(exactWidthM(s, system), system), speed: formatSpeed(exactSpeedMps(s, system), system) };
}

/**
 * The same form shown in other units: the boxes are converted from the stored values (never from
 * the rounded boxes), which stay as they were, so imperial → metric → imperial changes nothing.
 */
export function settingsInUnits(s: PlanSettings, from: UnitSystem, to: UnitSystem): PlanSettings {
  if (from === to) return s;
  const widthM = exactWidthM(s, from);
  const speedMps = exactSpeedMps(s, from);
  return {
    ...s,
    width: widthM === null ? s.width : widthFromMetres(widthM, to),
    widthM: widthM ?? undefined,
    speed: speedMps === null ? s.speed : speedFromMps(speedMps, to),
    speedMps: speedMps ?? undefined,
  };
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
    widthM: implement?.widthM,
    headlandPasses: DEFAULT_HEADLAND_PASSES,
    autoHeading: true,
    headingDeg: 0,
    ...kindDefaults(kind, system),
    turnSeconds: DEFAULT_TURN_SECONDS,
    coverage: info.coverage,
    edgeMarginPct: DEFAULT_EDGE_MARGIN_PCT,
  };
}

/** The form for a saved plan. The kind is not stored: it comes from the implement, else the operation. */
export function settingsFromSaved(saved: SavedPlan, fleet: readonly Implement[], system: UnitSystem): PlanSettings {
  const implement = fleet.find((i) => i.id === saved.implementId) ?? null;
  return {
    implementId: implement?.id ?? null,
    implementKind: implement?.kind ?? OPERATION_INFO[saved.operation].implementKinds[0],
    width: widthFromMetres(saved.widthM, system),
    widthM: saved.widthM,
    headlandPasses: saved.headlandPasses,
    autoHeading: saved.headingDeg === null,
    headingDeg: saved.headingDeg ?? saved.summary.headingDeg,
    speed: speedFromMps(saved.speedMps, system),
    speedMps: saved.speedMps,
    efficiencyPct: roundTo(saved.efficiency * 100, 1),
    turnSeconds: saved.turnSeconds,
    coverage: saved.coverage,
    // Plans saved before the margin existed used the default.
    edgeMarginPct: saved.summary.edgeMarginPct ?? DEFAULT_EDGE_MARGIN_PCT,
  };
}

/** Turns an empty or non-numeric box into a message; range checks are the planner's. */
function required(value: number | null, what: string): number {
  if (value === null || !Number.isFinite(value)) throw new Error(`Enter ${what}.`);
  return value;
}

/**
 * The form as the body the API saves: metres, metres per second, a fraction. Throws an Error naming the empty box.
 *
 * @example settingsBody({ …, width: 60 }, 'us').widthM // 18.288
 */
export function settingsBody(s: PlanSettings, system: UnitSystem): PlanSettingsBody {
  required(s.width, `the working width in ${system === 'metric' ? 'metres' : 'feet'}`);
  const speed = required(s.speed, `the working speed in ${system === 'metric' ? 'km/h' : 'mph'}`);
  return {
    widthM: exactWidthM(s, system)!,
    headlandPasses: required(s.headlandPasses, 'the number of headland passes (0 for none)'),
    headingDeg: s.autoHeading ? 'auto' : required(s.headingDeg, 'the heading in degrees'),
    speedMps: exactSpeedMps({ ...s, speed }, system)!,
    efficiency: required(s.efficiencyPct, 'the field efficiency in per cent') / 100,
    turnSeconds: required(s.turnSeconds, 'the seconds per turn'),
    coverage: s.coverage,
    implementKind: s.implementKind,
    implementId: s.implementId,
    edgeMarginPct: required(s.edgeMarginPct, 'the margin for passes along an edge in per cent'),
  };
}

/** The message for an empty box, by control (the schema cannot see an empty box: it is no number). */
const EMPTY: Record<string, (system: UnitSystem) => string> = {
  width: (u) => `Enter the working width in ${u === 'metric' ? 'metres' : 'feet'}`,
  headlandPasses: () => 'Enter the headland passes (0 for none)',
  heading: () => HEADING_RANGE,
  speed: (u) => `Enter the speed in ${u === 'metric' ? 'km/h' : 'mph'}`,
  efficiency: () => 'Enter the field efficiency in per cent',
  turnSeconds: () => 'Enter the seconds per turn',
  edgeMargin: () => 'Enter the margin in per cent (3 is usual)',
};
const isEmpty = (v: number | null): boolean => v === null || !Number.isFinite(v);

/**
 * The form's problems by box, as it is typed: empty boxes, then the shared schema's checks on the
 * body (the same the server makes), each under its box, with one sentence naming the boxes.
 *
 * @example settingsProblems({ …, autoHeading: false, headingDeg: 200 }, 'us').byControl.heading // 'Enter a heading from 0 to 179°'
 */
export function settingsProblems(s: PlanSettings, system: UnitSystem): PlacedProblems {
  const empty: Record<string, number | null> = {
    width: s.width,
    headlandPasses: s.headlandPasses,
    heading: s.autoHeading ? 0 : s.headingDeg,
    speed: s.speed,
    efficiency: s.efficiencyPct,
    turnSeconds: s.turnSeconds,
    edgeMargin: s.edgeMarginPct,
  };
  const missing = Object.entries(empty).filter(([, v]) => isEmpty(v));
  if (missing.length) {
    const byControl = Object.fromEntries(missing.map(([c]) => [c, EMPTY[c](system)]));
    const labels = Object.values(PASS_PLAN_FIELDS)
      .filter((f, i, all) => f.control in byControl && all.findIndex((g) => g.control === f.control) === i)
      .map((f) => f.label);
    return { byControl, message: `Fill in ${labels.join(', ')}.` };
  }
  return schemaProblems(planSettings, settingsBody(s, system), PASS_PLAN_FIELDS);
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
      // Within half the box's step in km/h (0.05 km/h), the finer of its two units.
      Math.abs(b.speedMps - saved.speedMps) < kmhToMps(0.05) &&
      close(b.efficiency, saved.efficiency) &&
      close(b.turnSeconds, saved.turnSeconds) &&
      b.coverage === saved.coverage &&
      (b.headingDeg !== 'auto' || close(b.edgeMarginPct, saved.summary.edgeMarginPct ?? DEFAULT_EDGE_MARGIN_PCT)) &&
      (b.implementId ?? null) === (saved.implementId ?? null)
    );
  } catch {
    return false;
  }
}
