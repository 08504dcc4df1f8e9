import { Injectable, computed, inject } from '@angular/core';
import type { UnitSystem } from '@shared/schemas/auth';
import { roundTo } from '@shared/round';
import { acresToHa, ftToM, mToFt } from '@shared/units';
import { AuthStore } from '../../core/auth/auth-store';

const oneDecimal = new Intl.NumberFormat('en-US', { minimumFractionDigits: 1, maximumFractionDigits: 1 });
const whole = new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 });

/**
 * An area as the farm reads it: acres for US customary, hectares for metric, one decimal.
 * @param acres area in acres
 * @example formatArea(159.64, 'us') // '159.6 ac'
 */
export function formatArea(acres: number | null | undefined, system: UnitSystem): string {
  if (acres === null || acres === undefined || !Number.isFinite(acres)) return '—';
  return system === 'metric' ? `${oneDecimal.format(acresToHa(acres))} ha` : `${oneDecimal.format(acres)} ac`;
}

/**
 * A length (clearances, widths) in feet or metres, whole units.
 * @param metres length in metres, as the API stores it
 * @example formatLength(30.48, 'us') // '100 ft'
 */
export function formatLength(metres: number | null | undefined, system: UnitSystem): string {
  if (metres === null || metres === undefined || !Number.isFinite(metres)) return '—';
  return system === 'metric' ? `${whole.format(metres)} m` : `${whole.format(mToFt(metres))} ft`;
}

/** A length typed in the farm's unit (ft or m), in metres for the API, rounded to the centimetre. */
export function lengthToMetres(value: number, system: UnitSystem): number {
  return roundTo(system === 'metric' ? value : ftToM(value), 2);
}

/** A stored length in metres, in the farm's unit for a form field (whole ft, or m to 0.1). */
export function metresToLength(metres: number, system: UnitSystem): number {
  return system === 'metric' ? roundTo(metres, 1) : roundTo(mToFt(metres), 0);
}

/**
 * The signed-in farm's units (US customary by default) and formatters bound to them. Reads the
 * AuthStore, so everything shown follows a switch as soon as the store reloads.
 */
@Injectable({ providedIn: 'root' })
export class Units {
  private readonly auth = inject(AuthStore);

  readonly system = computed<UnitSystem>(() => this.auth.farm()?.units ?? 'us');
  readonly areaName = computed(() => (this.system() === 'metric' ? 'Hectares' : 'Acres'));
  readonly lengthUnit = computed(() => (this.system() === 'metric' ? 'm' : 'ft'));

  area(acres: number | null | undefined): string {
    return formatArea(acres, this.system());
  }

  length(metres: number | null | undefined): string {
    return formatLength(metres, this.system());
  }

  toMetres(value: number): number {
    return lengthToMetres(value, this.system());
  }

  fromMetres(metres: number): number {
    return metresToLength(metres, this.system());
  }
}
