import type { PlanResult } from '@shared/plan/types';
import type { UnitSystem } from '@shared/schemas/auth';
import {
  formatAreaRate,
  formatCount,
  formatDistance as sharedDistance,
  formatHeading,
  formatHours,
  formatSpeed as sharedSpeed,
} from '@shared/figures';
import { formatArea } from '../../shared/units/units';

/** One line of the plan's summary card. */
export interface SummaryRow {
  /** Stable key, for tests and tracking. */
  key: string;
  label: string;
  value: string;
  /** Smaller text under the value: how it was worked out, in plain words. */
  note?: string;
  /** Where the rule comes from (a published source), for a tooltip beside the note, not the text. */
  source?: string;
}

/** The published source of the width × speed × efficiency rule, in both unit systems. */
export const CAPACITY_SOURCE = {
  us: 'Effective field capacity, acres per hour = width (ft) × speed (mph) × field efficiency ÷ 8.25: Hancock, Swetnam and Benson, "Calculating Farm Machinery Field Capacities", AEN-73, University of Kentucky (1991).',
  metric:
    'Effective field capacity, hectares per hour = speed (km/h) × width (m) × field efficiency ÷ 10: GRDC (Grains Research and Development Corporation, Australia).',
} as const;

const int = formatCount;
const plural = (n: number, one: string, many: string): string => `${int(n)} ${n === 1 ? one : many}`;

/** A distance driven in miles or kilometres, one decimal (shared/figures.ts). */
export const formatDistance = (metres: number, system: UnitSystem): string => sharedDistance(metres, system);

/** A speed stored in m/s, in mph or km/h (shared/figures.ts). */
export const formatSpeed = (mps: number, system: UnitSystem): string => sharedSpeed(mps, system);

/**
 * The figures of a plan as the summary card shows them, in the farm's units. Anything that is not
 * a finite number shows as "—", never as NaN.
 *
 * @param autoHeading whether the planner chose the heading (least field time)
 */
export function summaryRows(r: PlanResult, system: UnitSystem, autoHeading: boolean): SummaryRow[] {
  const area = (acres: number) => formatArea(acres, system);
  const metric = system === 'metric';
  const strip =
    r.coverage === 'full'
      ? { key: 'overlap', label: 'Overlap', value: area(r.overlapAcres), note: 'worked twice, where the last pass overlaps the one before' }
      : { key: 'unworked', label: 'Unworked', value: area(r.unworkedAcres), note: 'corners and strips the passes leave' };
  return [
    { key: 'field', label: 'Field', value: area(r.fieldAcres) },
    {
      key: 'headland',
      label: 'Headland',
      value: area(r.headlandAcres),
      note: plural(r.headlandPasses, 'lap', 'laps') + ' around the edge',
    },
    { key: 'worked', label: 'Worked by the passes', value: area(r.workedAcres) },
    strip,
    {
      key: 'passes',
      label: 'Passes',
      value: int(r.passCount),
      note: r.segmentCount > r.passCount ? `${int(r.segmentCount)} segments: some passes are split by hazards or holes` : undefined,
    },
    { key: 'turns', label: 'Turns', value: int(r.turns) },
    {
      key: 'distance',
      label: 'Total distance',
      value: formatDistance(r.totalDistanceM, system),
      note: `passes ${formatDistance(r.passLengthM, system)} + headland ${formatDistance(r.headlandLengthM, system)}`,
    },
    {
      key: 'hours',
      label: 'Hours: driving and turns',
      value: formatHours(r.hours),
      note: `driving every pass and headland lap at ${formatSpeed(r.speedMps, system)}, plus ${int(r.turnSeconds)} s for each of the ${int(r.turns)} turns; no stops`,
    },
    {
      key: 'capacityHours',
      label: 'Hours: rule of thumb',
      value: formatHours(r.capacityHours),
      note: `the field's area ÷ (width × speed × field efficiency ${int(r.efficiency * 100)} %); the efficiency allows for turns, overlap and stops to fill or unload`,
      source: CAPACITY_SOURCE[system],
    },
    metric
      ? {
          key: 'capacity',
          label: 'Hectares per hour',
          value: formatAreaRate(r.capacityHaPerHour, system),
          note: 'speed (km/h) × width (m) × field efficiency ÷ 10',
          source: CAPACITY_SOURCE.metric,
        }
      : {
          key: 'capacity',
          label: 'Acres per hour',
          value: formatAreaRate(r.capacityAcresPerHour, system),
          note: 'width (ft) × speed (mph) × field efficiency ÷ 8.25',
          source: CAPACITY_SOURCE.us,
        },
    {
      key: 'heading',
      label: 'Heading',
      value: formatHeading(r.headingDeg, 180),
      note: autoHeading ? 'chosen for the least field time, along an edge when nearly as fast' : 'degrees clockwise from north',
    },
  ];
}
