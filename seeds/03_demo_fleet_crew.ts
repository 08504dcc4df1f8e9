// Fleet, crew skills, tomorrow's work board and two seasons of logged work for the fictional
// Tamarack Ridge Farm. Everything here is invented; names are neutral, never a maker's.
import { DateTime } from 'luxon';
import type { Operation } from '../shared/operations';
import { effectiveCapacityAcPerH } from '../shared/plan/field-capacity';
import { implementDefaults, type ImplementKind } from '../shared/plan/implement-defaults';
import { mToFt } from '../shared/units';
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

/** Which machine and implement, who, and when (month, first day) each operation of the year runs. */
const SEASON: Array<{
  op: Operation;
  machine: MachineKey;
  implement: string;
  month: number;
  day: number;
  spread: number;
  people: string[];
}> = [
  { op: 'harrowing', machine: '4wd1', implement: 'harrow', month: 4, day: 10, spread: 14, people: ['tomas', 'milo'] },
  { op: 'seeding', machine: '4wd2', implement: 'drill', month: 4, day: 24, spread: 26, people: ['tomas', 'ada'] },
  { op: 'spraying', machine: 'sprayer', implement: 'boom', month: 6, day: 4, spread: 22, people: ['ada'] },
  { op: 'swathing', machine: 'swather', implement: 'swath', month: 8, day: 8, spread: 14, people: ['ada', 'tomas'] },
  { op: 'combining', machine: 'combine', implement: 'draper', month: 8, day: 20, spread: 34, people: ['tomas', 'ingrid'] },
];

/** This season's jobs left for tomorrow's board (and a called-off spraying day), so it has work to show. */
const LEFT_FOR_TOMORROW = new Set(['North Section|seeding', 'Tamarack Flats|seeding', 'Slough Quarter|spraying']);
/** Share of North Section harrowed this season before tomorrow; Milo harrows the rest. */
const NORTH_HARROWED = 0.4;

const round = (n: number, d = 2) => Math.round(n * 10 ** d) / 10 ** d;

export const seedDemoFleetCrew: DemoStep = async (tx, { farmId, users }) => {
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
  const person = (first: string) => member(`${first}@tamarack-ridge.example`);
  const skillRows = Object.entries(SKILLS).flatMap(([email, skills]) =>
    Object.entries(skills).map(([operation, level]) => ({ farm_id: farmId, membership_id: member(email), operation, level })),
  );
  await tx('crew_skills').insert(skillRows);

  const fields: Array<{ id: number; name: string; acres: number }> = await tx('fields')
    .where({ farm_id: farmId })
    .orderBy('id')
    .select('id', 'name', 'acres');
  const byName = (name: string) => fields.find((f) => f.name === name)!;
  const crops: Array<{ field_id: number; season: number; crop: string }> = await tx('crop_plans')
    .where({ farm_id: farmId })
    .select('field_id', 'season', 'crop');
  const zone: string = (await tx('farms').where({ id: farmId }).first('time_zone')).time_zone;
  const today = DateTime.now().setZone(zone).startOf('day');
  const thisSeason = today.year;

  const jobs: Array<Record<string, unknown>> = [];
  const runOrder = new Map<string, number>();
  const capacity = (key: string) => {
    const spec = IMPLEMENTS.find((i) => i.key === key)!;
    const d = implementDefaults(spec.kind);
    return effectiveCapacityAcPerH(mToFt(widthM[key]), d.speedMph, d.efficiency);
  };
  const log = (job: {
    day: DateTime;
    fieldId: number;
    op: Operation;
    who: number;
    mentor?: number;
    machine: MachineKey;
    implement: string;
    acres: number;
    calledOff?: string;
  }) => {
    const key = `${job.day.toISODate()}|${job.who}`;
    runOrder.set(key, (runOrder.get(key) ?? 0) + 1);
    const hours = round((job.acres / capacity(job.implement)) * (0.9 + ((job.fieldId * 7 + job.day.day) % 5) * 0.06));
    const startAt = job.day.set({ hour: 8 });
    const base = {
      farm_id: farmId,
      day: job.day.toISODate(),
      field_id: job.fieldId,
      operation: job.op,
      operator_id: job.who,
      mentor_id: job.mentor ?? null,
      machine_id: machineId[job.machine],
      implement_id: implementId[job.implement],
      run_order: runOrder.get(key),
      acres_planned: job.acres,
    };
    if (job.calledOff) {
      jobs.push({ ...base, state: 'called-off', call_off_reason: 'weather', note: job.calledOff });
      return;
    }
    const engine = round(hours * 1.12, 1);
    jobs.push({
      ...base,
      state: 'finished',
      started_at: startAt.toJSDate(),
      finished_at: startAt.plus({ hours }).toJSDate(),
      acres_done: round(job.acres, 4),
      hours_worked: hours,
      engine_hours_start: round(meter[job.machine], 1),
      engine_hours_end: round(meter[job.machine] + engine, 1),
    });
    meter[job.machine] = round(meter[job.machine] + engine + 0.4, 1);
  };

  for (const season of [thisSeason - 1, thisSeason]) {
    fields.forEach((f, i) => {
      const crop = crops.find((c) => c.field_id === f.id && c.season === season)?.crop;
      for (const s of SEASON) {
        if (s.op === 'swathing' && crop !== 'canola') continue;
        const day = DateTime.fromObject({ year: season, month: s.month, day: s.day }, { zone }).plus({ days: (i * 3) % s.spread });
        if (day >= today) continue;
        const pair = `${f.name}|${s.op}`;
        const who = person(s.people[i % s.people.length]);
        const mentor = who === person('milo') ? person('tomas') : undefined;
        const job = { fieldId: f.id, op: s.op, who, mentor, machine: s.machine, implement: s.implement };
        if (season === thisSeason && LEFT_FOR_TOMORROW.has(pair)) {
          if (s.op === 'spraying') log({ ...job, day, acres: f.acres, calledOff: 'Wind over 15 mph by mid-morning' });
          continue;
        }
        if (season === thisSeason && pair === 'North Section|harrowing') log({ ...job, day, acres: f.acres * NORTH_HARROWED });
        else if (i % 4 === 1) {
          // A field finished over two days: a partial finish, then the rest.
          log({ ...job, day, acres: f.acres * 0.55 });
          log({ ...job, day: day.plus({ days: 1 }), acres: f.acres * 0.45 });
        } else if (season === thisSeason - 1 && i % 5 === 3) {
          log({ ...job, day, acres: f.acres, calledOff: 'Rain overnight; too wet to go' });
          log({ ...job, day: day.plus({ days: 2 }), acres: f.acres });
        } else log({ ...job, day, acres: f.acres });
      }
    });
  }
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
  }> = jobs.length
    ? await tx('assignments')
        .insert(jobs)
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
        ])
    : [];
  const userOf = new Map(memberships.map((m) => [m.id, m.user_id]));
  const events = inserted.flatMap((a): Array<Record<string, unknown>> => {
    const by = userOf.get(a.operator_id) ?? null;
    const base = { farm_id: farmId, assignment_id: a.id, by_user_id: by };
    if (a.state === 'called-off')
      return [{ ...base, type: 'call-off', at: DateTime.fromISO(`${a.day}T07:30`, { zone }).toJSDate(), reason: 'weather', note: a.note }];
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

  // Tomorrow: Milo harrows North Section, mentored by Tomas who seeds beside him, then Tomas seeds
  // Tamarack Flats; Ada sprays Slough Quarter (called off for wind earlier in the season).
  const tomorrow = today.plus({ days: 1 }).toISODate()!;
  const north = byName('North Section');
  await tx('assignments').insert([
    {
      farm_id: farmId,
      day: tomorrow,
      field_id: north.id,
      operation: 'harrowing',
      operator_id: person('milo'),
      mentor_id: person('tomas'),
      machine_id: machineId['4wd1'],
      implement_id: implementId.harrow,
      run_order: 1,
      acres_planned: round(north.acres * (1 - NORTH_HARROWED), 4),
      note: 'Stay on the south half until Tomas has the drill going',
    },
    {
      farm_id: farmId,
      day: tomorrow,
      field_id: north.id,
      operation: 'seeding',
      operator_id: person('tomas'),
      machine_id: machineId['4wd2'],
      implement_id: implementId.drill,
      run_order: 1,
      acres_planned: 200,
      note: 'Check the seed depth after the first round',
    },
    {
      farm_id: farmId,
      day: tomorrow,
      field_id: byName('Tamarack Flats').id,
      operation: 'seeding',
      operator_id: person('tomas'),
      machine_id: machineId['4wd2'],
      implement_id: implementId.drill,
      run_order: 2,
      acres_planned: 80,
      note: null,
    },
    {
      farm_id: farmId,
      day: tomorrow,
      field_id: byName('Slough Quarter').id,
      operation: 'spraying',
      operator_id: person('ada'),
      machine_id: machineId.sprayer,
      implement_id: implementId.boom,
      run_order: 1,
      acres_planned: byName('Slough Quarter').acres,
      note: 'Only if the wind is between 3 and 8 mph',
    },
  ]);
  await tx('board_days').insert({ farm_id: farmId, day: tomorrow, version: 1 });
  await tx('board_changes').insert({
    farm_id: farmId,
    day: tomorrow,
    version: 1,
    by_user_id: users['ingrid@tamarack-ridge.example'],
    summary: 'Planned the day',
  });
};
