// The farm's tractors and self-propelled machines. The engine-hour meter only moves forward
// through logged work; the owner may correct it here.
import { formatEngineHours } from '../../shared/figures';
import type { Machine, MachineInput } from '../../shared/schemas/fleet';
import type { AppDeps } from '../app-deps';
import { AppError, notFound } from '../http/errors';
import type { DbMachineRow } from './fleet.rows';
import * as repo from './machines.repository';
import { serviceDue } from './service-due';

type MachinePatch = Partial<MachineInput>;

export function toMachine(m: DbMachineRow): Machine {
  const due = serviceDue(m);
  return {
    id: m.id,
    name: m.name,
    kind: m.kind,
    powerHp: m.power_hp,
    engineHours: m.engine_hours,
    serviceIntervalHours: m.service_interval_hours,
    hoursAtLastService: m.hours_at_last_service,
    serviceDueInHours: due.dueInHours,
    serviceWarning: due.warning,
    notes: m.notes,
  };
}

const nameTaken = (name: string) =>
  new AppError(409, 'name_taken', `There is already a machine called "${name}"; choose another name`, { name: 'Name already used' });

function columns(p: MachinePatch): repo.MachineColumns {
  const cols: repo.MachineColumns = {};
  if (p.name !== undefined) cols.name = p.name;
  if (p.kind !== undefined) cols.kind = p.kind;
  if (p.powerHp !== undefined) cols.power_hp = p.powerHp;
  if (p.engineHours !== undefined) cols.engine_hours = p.engineHours;
  if (p.serviceIntervalHours !== undefined) cols.service_interval_hours = p.serviceIntervalHours;
  if (p.hoursAtLastService !== undefined) cols.hours_at_last_service = p.hoursAtLastService;
  if (p.notes !== undefined) cols.notes = p.notes;
  return cols;
}

function checkServiceReading(engineHours: number, lastService: number | null | undefined): void {
  if (lastService != null && lastService > engineHours) {
    throw new AppError(
      422,
      'invalid_input',
      `The last service (${formatEngineHours(lastService)}) cannot be later than the meter reading (${formatEngineHours(engineHours)})`,
      { hoursAtLastService: 'Later than the meter' },
    );
  }
}

export async function listMachines(deps: AppDeps, farmId: number): Promise<Machine[]> {
  return (await repo.listMachines(deps.db, farmId)).map(toMachine);
}

export async function getMachine(deps: AppDeps, farmId: number, id: number): Promise<Machine> {
  const m = await repo.getMachine(deps.db, farmId, id);
  if (!m) throw notFound('That machine');
  return toMachine(m);
}

export async function createMachine(deps: AppDeps, farmId: number, input: MachineInput): Promise<Machine> {
  checkServiceReading(input.engineHours, input.hoursAtLastService);
  if (await repo.machineNameTaken(deps.db, farmId, input.name)) throw nameTaken(input.name);
  const id = await repo.insertMachine(deps.db, farmId, columns(input));
  return getMachine(deps, farmId, id);
}

export async function updateMachine(deps: AppDeps, farmId: number, id: number, patch: MachinePatch): Promise<Machine> {
  const m = await repo.getMachine(deps.db, farmId, id);
  if (!m) throw notFound('That machine');
  checkServiceReading(
    patch.engineHours ?? m.engine_hours,
    patch.hoursAtLastService === undefined ? m.hours_at_last_service : patch.hoursAtLastService,
  );
  if (patch.name && (await repo.machineNameTaken(deps.db, farmId, patch.name, id))) throw nameTaken(patch.name);
  await repo.updateMachine(deps.db, id, columns(patch));
  return getMachine(deps, farmId, id);
}

export async function deleteMachine(deps: AppDeps, farmId: number, id: number): Promise<void> {
  const m = await repo.getMachine(deps.db, farmId, id);
  if (!m) throw notFound('That machine');
  if (await repo.machineHasJobs(deps.db, id)) {
    throw new AppError(409, 'in_use', `${m.name} has jobs on the work board or in the season log; it cannot be deleted`);
  }
  await repo.deleteMachine(deps.db, id);
}
