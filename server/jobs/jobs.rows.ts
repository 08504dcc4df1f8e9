// Row types of a job's tables, as Knex returns them (DATE as 'YYYY-MM-DD', NUMERIC as number).
import type { Operation } from '../../shared/operations';
import type { AssignmentState, LoggedEventType } from '../../shared/schemas/jobs';
import type { MachineKind } from '../../shared/schemas/fleet';
import type { ImplementKind } from '../../shared/plan/implement-defaults';

export interface DbAssignmentRow {
  id: number;
  farm_id: number;
  day: string;
  field_id: number;
  operation: Operation;
  operator_id: number;
  machine_id: number;
  implement_id: number;
  mentor_id: number | null;
  run_order: number;
  start_min: number | null;
  end_min: number | null;
  note: string | null;
  state: AssignmentState;
  acres_planned: number;
  started_at: Date | null;
  finished_at: Date | null;
  acres_done: number | null;
  /** Acres typed at the finish (or by the owner's correction), kept when measured acres count instead. */
  acres_typed: number | null;
  /** Which figure acres_done holds (server/track-coverage/measured-acres.ts); null until finished. */
  acres_source: 'typed' | 'measured' | null;
  hours_worked: number | null;
  engine_hours_start: number | null;
  engine_hours_end: number | null;
  call_off_reason: 'weather' | 'breakdown' | 'other' | null;
  created_at: Date;
  updated_at: Date;
}

/** An assignment with the names and facts the board, the run sheet and the work order show. */

export interface AssignmentView extends DbAssignmentRow {
  field_name: string;
  field_acres: number;
  operator_name: string;
  mentor_name: string | null;
  machine_name: string;
  machine_kind: MachineKind;
  machine_power_hp: number;
  machine_engine_hours: number;
  machine_service_interval_hours: number | null;
  machine_hours_at_last_service: number | null;
  implement_name: string;
  implement_kind: ImplementKind;
  implement_width_m: number;
  implement_operations: Operation[];
  implement_min_power_hp: number | null;
  implement_machine_ids: number[];
  problem_count: number;
}

export interface DbAssignmentEventRow {
  id: number;
  farm_id: number;
  assignment_id: number;
  type: LoggedEventType;
  at: Date;
  acres: number | null;
  engine_hours: number | null;
  reason: string | null;
  note: string | null;
  hazard_id: number | null;
  by_user_id: number | null;
}
