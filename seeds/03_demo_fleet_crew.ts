// Fleet, crew skills, crop plans, the planned days ahead and two seasons of logged work for the
// fictional Tamarack Ridge Farm, as of the day the demo is loaded (demo-season.ts works out which
// days). Everything here is invented; names are neutral, never a maker's.
import { DateTime } from 'luxon';
import type { Operation } from '../shared/operations';
import { fieldCapacityAcPerH } from '../shared/plan/field-capacity';
import { implementDefaults, type ImplementKind } from '../shared/plan/implement-defaults';
import { demoCrop } from './02_demo_fields';
import { demoYear, type DemoOperation, type DemoPerson, type DemoPiece } from './demo-season';
import type { DemoStep } from './steps';

const MACHINES = [
  { key: '4wd1', name: '4WD No. 1', kind: 'tractor-4wd', power_hp: 520, service_interval_hours: 250 },
  { key: '4wd2', name: '4WD No. 2', kind: 'tractor-4wd', power_hp: 450, service_interval_hours: 250 },
  { key: 'mfwd', name: 'MFWD No. 1', kind: 'tractor-mfwd', power_hp: 180, service_interval_hours: 200 },
  { key: 'combine', name: 'Combine', kind: 'combine', power_hp: 430, service_interval_hours: 250 },
  { key: 'sprayer', name: 'Sprayer', kind: 'sprayer-sp', power_hp: 340, service_interval_hours: 300 },
  { key: 'swather', name: 'Swather', kind: 'swather-sp', power_hp: 190, service_interval_hours: 250 },
] as const;
type MachineKey = (typeof MACHINES)[number]['key'];

const FT = 0.3048;
const IMPLEMENTS: Array<{
  key: string;
  name: string;
  kind: ImplementKind;
  widthFt: number;
  transportM: number;
  operations: Operation[];
  machines: MachineKey[];
  minPowerHp?: number;
}> = [
  {
    key: 'harrow',
    name: '84 ft heavy harrow',
    kind: 'harrow',
    widthFt: 84,
    transportM: 6.1,
    operations: ['harrowing'],
    machines: [],
    minPowerHp: 350,
  },
  {
    key: 'drill',
    name: '60 ft air drill',
    kind: 'air-drill',
    widthFt: 60,
    transportM: 7.3,
    operations: ['seeding'],
    machines: ['4wd1', '4wd2'],
  },
  { key: 'boom', name: '120 ft boom', kind: 'sprayer', widthFt: 120, transportM: 4.0, operations: ['spraying'], machines: ['sprayer'] },
  {
    key: 'draper',
    name: '40 ft draper header',
    kind: 'combine-header',
    widthFt: 40,
    transportM: 12.4,
    operations: ['combining'],
    machines: ['combine'],
  },
  {
    key: 'swath',
    name: '30 ft swather header',
    kind: 'swather',
    widthFt: 30,
    transportM: 9.5,
    operations: ['swathing'],
    machines: ['swather'],
  },
];

const ALL: Operation[] = ['harrowing', 'tillage', 'seeding', 'spraying', 'swathing', 'combining', 'baling'];
const SKILLS: Record<string, Partial<Record<Operation, 'qualified' | 'learning' | 'mentor'>>> = {
  'ingrid@tamarack-ridge.example': Object.fromEntries(ALL.map((o) => [o, 'qualified'])),
  'tomas@tamarack-ridge.example': {
    harrowing: 'mentor',
    seeding: 'mentor',
    tillage: 'qualified',
    spraying: 'qualified',
    swathing: 'qualified',
    combining: 'qualified',
    baling: 'qualified',
  },
  'ada@tamarack-ridge.example': { spraying: 'qualified', swathing: 'qualified', combining: 'qualified', seeding: 'qualified' },
  'milo@tamarack-ridge.example': { harrowing: 'learning' },
};

/** The machine and implement each operation of the season runs with. */
const RIG: Record<DemoOperation, { machine: MachineKey; implement: string }> = {
  harrowing: { machine: '4wd1', implement: 'harrow' },
  seeding: { machine: '4wd2', implement: 'drill' },
  spraying: { machine: 'sprayer', implement: 'boom' },
  swathing: { machine: 'swather', implement: 'swath' },
  combining: { machine: 'combine', implement: 'draper' },
};

/** What the weather did on a day that was called off, by operation. */
const CALL_OFF_NOTE = (op: DemoOperation) => (op === 'spraying' ? 'Wind over 15 mph by mid-morning' : 'Rain overnight; too wet to go');

/** The owner's note on the first planned card of each operation. */
const PLANNED_NOTE: Record<DemoOperation, string> = {
  harrowing: 'Spread the straw rows evenly; keep the clearances shown on the map',
  seeding: 'Check the seed depth after the first round',
  spraying: 'Only if the wind is between 3 and 8 mph',
  swathing: 'Swath when most seeds on the main stem have turned colour',
  combining: 'Check the moisture of the first load before filling the bin',
};

const round = (n: number, d = 2) => Math.round(n * 10 ** d) / 10 ** d;

export const seedDemoFleetCrew: DemoStep = async (tx, { farmId, users, now }) => {
  const machineId = {} as Record<MachineKey, number>;
  const meter = {} as Record<MachineKey, number>;
  for (const [i, m] of MACHINES.entries()) {
    const { key, ...cols } = m;
    const [row] = await tx('machines')
      .insert({ farm_id: farmId, ...cols, engine_hours: 0 })
      .returning('id');
    machineId[key] = row.id;
    meter[key] = 1800 + i * 650;
  }
  const implementId: Record<string, number> = {};
  const widthM: Record<string, number> = {};
  for (const i of IMPLEMENTS) {
    widthM[i.key] = round(i.widthFt * FT, 4);
    const [row] = await tx('implements')
      .insert({
        farm_id: farmId,
        name: i.name,
        kind: i.kind,
        width_m: widthM[i.key],
        transport_width_m: i.transportM,
        operations: i.operations,
        min_power_hp: i.minPowerHp ?? null,
      })
      .returning('id');
    implementId[i.key] = row.id;
    if (i.machines.length)
      await tx('implement_hitches').insert(i.machines.map((k) => ({ farm_id: farmId, implement_id: row.id, machine_id: machineId[k] })));
  }

  const memberships: Array<{ id: number; user_id: number }> = await tx('memberships').where({ farm_id: farmId }).select('id', 'user_id');
  const member = (email: string) => memberships.find((m) => m.user_id === users[email])!.id;
  const person = (first: DemoPerson) => member(`${first}@tamarack-ridge.example`);
  const skillRows = Object.entries(SKILLS).flatMap(([email, skills]) =>
    Object.entries(skills).map(([operation, level]) => ({ farm_id: farmId, membership_id: member(email), operation, level })),
  );
  await tx('crew_skills').insert(skillRows);

  const fields: Array<{ id: number; name: string; acres: number }> = await tx('fields')
    .where({ farm_id: farmId })
    .orderBy('id')
    .select('id', 'name', 'acres');
  const zone: string = (await tx('farms').where({ id: farmId }).first('time_zone')).time_zone;
  const today = DateTime.fromJSDate(now ?? new Date())
    .setZone(zone)
    .startOf('day');

  const capacity = (key: string) => {
    const spec = IMPLEMENTS.find((i) => i.key === key)!;
    const d = implementDefaults(spec.kind);
    return fieldCapacityAcPerH(widthM[key], d.speedMps, d.efficiency);
  };
  const capacityAcPerH = Object.fromEntries(Object.entries(RIG).map(([op, r]) => [op, capacity(r.implement)])) as Record<
    DemoOperation,
    number
  >;
  const year = demoYear(
    today,
    (season) => fields.map((f) => ({ id: f.id, acres: Number(f.acres), crop: demoCrop(f.name, season) })),
    capacityAcPerH,
  );
  await tx('crop_plans').insert(
    year.cropSeasons.flatMap((season) => fields.map((f) => ({ farm_id: farmId, field_id: f.id, season, crop: demoCrop(f.name, season) }))),
  );

  // Each person's jobs of a day run in the order they were worked out; meters count up day by day.
  const pieces = [...year.pieces].sort((a, b) => a.day.localeCompare(b.day));
  const runOrder = new Map<string, number>();
  const noted = new Set<string>();
  const jobs = pieces.map((p: DemoPiece): Record<string, unknown> => {
    const who = person(p.who);
    const key = `${p.day}|${who}`;
    runOrder.set(key, (runOrder.get(key) ?? 0) + 1);
    const { machine, implement } = RIG[p.op];
    const base = {
      farm_id: farmId,
      day: p.day,
      field_id: p.fieldId,
      operation: p.op,
      operator_id: who,
      mentor_id: p.mentor ? person(p.mentor) : null,
      machine_id: machineId[machine],
      implement_id: implementId[implement],
      run_order: runOrder.get(key),
      acres_planned: round(p.acres, 4),
    };
    if (p.outcome === 'rained-off') return { ...base, state: 'called-off', call_off_reason: 'weather', note: CALL_OFF_NOTE(p.op) };
    if (p.outcome === 'open') {
      const first = !noted.has(`${p.day}|${p.op}`);
      noted.add(`${p.day}|${p.op}`);
      return { ...base, note: first ? PLANNED_NOTE[p.op] : null };
    }
    const day = DateTime.fromISO(p.day, { zone });
    const hours = round((p.acres / capacityAcPerH[p.op]) * (0.9 + ((p.fieldId * 7 + day.day) % 5) * 0.06));
    const startAt = day.set({ hour: 8 });
    const engine = round(hours * 1.12, 1);
    const row = {
      ...base,
      state: 'finished',
      started_at: startAt.toJSDate(),
      finished_at: startAt.plus({ hours }).toJSDate(),
      acres_done: round(p.acres, 4),
      hours_worked: hours,
      engine_hours_start: round(meter[machine], 1),
      engine_hours_end: round(meter[machine] + engine, 1),
    };
    meter[machine] = round(meter[machine] + engine + 0.4, 1);
    return row;
  });

  const inserted: Array<{
    id: number;
    state: string;
    operator_id: number;
    started_at: Date | null;
    finished_at: Date | null;
    acres_done: number | null;
    engine_hours_start: number | null;
    engine_hours_end: number | null;
    note: string | null;
    day: string;
  }> = [];
  for (let i = 0; i < jobs.length; i += 500)
    inserted.push(
      ...(await tx('assignments')
        .insert(jobs.slice(i, i + 500))
        .returning([
          'id',
          'state',
          'operator_id',
          'started_at',
          'finished_at',
          'acres_done',
          'engine_hours_start',
          'engine_hours_end',
          'note',
          'day',
        ])),
    );
  const userOf = new Map(memberships.map((m) => [m.id, m.user_id]));
  const events = inserted.flatMap((a): Array<Record<string, unknown>> => {
    const by = userOf.get(a.operator_id) ?? null;
    const base = { farm_id: farmId, assignment_id: a.id, by_user_id: by };
    if (a.state === 'called-off')
      return [{ ...base, type: 'call-off', at: DateTime.fromISO(`${a.day}T07:30`, { zone }).toJSDate(), reason: 'weather', note: a.note }];
    if (a.state !== 'finished') return [];
    return [
      { ...base, type: 'start', at: a.started_at, engine_hours: a.engine_hours_start },
      { ...base, type: 'finish', at: a.finished_at, engine_hours: a.engine_hours_end, acres: a.acres_done },
    ];
  });
  for (let i = 0; i < events.length; i += 500) await tx('assignment_events').insert(events.slice(i, i + 500));

  // Meters end where the log leaves them; the MFWD did chores outside the log and is due for service.
  meter.mfwd += 410;
  for (const m of MACHINES) {
    const lastService = m.key === 'mfwd' ? meter.mfwd - 215 : meter[m.key] - ((meter[m.key] * 7) % 180);
    await tx('machines')
      .where({ id: machineId[m.key] })
      .update({ engine_hours: meter[m.key], hours_at_last_service: round(lastService, 1) });
  }

  // The planned days ahead: the owner has laid out the next days with work (not yet published).
  for (const day of year.plannedDays) {
    await tx('board_days').insert({ farm_id: farmId, day, version: 1 });
    await tx('board_changes').insert({
      farm_id: farmId,
      day,
      version: 1,
      by_user_id: users['ingrid@tamarack-ridge.example'],
      summary: 'Planned the day',
    });
  }
};
