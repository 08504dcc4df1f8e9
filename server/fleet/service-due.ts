import { formatEngineHours } from '../../shared/figures';
import { roundTo } from '../../shared/round';
import type { DbMachineRow } from './fleet.rows';

/** Warn this many hours before a service falls due (common practice, no published source). */
export const SERVICE_SOON_HOURS = 25;

export interface ServiceDue {
  /** Hours left before the next service; negative = overdue; null when no interval is kept. */
  dueInHours: number | null;
  warning: string | null;
}

/**
 * When the next service falls due on the engine-hour meter.
 *
 * @param m the machine: meter reading, service interval and the reading at the last service (h)
 * @example serviceDue({ engine_hours: 1260, service_interval_hours: 250, hours_at_last_service: 1000, … }) // { dueInHours: -10, warning: 'Service overdue by 10.0 h' }
 */
export function serviceDue(m: Pick<DbMachineRow, 'engine_hours' | 'service_interval_hours' | 'hours_at_last_service'>): ServiceDue {
  if (m.service_interval_hours == null) return { dueInHours: null, warning: null };
  const last = m.hours_at_last_service ?? 0;
  const dueIn = roundTo(last + m.service_interval_hours - m.engine_hours, 1);
  if (dueIn < 0) return { dueInHours: dueIn, warning: `Service overdue by ${formatEngineHours(-dueIn)}` };
  if (dueIn === 0) return { dueInHours: 0, warning: 'Service due now' };
  if (dueIn <= SERVICE_SOON_HOURS) return { dueInHours: dueIn, warning: `Service due in ${formatEngineHours(dueIn)}` };
  return { dueInHours: dueIn, warning: null };
}
