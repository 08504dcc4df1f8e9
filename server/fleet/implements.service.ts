// Implements, headers and booms, with the operations they do and the machines that take them.
import { implementBody, type Implement, type ImplementInput } from '../../shared/schemas/fleet';
import type { AppDeps } from '../app-deps';
import type { Tx } from '../db/knex';
import { AppError, notFound } from '../http/errors';
import type { ImplementWithHitches } from './fleet.rows';
import * as repo from './implements.repository';
import { machineIdsOfFarm } from './machines.repository';

type ImplementPatch = Partial<ImplementInput>;

export function toImplement(i: ImplementWithHitches): Implement {
  return {
    id: i.id,
    name: i.name,
    kind: i.kind,
    widthM: i.width_m,
    transportWidthM: i.transport_width_m,
    operations: i.operations,
    machineIds: i.machine_ids,
    minPowerHp: i.min_power_hp,
    notes: i.notes,
  };
}

const nameTaken = (name: string) =>
  new AppError(409, 'name_taken', `There is already an implement called "${name}"; choose another name`, { name: 'Name already used' });

/** Every listed machine must be one of this farm's; another farm's id is refused like an unknown one. */
async function checkMachines(db: Tx, farmId: number, ids: number[]): Promise<number[]> {
  const unique = [...new Set(ids)];
  const found = new Set(await machineIdsOfFarm(db, farmId, unique));
  const missing = unique.filter((id) => !found.has(id));
  if (missing.length) {
    throw new AppError(422, 'unknown_machine', `Machine ${missing.join(', ')} is not in this farm's fleet`, {
      machineIds: 'Choose machines of this farm',
    });
  }
  return unique;
}

export async function listImplements(deps: AppDeps, farmId: number): Promise<Implement[]> {
  return (await repo.listImplements(deps.db, farmId)).map(toImplement);
}

export async function getImplement(deps: AppDeps, farmId: number, id: number): Promise<Implement> {
  const i = await repo.getImplement(deps.db, farmId, id);
  if (!i) throw notFound('That implement');
  return toImplement(i);
}

export async function createImplement(deps: AppDeps, farmId: number, input: ImplementInput): Promise<Implement> {
  const id = await deps.db.transaction(async (tx) => {
    const machineIds = await checkMachines(tx, farmId, input.machineIds);
    if (await repo.implementNameTaken(tx, farmId, input.name)) throw nameTaken(input.name);
    const newId = await repo.insertImplement(tx, farmId, {
      name: input.name,
      kind: input.kind,
      width_m: input.widthM,
      transport_width_m: input.transportWidthM ?? null,
      operations: input.operations,
      min_power_hp: input.minPowerHp ?? null,
      notes: input.notes ?? null,
    });
    await repo.setHitches(tx, farmId, newId, machineIds);
    return newId;
  });
  return getImplement(deps, farmId, id);
}

export async function updateImplement(deps: AppDeps, farmId: number, id: number, patch: ImplementPatch): Promise<Implement> {
  await deps.db.transaction(async (tx) => {
    const current = await repo.getImplement(tx, farmId, id);
    if (!current) throw notFound('That implement');
    // Kind and operations are checked together, as they will be stored.
    const merged = implementBody.safeParse({ ...toImplement(current), ...patch });
    if (!merged.success) {
      const issue = merged.error.issues[0];
      throw new AppError(422, 'invalid_input', issue.message, { [issue.path.join('.') || '_']: issue.message });
    }
    const m = merged.data;
    if (patch.name && (await repo.implementNameTaken(tx, farmId, patch.name, id))) throw nameTaken(patch.name);
    if (patch.machineIds) await repo.setHitches(tx, farmId, id, await checkMachines(tx, farmId, patch.machineIds));
    await repo.updateImplement(tx, id, {
      name: m.name,
      kind: m.kind,
      width_m: m.widthM,
      transport_width_m: m.transportWidthM ?? null,
      operations: m.operations,
      min_power_hp: m.minPowerHp ?? null,
      notes: m.notes ?? null,
    });
  });
  return getImplement(deps, farmId, id);
}

export async function deleteImplement(deps: AppDeps, farmId: number, id: number): Promise<void> {
  const i = await repo.getImplement(deps.db, farmId, id);
  if (!i) throw notFound('That implement');
  if (await repo.implementHasJobs(deps.db, id)) {
    throw new AppError(409, 'in_use', `${i.name} has jobs on the work board or in the season log; it cannot be deleted`);
  }
  await repo.deleteImplement(deps.db, id);
}
