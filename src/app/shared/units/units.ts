import { Injectable, computed, inject } from '@angular/core';
import type { UnitSystem } from '@shared/schemas/auth';
import { roundTo } from '@shared/round';
import { formatArea as sharedArea, formatLength as sharedLength } from '@shared/figures';
import { ftToM, mToFt } from '@shared/units';
import { AuthStore } from '../../core/auth/auth-store';

/**
 * An area as the farm reads it: acres for US customary, hectares for metric, one decimal; the
 * shared figure (shared/figures.ts) that e-mails and CSV files use too.
 * @param acres area in acres
 * @example formatArea(159.64, 'us') // '159.6 ac'
 */
export const formatArea = (acres: number | null | undefined, system: UnitSystem): string => sharedArea(acres, system);

/**
 * A length on the ground (a hazard's clearance) in whole feet or metres: the shared figure
 * (shared/figures.ts) that the work-order e-mail uses too.
 * @param metres length in metres, as the API stores it
 * @example formatLength(30.48, 'us') // '100 ft'
 */
export const formatLength = (metres: number | null | undefined, system: UnitSystem): string => sharedLength(metres, system);

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
