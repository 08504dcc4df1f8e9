// One operator of their own with one published job on the demo farm: a small square field (about
// 80 ac), a tractor of their own and the demo's harrow, on a day no other test uses. The run-sheet
// browser tests on a phone start from this; `remove()` takes it all off the demo farm again.
import bcrypt from 'bcryptjs';
import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import type { BrowserRig } from './browser';
import { rect } from './geo-fixtures';

export interface PhoneJobOptions {
  /** The job's day (ISO). */
  day: string;
  /** The person's first and last name; a random tag is added so runs never collide. */
  name: string;
  /** The field's south-west corner, [lon, lat]; the field is 0.0075° × 0.005°. */
  corner: [number, number];
  /** The tractor's engine-hour meter. */
  engineHours: number;
  /** A hazard to place on the field, if any. */
  hazard?: { kind: string; at: [number, number]; clearanceM: number; note: string; status: 'reported' | 'confirmed' };
}

export interface PhoneJob {
  farmId: number;
  userId: number;
  membershipId: number;
  fieldId: number;
  fieldName: string;
  machineId: number;
  jobId: number;
  day: string;
  /** The random tag in the person's, field's and tractor's names (`4WD <tag>`). */
  tag: string;
  person: { role: 'operator'; name: string; email: string; password: string };
  /** Moves the job and its published board to another day (a start waits for the job's day). */
  moveTo(day: string): Promise<void>;
  remove(): Promise<void>;
}

export async function createPhoneJob(rig: BrowserRig, o: PhoneJobOptions): Promise<PhoneJob> {
  const db = rig.t.db;
  const tag = Math.random().toString(36).slice(2, 8);
  const first = o.name.split(' ')[0].toLowerCase();
  const person = {
    role: 'operator' as const,
    name: `${o.name} ${tag}`,
    email: `${first}-${tag}@furlong.test`,
    password: `${first}-phone-pw`,
  };
  const fieldName = `Phone Test ${tag}`;
  const farmId: number = (await db('farms').where({ name: DEMO_FARM_NAME }).first('id')).id;
  const [{ id: userId }] = await db('users')
    .insert({ email: person.email, name: person.name, password_hash: bcrypt.hashSync(person.password, 4) })
    .returning('id');
  const [{ id: membershipId }] = await db('memberships')
    .insert({ farm_id: farmId, user_id: userId, role: 'operator', status: 'active', joined_at: db.fn.now() })
    .returning('id');
  const [{ id: fieldId }] = await db('fields')
    .insert({
      farm_id: farmId,
      name: fieldName,
      boundary: JSON.stringify(rect(o.corner[0], o.corner[1], 0.0075, 0.005)),
      area_m2: 80 * 4046.86,
      acres: 80,
    })
    .returning('id');
  if (o.hazard)
    await db('hazards').insert({
      farm_id: farmId,
      field_id: fieldId,
      kind: o.hazard.kind,
      geometry: JSON.stringify({ type: 'Point', coordinates: o.hazard.at }),
      clearance_m: o.hazard.clearanceM,
      note: o.hazard.note,
      status: o.hazard.status,
    });
  const [{ id: machineId }] = await db('machines')
    .insert({ farm_id: farmId, name: `4WD ${tag}`, kind: 'tractor-4wd', power_hp: 400, engine_hours: o.engineHours })
    .returning('id');
  const implement = await db('implements').where({ farm_id: farmId }).whereRaw("'harrowing' = any(operations)").first('id');
  if (!implement) throw new Error('The demo farm has no harrow: run scripts/prepare-db.ts --reset-demo');
  await db('board_days').insert({ farm_id: farmId, day: o.day, version: 1, published_at: db.fn.now() });
  const [{ id: jobId }] = await db('assignments')
    .insert({
      farm_id: farmId,
      day: o.day,
      field_id: fieldId,
      operation: 'harrowing',
      operator_id: membershipId,
      machine_id: machineId,
      implement_id: implement.id,
      run_order: 1,
      acres_planned: 80,
    })
    .returning('id');

  let day = o.day;
  async function moveTo(to: string): Promise<void> {
    await db('board_days').where({ farm_id: farmId, day }).update({ day: to });
    await db('board_changes').where({ farm_id: farmId, day }).delete();
    await db('assignments').where({ id: jobId }).update({ day: to });
    day = to;
  }

  async function remove(): Promise<void> {
    await db('assignment_events')
      .where({ farm_id: farmId })
      .whereIn('assignment_id', db('assignments').where({ field_id: fieldId }).select('id'))
      .delete();
    await db('assignments').where({ farm_id: farmId, day }).delete();
    await db('board_changes').where({ farm_id: farmId, day }).delete();
    await db('board_days').where({ farm_id: farmId, day }).delete();
    await db('hazards').where({ field_id: fieldId }).delete();
    await db('fields').where({ id: fieldId }).delete();
    await db('machines').where({ id: machineId }).delete();
    await db('memberships').where({ user_id: userId }).delete();
    await db('users').where({ id: userId }).delete();
  }

  return {
    farmId,
    userId,
    membershipId,
    fieldId,
    fieldName,
    machineId,
    jobId,
    // The job's day as it is now: moveTo changes it.
    get day() {
      return day;
    },
    tag,
    person,
    moveTo,
    remove,
  };
}
