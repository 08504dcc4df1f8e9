// Row types of the fleet tables, as Knex returns them (NUMERIC comes back as number, see db/knex.ts).
import type { Operation } from '../../shared/operations';
import type { MachineKind } from '../../shared/schemas/fleet';
import type { ImplementKind } from '../../shared/plan/implement-defaults';

export interface DbMachineRow {
  id: number;
  farm_id: number;
  name: string;
  kind: MachineKind;
  power_hp: number;
  engine_hours: number;
  service_interval_hours: number | null;
  hours_at_last_service: number | null;
  notes: string | null;
  created_at: Date;
  updated_at: Date;
}

export interface DbImplementRow {
  id: number;
  farm_id: number;
  name: string;
  kind: ImplementKind;
  width_m: number;
  transport_width_m: number | null;
  operations: Operation[];
  min_power_hp: number | null;
  notes: string | null;
  created_at: Date;
  updated_at: Date;
}

/** An implement with the machines it is hitched to. */
export interface ImplementWithHitches extends DbImplementRow {
  machine_ids: number[];
}
