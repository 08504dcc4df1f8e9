import { formatPower } from '../../shared/figures';
import { SELF_PROPELLED, type MachineKind } from '../../shared/schemas/fleet';

export interface PullMachine {
  id: number;
  name: string;
  kind: MachineKind;
  powerHp: number;
}

export interface PullImplement {
  name: string;
  machineIds: readonly number[];
  minPowerHp: number | null;
}

/**
 * Why a machine cannot work an implement, or null when it can. A self-propelled machine carries
 * only what names it; a tractor takes what names it, or (when none is named) anything its power allows.
 *
 * @example whyCannotPull({ id: 3, name: 'MFWD', kind: 'tractor-mfwd', powerHp: 180 }, { name: 'Harrow', machineIds: [], minPowerHp: 300 })
 * // 'The MFWD has 180 hp; Harrow needs at least 300 hp'
 */
export function whyCannotPull(machine: PullMachine, implement: PullImplement): string | null {
  const named = implement.machineIds.includes(machine.id);
  if (implement.machineIds.length > 0 && !named) return `${implement.name} is not set up for ${machine.name}`;
  if (SELF_PROPELLED.includes(machine.kind) && !named)
    return `${machine.name} is self-propelled and carries only its own header or boom, not ${implement.name}`;
  if (implement.minPowerHp != null && machine.powerHp < implement.minPowerHp) {
    return `${machine.name} has ${formatPower(machine.powerHp)}; ${implement.name} needs at least ${formatPower(implement.minPowerHp)}`;
  }
  return null;
}
