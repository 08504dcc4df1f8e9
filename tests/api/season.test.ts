// The season report against fixture logs this file writes itself. Every expected figure is worked
// out here from the fixture rows with plain sums (no call into the code under test) and must match
// the API and the CSV to the hundredth of an acre.
import { OPERATIONS, type Operation } from '../../shared/operations';
import type { SeasonSummary } from '../../shared/schemas/season';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';

const YEAR = 2026;
/** Square metres per acre (international foot, exact) and per hectare: for the metric CSV check. */
const HA_PER_ACRE = 4046.8564224 / 10_000;
/** The work board counts a field done for an operation when less than this is left (acres). */
const DONE_WITHIN = 0.05;

interface FieldFx {
  key: string;
  name: string;
  acres: number;
  crop: string | null;
  id?: number;
}
interface JobFx {
  key: string;
  day: string;
  field: string;
  operation: Operation;
  operator: 'operator' | 'second' | 'owner';
  machine: 'tractor' | 'sprayer';
  implement: 'harrow' | 'drill' | 'boom';
  state: 'finished' | 'called-off' | 'planned' | 'underway';
  acresPlanned: number;
  acres: number | null;
  hours: number | null;
  meter: [number, number] | null;
  id?: number;
}

// A field name with a comma and quotes, and one a spreadsheet would take for a formula.
const FIELDS: FieldFx[] = [
  { key: 'north', name: 'North Quarter', acres: 160.25, crop: 'spring wheat' },
  { key: 'slough', name: 'Slough Eighty', acres: 80.5, crop: 'canola' },
  { key: 'home', name: 'Home Half, "by the bins"', acres: 320.75, crop: 'Summer fallow' },
  { key: 'hill', name: '=Hill Forty', acres: 40, crop: null },
  { key: 'spare', name: 'Spare Twenty', acres: 20.4, crop: 'barley' },
];

const JOBS: JobFx[] = [
  // Two operators finish North Quarter's harrowing over two days.
  {
    key: 'n-harrow-1',
    day: '2026-04-20',
    field: 'north',
    operation: 'harrowing',
    operator: 'operator',
    machine: 'tractor',
    implement: 'harrow',
    state: 'finished',
    acresPlanned: 160.25,
    acres: 100.25,
    hours: 3.5,
    meter: [1000, 1003.8],
  },
  {
    key: 'n-harrow-2',
    day: '2026-04-21',
    field: 'north',
    operation: 'harrowing',
    operator: 'second',
    machine: 'tractor',
    implement: 'harrow',
    state: 'finished',
    acresPlanned: 60,
    acres: 60,
    hours: 2.25,
    meter: [1003.8, 1006.1],
  },
  // A partial finish with no meter readings, then a called-off day on the same field.
  {
    key: 's-harrow-1',
    day: '2026-04-21',
    field: 'slough',
    operation: 'harrowing',
    operator: 'operator',
    machine: 'tractor',
    implement: 'harrow',
    state: 'finished',
    acresPlanned: 80.5,
    acres: 40.5,
    hours: 1.5,
    meter: null,
  },
  {
    key: 's-harrow-off',
    day: '2026-04-22',
    field: 'slough',
    operation: 'harrowing',
    operator: 'operator',
    machine: 'tractor',
    implement: 'harrow',
    state: 'called-off',
    acresPlanned: 40,
    acres: null,
    hours: null,
    meter: null,
  },
  // Rained off the same day on another field: a second job, the same day lost.
  {
    key: 'n-harrow-off',
    day: '2026-04-22',
    field: 'north',
    operation: 'harrowing',
    operator: 'second',
    machine: 'tractor',
    implement: 'harrow',
    state: 'called-off',
    acresPlanned: 20,
    acres: null,
    hours: null,
    meter: null,
  },
  {
    key: 'h-harrow',
    day: '2026-04-28',
    field: 'home',
    operation: 'harrowing',
    operator: 'second',
    machine: 'tractor',
    implement: 'harrow',
    state: 'finished',
    acresPlanned: 320.75,
    acres: 320.75,
    hours: 7.75,
    meter: [1006.1, 1014.3],
  },
  // Work on a field with no crop planned counts as done, not as planned.
  {
    key: 'hill-harrow',
    day: '2026-05-01',
    field: 'hill',
    operation: 'harrowing',
    operator: 'owner',
    machine: 'tractor',
    implement: 'harrow',
    state: 'finished',
    acresPlanned: 40,
    acres: 40,
    hours: 1,
    meter: [1014.3, 1015.4],
  },
  // The tractor again, for a second operation.
  {
    key: 'n-seed',
    day: '2026-05-04',
    field: 'north',
    operation: 'seeding',
    operator: 'operator',
    machine: 'tractor',
    implement: 'drill',
    state: 'finished',
    acresPlanned: 160.25,
    acres: 160.25,
    hours: 6.75,
    meter: [1015.4, 1022.6],
  },
  // Spraying twice: the acres add up, the coverage of the field does not.
  {
    key: 's-spray-1',
    day: '2026-06-10',
    field: 'slough',
    operation: 'spraying',
    operator: 'second',
    machine: 'sprayer',
    implement: 'boom',
    state: 'finished',
    acresPlanned: 80.5,
    acres: 80.5,
    hours: 1.25,
    meter: [500, 501.4],
  },
  {
    key: 's-spray-2',
    day: '2026-06-24',
    field: 'slough',
    operation: 'spraying',
    operator: 'second',
    machine: 'sprayer',
    implement: 'boom',
    state: 'finished',
    acresPlanned: 80.5,
    acres: 79.8,
    hours: 1.3,
    meter: [501.4, 502.9],
  },
  // Not counted: planned and underway jobs, and last season's work.
  {
    key: 'n-spray-planned',
    day: '2026-06-25',
    field: 'north',
    operation: 'spraying',
    operator: 'operator',
    machine: 'sprayer',
    implement: 'boom',
    state: 'planned',
    acresPlanned: 160.25,
    acres: null,
    hours: null,
    meter: null,
  },
  {
    key: 'spare-underway',
    day: '2026-05-05',
    field: 'spare',
    operation: 'seeding',
    operator: 'operator',
    machine: 'tractor',
    implement: 'drill',
    state: 'underway',
    acresPlanned: 20.4,
    acres: null,
    hours: null,
    meter: [1022.6, 1023],
  },
  {
    key: 'n-harrow-2025',
    day: '2025-12-31',
    field: 'north',
    operation: 'harrowing',
    operator: 'operator',
    machine: 'tractor',
    implement: 'harrow',
    state: 'finished',
    acresPlanned: 155,
    acres: 155,
    hours: 5,
    meter: [900, 905],
  },
];

/** The fleet's implements: an operation counts as planned when one of them does it (or work was logged). */
const IMPLEMENTS: Array<{ key: JobFx['implement'] | 'disk'; name: string; kind: string; operations: Operation[] }> = [
  { key: 'harrow', name: 'Harrow 70', kind: 'harrow', operations: ['harrowing'] },
  { key: 'drill', name: 'Drill 60', kind: 'air-drill', operations: ['seeding'] },
  { key: 'boom', name: 'Boom 120', kind: 'sprayer', operations: ['spraying'] },
  { key: 'disk', name: 'Disk 30', kind: 'disk', operations: ['tillage'] },
];

/** Saved pass plans (summary.hours); one with no hours in its summary counts as no plan. */
const PLANS: Array<{ field: string; operation: Operation; hours: number | null }> = [
  { field: 'north', operation: 'harrowing', hours: 5.5 },
  { field: 'slough', operation: 'harrowing', hours: 2.75 },
  { field: 'north', operation: 'seeding', hours: 7 },
  { field: 'home', operation: 'seeding', hours: 9 }, // fallow: never planned for seeding
  { field: 'spare', operation: 'harrowing', hours: null },
];

// ── The expected figures, from the fixture rows alone ──────────────────────────────────────────

const sum = (xs: number[]) => xs.reduce((s, x) => s + x, 0);
const fieldOf = (key: string) => FIELDS.find((f) => f.key === key)!;
const isFallow = (crop: string | null) => !!crop && /\bfallow\b/i.test(crop);
const appliesTo = (f: FieldFx, op: Operation) => f.crop !== null && (!isFallow(f.crop) || op === 'harrowing' || op === 'tillage');
const fleetDoes = (op: Operation) => IMPLEMENTS.some((i) => i.operations.includes(op));
const meterHours = (j: JobFx) => (j.meter && j.meter[1] >= j.meter[0] ? j.meter[1] - j.meter[0] : 0);
/** Monday of the day's ISO week. */
function mondayOf(day: string): string {
  const d = new Date(`${day}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() - ((d.getUTCDay() + 6) % 7));
  return d.toISOString().slice(0, 10);
}
const addDays = (day: string, n: number) => new Date(Date.parse(`${day}T00:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10);

function expected(jobs: JobFx[], people: Record<JobFx['operator'], { id: number; name: string }>) {
  const done = jobs.filter((j) => j.state === 'finished' && j.day.startsWith(`${YEAR}-`));
  // Every called-off job of the fixture was called off for weather.
  const rainedOff = jobs.filter((j) => j.state === 'called-off' && j.day.startsWith(`${YEAR}-`));
  const operations = OPERATIONS.map((op) => {
    const jobsOf = done.filter((j) => j.operation === op);
    const farmDoes = fleetDoes(op) || jobsOf.length > 0;
    const planned = FIELDS.filter((f) => farmDoes && appliesTo(f, op));
    const withPlan = planned.filter((f) => PLANS.some((p) => p.field === f.key && p.operation === op && p.hours !== null));
    const plannedHours = withPlan.length
      ? sum(withPlan.map((f) => PLANS.find((p) => p.field === f.key && p.operation === op)!.hours!))
      : null;
    const acresPlanned = sum(planned.map((f) => f.acres));
    const covered = sum(planned.map((f) => Math.min(f.acres, sum(jobsOf.filter((j) => j.field === f.key).map((j) => j.acres!)))));
    const acres = sum(jobsOf.map((j) => j.acres!));
    const hours = sum(jobsOf.map((j) => j.hours!));
    const acresWithPlan = sum(withPlan.map((f) => f.acres));
    return {
      operation: op,
      acresPlanned,
      acresCovered: covered,
      acresFinished: acres,
      hoursLogged: hours,
      engineHours: sum(jobsOf.map(meterHours)),
      plannedHours,
      acresWithPlan,
      acresPerHour: hours > 0 ? acres / hours : null,
      plannedAcresPerHour: plannedHours ? acresWithPlan / plannedHours : null,
      progress: acresPlanned > 0 ? Math.min(1, covered / acresPlanned) : 0,
      jobsFinished: jobsOf.length,
      jobsCalledOff: rainedOff.filter((j) => j.operation === op).length,
      weatherDaysLost: new Set(rainedOff.filter((j) => j.operation === op).map((j) => j.day)).size,
      jobsCalledOffForWeather: rainedOff.filter((j) => j.operation === op).length,
    };
  });

  const weeksFrom = done.map((j) => mondayOf(j.day)).sort();
  const allWeeks: string[] = [];
  for (let w = weeksFrom[0]; w <= weeksFrom[weeksFrom.length - 1]; w = addDays(w, 7)) allWeeks.push(w);
  const weekly = OPERATIONS.filter((op) => done.some((j) => j.operation === op)).flatMap((op) => {
    let running = 0;
    return allWeeks.map((week) => {
      const acres = sum(done.filter((j) => j.operation === op && mondayOf(j.day) === week).map((j) => j.acres!));
      running += acres;
      return { operation: op, week, acresFinished: acres, cumulativeAcres: running };
    });
  });

  const byField = FIELDS.filter((f) => f.crop !== null || done.some((j) => j.field === f.key)).map((f) => {
    const ops: Record<string, { acres: number; hours: number; dateFinished: string | null }> = {};
    for (const op of OPERATIONS) {
      const js = done.filter((j) => j.field === f.key && j.operation === op).sort((a, b) => a.day.localeCompare(b.day));
      if (!js.length) continue;
      let running = 0;
      let finishedOn: string | null = null;
      for (const j of js) {
        running += j.acres!;
        if (finishedOn === null && running >= f.acres - DONE_WITHIN) finishedOn = j.day;
      }
      ops[op] = { acres: running, hours: sum(js.map((j) => j.hours!)), dateFinished: finishedOn };
    }
    return { field: f.name, crop: f.crop, acres: f.acres, operations: ops };
  });

  const byPerson = (Object.keys(people) as JobFx['operator'][])
    .filter((who) => done.some((j) => j.operator === who))
    .map((who) => {
      const js = done.filter((j) => j.operator === who);
      const ops: Record<string, { acres: number; hours: number }> = {};
      for (const j of js)
        ops[j.operation] = { acres: (ops[j.operation]?.acres ?? 0) + j.acres!, hours: (ops[j.operation]?.hours ?? 0) + j.hours! };
      return {
        membershipId: people[who].id,
        name: people[who].name,
        operations: ops,
        totalAcres: sum(js.map((j) => j.acres!)),
        totalHours: sum(js.map((j) => j.hours!)),
      };
    });

  const byMachine = (['tractor', 'sprayer'] as const).map((m) => {
    const js = done.filter((j) => j.machine === m);
    const engineHours = sum(js.map(meterHours));
    const acres = sum(js.map((j) => j.acres!));
    const ops = OPERATIONS.filter((op) => js.some((j) => j.operation === op)).map((op) => {
      const o = js.filter((j) => j.operation === op);
      return { operation: op, acres: sum(o.map((j) => j.acres!)), hours: sum(o.map((j) => j.hours!)), engineHours: sum(o.map(meterHours)) };
    });
    return {
      key: m,
      engineHours,
      acres,
      hours: sum(js.map((j) => j.hours!)),
      acresPerEngineHour: engineHours > 0 ? acres / engineHours : null,
      operations: ops,
    };
  });

  const acres = sum(done.map((j) => j.acres!));
  const hours = sum(done.map((j) => j.hours!));
  const totals = {
    acresFinished: acres,
    hoursLogged: hours,
    engineHours: sum(done.map(meterHours)),
    acresPerHour: acres / hours,
    jobsFinished: done.length,
    jobsCalledOff: rainedOff.length,
    weatherDaysLost: new Set(rainedOff.map((j) => j.day)).size,
    jobsCalledOffForWeather: rainedOff.length,
    fieldsWorked: new Set(done.map((j) => j.field)).size,
  };
  return { operations, weekly, byField, byPerson, byMachine, totals };
}

// ── Comparing, to the hundredth ────────────────────────────────────────────────────────────────

/** Equal to the hundredth: what rounding to 2 decimals may move (0.005), and no more. */
function near(actual: number | null | undefined, wanted: number | null, what: string): void {
  if (wanted === null) {
    expect({ what, actual }).toEqual({ what, actual: null });
    return;
  }
  if (typeof actual !== 'number' || Math.abs(actual - wanted) > 0.005 + 1e-9)
    throw new Error(`${what}: got ${actual}, expected ${wanted.toFixed(4)}`);
}

function nearAll(actual: object, wanted: object, what: string): void {
  for (const [k, v] of Object.entries(wanted)) {
    const got = (actual as Record<string, unknown>)[k];
    if (typeof v === 'number' || v === null) near(got as number | null, v, `${what}.${k}`);
    else if (typeof v === 'string') expect({ what: `${what}.${k}`, got }).toEqual({ what: `${what}.${k}`, got: v });
  }
}

/** RFC 4180: quoted fields may hold commas, CRLF and doubled quotes; records end with CRLF. */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      row.push(cell);
      cell = '';
    } else if (c === '\r' && text[i + 1] === '\n') {
      row.push(cell);
      rows.push(row);
      row = [];
      cell = '';
      i++;
    } else cell += c;
  }
  if (cell || row.length) throw new Error('the last record does not end with CRLF');
  return rows;
}

/** The CSV as objects keyed by the header, after checking the BOM, the header and the file name. */
async function csvOf(client: Client, table: string, header: string[], year = YEAR): Promise<Array<Record<string, string>>> {
  const res = await client
    .get(`/api/season/${year}/export/${table}.csv`)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toMatch(/^text\/csv; charset=utf-8/);
  expect(res.headers['content-disposition']).toBe(`attachment; filename="furlong-${year}-${table}.csv"`);
  const bytes = res.body as Buffer;
  expect([...bytes.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
  const [head, ...rows] = parseCsv(bytes.subarray(3).toString('utf8'));
  expect(head).toEqual(header);
  for (const r of rows) expect(r).toHaveLength(header.length);
  return rows.map((r) => Object.fromEntries(head.map((h, i) => [h, r[i]])));
}

/**
 * A CSV number: the decimals the season screen shows (one for areas, hours and rates, shared/figures.ts),
 * within the half tenth that rounding to one decimal may move it, and no more.
 */
function csvNear(cell: string, wanted: number | null, what: string): void {
  if (wanted === null) {
    expect({ what, cell }).toEqual({ what, cell: '' });
    return;
  }
  expect({ what, cell: /^-?\d+\.\d$/.test(cell) }).toEqual({ what, cell: true });
  if (Math.abs(Number(cell) - wanted) > 0.05 + 1e-9) throw new Error(`${what}: got ${cell}, expected ${wanted.toFixed(4)}`);
}

const OPERATIONS_HEADER = [
  'operation',
  'acres_planned',
  'acres_covered',
  'acres_finished',
  'progress_percent',
  'hours_logged',
  'planned_hours',
  'acres_with_plan',
  'acres_per_hour',
  'planned_acres_per_hour',
  'engine_hours',
  'jobs_finished',
  'jobs_called_off',
  'weather_days_lost',
  'jobs_called_off_for_weather',
  // Money columns: checked to the cent in season-costs.test.ts.
  'cost_dollars',
  'machine_cost_dollars',
  'labour_cost_dollars',
  'fuel_cost_dollars',
  'cost_per_acre_dollars',
  'jobs_without_rates',
  // Measured from tracks: checked in measured-acres.test.ts.
  'jobs_measured',
  'acres_measured',
];

const LABEL: Record<Operation, string> = {
  harrowing: 'Harrowing',
  tillage: 'Disking / tillage',
  seeding: 'Seeding',
  spraying: 'Spraying',
  swathing: 'Swathing',
  combining: 'Combining',
  baling: 'Baling',
};

describe('season report', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let viewer: Client;
  let operator: Client;
  let people: Record<JobFx['operator'], { id: number; name: string }>;
  const machineIds: Record<string, number> = {};

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Season');
    const db = t.db;
    const [u2] = await db('users')
      .insert({ email: `second-${farm.id}@furlong.test`, name: `Second Operator ${farm.id}` })
      .returning(['id', 'name']);
    const [m2] = await db('memberships').insert({ farm_id: farm.id, user_id: u2.id, role: 'operator', status: 'active' }).returning('id');
    people = {
      operator: { id: farm.operator.membershipId, name: farm.operator.name },
      second: { id: m2.id, name: u2.name },
      owner: { id: farm.owner.membershipId, name: farm.owner.name },
    };
    for (const [i, f] of FIELDS.entries()) {
      const [row] = await db('fields')
        .insert({
          farm_id: farm.id,
          name: f.name,
          boundary: JSON.stringify(rect(-99.9 + i * 0.01, 47.6, 0.005, 0.005)),
          area_m2: f.acres * 4046.8564224,
          acres: f.acres,
        })
        .returning('id');
      f.id = row.id;
      if (f.crop) await db('crop_plans').insert({ farm_id: farm.id, field_id: row.id, season: YEAR, crop: f.crop });
    }
    await db('crop_plans').insert({ farm_id: farm.id, field_id: fieldOf('hill').id, season: YEAR - 1, crop: 'durum' });
    const [tractor] = await db('machines')
      .insert({ farm_id: farm.id, name: 'Big Tractor', kind: 'tractor-4wd', power_hp: 470, engine_hours: 1023 })
      .returning('id');
    const [sprayer] = await db('machines')
      .insert({ farm_id: farm.id, name: 'Sprayer, "SP"', kind: 'sprayer-sp', power_hp: 300, engine_hours: 503 })
      .returning('id');
    machineIds.tractor = tractor.id;
    machineIds.sprayer = sprayer.id;
    const implementIds: Record<string, number> = {};
    for (const i of IMPLEMENTS) {
      implementIds[i.key] = (
        await db('implements')
          .insert({ farm_id: farm.id, name: i.name, kind: i.kind, width_m: 20, operations: i.operations })
          .returning('id')
      )[0].id;
    }
    for (const [i, j] of JOBS.entries()) {
      const [row] = await db('assignments')
        .insert({
          farm_id: farm.id,
          day: j.day,
          field_id: fieldOf(j.field).id,
          operation: j.operation,
          operator_id: people[j.operator].id,
          machine_id: machineIds[j.machine],
          implement_id: implementIds[j.implement],
          run_order: i + 1,
          state: j.state,
          acres_planned: j.acresPlanned,
          acres_done: j.acres,
          hours_worked: j.hours,
          engine_hours_start: j.meter?.[0] ?? null,
          engine_hours_end: j.state === 'finished' ? (j.meter?.[1] ?? null) : null,
          call_off_reason: j.state === 'called-off' ? 'weather' : null,
        })
        .returning('id');
      j.id = row.id;
      // The run sheet logs a call-off with its reason; the weather days lost read that log.
      if (j.state === 'called-off')
        await db('assignment_events').insert({ farm_id: farm.id, assignment_id: row.id, type: 'call-off', reason: 'weather' });
    }
    for (const p of PLANS) {
      await db('pass_plans').insert({
        farm_id: farm.id,
        field_id: fieldOf(p.field).id,
        operation: p.operation,
        width_m: 20,
        headland_passes: 1,
        coverage: 'gaps-ok',
        speed_mps: 3.12928, // 7 mph
        efficiency: 0.8,
        turn_seconds: 20,
        summary: JSON.stringify(p.hours === null ? { passCount: 3 } : { hours: p.hours, fieldAcres: fieldOf(p.field).acres }),
      });
    }
    // Another farm's finished job on the same days must never show here.
    const other = await makeFarm(db, 'Season other');
    const [of] = await db('fields')
      .insert({ farm_id: other.id, name: 'Elsewhere', boundary: JSON.stringify(rect(-98, 47, 0.01, 0.01)), area_m2: 1e6, acres: 247.1 })
      .returning('id');
    const [om] = await db('machines')
      .insert({ farm_id: other.id, name: 'Other tractor', kind: 'tractor-mfwd', power_hp: 200 })
      .returning('id');
    const [oi] = await db('implements')
      .insert({ farm_id: other.id, name: 'Other harrow', kind: 'harrow', width_m: 15, operations: ['harrowing'] })
      .returning('id');
    await db('assignments').insert({
      farm_id: other.id,
      day: '2026-04-20',
      field_id: of.id,
      operation: 'harrowing',
      operator_id: other.operator.membershipId,
      machine_id: om.id,
      implement_id: oi.id,
      run_order: 1,
      state: 'finished',
      acres_planned: 247.1,
      acres_done: 247.1,
      hours_worked: 9,
    });

    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    viewer = new Client(t.app);
    await viewer.signIn(farm.viewer.email, farm.viewer.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
  });
  afterAll(() => t.close());

  async function summary(client: Client = viewer, year = YEAR): Promise<SeasonSummary> {
    const res = await client.get(`/api/season/${year}/summary`);
    expect(res.status).toBe(200);
    return res.body as SeasonSummary;
  }

  function checkSummary(s: SeasonSummary, jobs: JobFx[]): void {
    const want = expected(jobs, people);
    expect(s.year).toBe(YEAR);
    expect(s.operations.map((o) => o.operation)).toEqual([...OPERATIONS]);
    for (const w of want.operations)
      nearAll(
        s.operations.find((o) => o.operation === w.operation)!,
        w,
        `operations.${w.operation}`,
      );

    expect(s.weekly.map((w) => `${w.operation} ${w.week}`)).toEqual(want.weekly.map((w) => `${w.operation} ${w.week}`));
    s.weekly.forEach((w, i) => nearAll(w, want.weekly[i], `weekly.${w.operation}.${w.week}`));

    expect(s.byField.map((f) => f.field).sort()).toEqual(want.byField.map((f) => f.field).sort());
    for (const w of want.byField) {
      const f = s.byField.find((x) => x.field === w.field)!;
      near(f.acres, w.acres, `${w.field}.acres`);
      expect(f.crop).toBe(w.crop);
      expect(Object.keys(f.operations).sort()).toEqual(Object.keys(w.operations).sort());
      for (const [op, v] of Object.entries(w.operations)) nearAll(f.operations[op as Operation]!, v, `${w.field}.${op}`);
    }

    expect(s.byPerson.map((p) => p.membershipId).sort()).toEqual(want.byPerson.map((p) => p.membershipId).sort());
    for (const w of want.byPerson) {
      const p = s.byPerson.find((x) => x.membershipId === w.membershipId)!;
      expect(p.name).toBe(w.name);
      nearAll(p, { totalAcres: w.totalAcres, totalHours: w.totalHours }, `person ${w.name}`);
      expect(Object.keys(p.operations).sort()).toEqual(Object.keys(w.operations).sort());
      for (const [op, v] of Object.entries(w.operations)) nearAll(p.operations[op as Operation]!, v, `person ${w.name}.${op}`);
    }

    for (const w of want.byMachine) {
      const m = s.byMachine.find((x) => x.machineId === machineIds[w.key])!;
      nearAll(
        m,
        { engineHours: w.engineHours, acres: w.acres, hours: w.hours, acresPerEngineHour: w.acresPerEngineHour },
        `machine ${w.key}`,
      );
      expect(m.operations.map((o) => o.operation)).toEqual(w.operations.map((o) => o.operation));
      m.operations.forEach((o, i) => nearAll(o, w.operations[i], `machine ${w.key}.${o.operation}`));
    }
    nearAll(s.totals, want.totals, 'totals');
  }

  it('when a viewer reads the season, then every total matches the fixture logs to the hundredth', async () => {
    const s = await summary();
    checkSummary(s, JOBS);
    // Spot checks a farmer would make by hand.
    const harrowing = s.operations.find((o) => o.operation === 'harrowing')!;
    expect(harrowing.acresFinished).toBeCloseTo(100.25 + 60 + 40.5 + 320.75 + 40, 2);
    expect(s.byField.find((f) => f.field === 'North Quarter')!.operations.harrowing!.dateFinished).toBe('2026-04-21');
    expect(s.byField.find((f) => f.field === 'Slough Eighty')!.operations.harrowing!.dateFinished).toBeNull();
    expect(s.operations.find((o) => o.operation === 'spraying')!.progress).toBeLessThan(1);
    expect(s.operations.find((o) => o.operation === 'seeding')!.acresPlanned).toBeCloseTo(160.25 + 80.5 + 20.4, 2);
    // Tillage: the fleet has a disk, and the fallow field counts for it; baling: nothing does it.
    expect(s.operations.find((o) => o.operation === 'tillage')!.acresPlanned).toBeCloseTo(160.25 + 80.5 + 320.75 + 20.4, 2);
    expect(s.operations.find((o) => o.operation === 'baling')!.acresPlanned).toBe(0);
  });

  it('when the owner reads the season, then the figures are the same as the viewer sees', async () => {
    expect(await summary(owner)).toEqual(await summary(viewer));
  });

  it('when last season is read, then only its own work counts', async () => {
    const s = await summary(viewer, YEAR - 1);
    expect(s.totals.acresFinished).toBeCloseTo(155, 2);
    expect(s.totals.jobsFinished).toBe(1);
    expect(s.operations.find((o) => o.operation === 'harrowing')!.acresPlanned).toBeCloseTo(40, 2);
    expect(s.weekly).toEqual([{ operation: 'harrowing', week: '2025-12-29', acresFinished: 155, cumulativeAcres: 155 }]);
  });

  it('when the seasons are listed, then those with work or crop plans show, newest first', async () => {
    const res = await viewer.get('/api/season');
    expect(res.status).toBe(200);
    const years = (res.body.seasons as Array<{ year: number }>).map((s) => s.year);
    expect(years).toEqual(expect.arrayContaining([YEAR, YEAR - 1]));
    expect(years).toEqual([...years].sort((a, b) => b - a));
    expect(res.body.latestWorked).toBe(YEAR);
    const finished2026 = sum(JOBS.filter((j) => j.state === 'finished' && j.day.startsWith('2026')).map((j) => j.acres!));
    expect(res.body.seasons.find((s: { year: number }) => s.year === YEAR).acresFinished).toBeCloseTo(finished2026, 2);
  });

  it('when each table is downloaded as CSV, then its numbers match the fixture logs to the tenth the screen shows', async () => {
    const want = expected(JOBS, people);

    const ops = await csvOf(viewer, 'operations', OPERATIONS_HEADER);
    expect(ops.map((r) => r.operation)).toEqual(OPERATIONS.map((o) => LABEL[o]));
    for (const w of want.operations) {
      const r = ops.find((x) => x.operation === LABEL[w.operation])!;
      csvNear(r.acres_planned, w.acresPlanned, `${w.operation} acres_planned`);
      csvNear(r.acres_covered, w.acresCovered, `${w.operation} acres_covered`);
      csvNear(r.acres_finished, w.acresFinished, `${w.operation} acres_finished`);
      // Whole per cent, as the screen shows a share.
      expect({ what: w.operation, percent: r.progress_percent }).toEqual({
        what: w.operation,
        percent: String(Math.round(w.progress * 100)),
      });
      csvNear(r.hours_logged, w.hoursLogged, `${w.operation} hours_logged`);
      csvNear(r.planned_hours, w.plannedHours, `${w.operation} planned_hours`);
      csvNear(r.acres_per_hour, w.acresPerHour, `${w.operation} acres_per_hour`);
      csvNear(r.engine_hours, w.engineHours, `${w.operation} engine_hours`);
      expect(r.jobs_finished).toBe(String(w.jobsFinished));
      expect(r.jobs_called_off).toBe(String(w.jobsCalledOff));
      expect(r.weather_days_lost).toBe(String(w.weatherDaysLost));
      expect(r.jobs_called_off_for_weather).toBe(String(w.jobsCalledOffForWeather));
    }

    const fields = await csvOf(viewer, 'fields', [
      'field',
      'crop',
      'field_acres',
      'operation',
      'acres_finished',
      'hours_logged',
      'date_finished',
      'cost_dollars',
      'field_cost_dollars',
      'field_cost_per_acre_dollars',
      'jobs_finished',
      'jobs_measured',
      'acres_measured',
      'acres_typed_on_measured_jobs',
      'acres_skipped',
      'acres_worked_twice',
    ]);
    const fieldRows = want.byField.flatMap((f) => {
      const entries = Object.entries(f.operations);
      return entries.length
        ? entries.map(([op, v]) => ({ ...f, op: LABEL[op as Operation], v }))
        : [{ ...f, op: '', v: { acres: 0, hours: 0, dateFinished: null } }];
    });
    expect(fields).toHaveLength(fieldRows.length);
    for (const w of fieldRows) {
      const csvName = w.field.startsWith('=') ? `'${w.field}` : w.field;
      const r = fields.find((x) => x.field === csvName && x.operation === w.op);
      expect({ field: csvName, op: w.op, found: !!r }).toEqual({ field: csvName, op: w.op, found: true });
      csvNear(r!.field_acres, w.acres, `${w.field} field_acres`);
      csvNear(r!.acres_finished, w.v.acres, `${w.field} ${w.op} acres_finished`);
      csvNear(r!.hours_logged, w.v.hours, `${w.field} ${w.op} hours_logged`);
      expect(r!.date_finished).toBe(w.v.dateFinished ?? '');
      // Crops read in sentence case in the CSV as on every screen (shared/figures.ts cropName).
      expect(r!.crop).toBe(w.crop ? w.crop.charAt(0).toUpperCase() + w.crop.slice(1).toLowerCase() : '');
    }

    const peopleCsv = await csvOf(viewer, 'people', ['person', 'operation', 'acres_finished', 'hours_logged', 'acres_per_hour']);
    const personRows = want.byPerson.flatMap((p) =>
      Object.entries(p.operations).map(([op, v]) => ({ name: p.name, op: LABEL[op as Operation], ...v })),
    );
    expect(peopleCsv).toHaveLength(personRows.length);
    for (const w of personRows) {
      const r = peopleCsv.find((x) => x.person === w.name && x.operation === w.op)!;
      csvNear(r.acres_finished, w.acres, `${w.name} ${w.op} acres`);
      csvNear(r.hours_logged, w.hours, `${w.name} ${w.op} hours`);
    }
    // The people sum back to the season total, within the half tenth each rounded row may move.
    expect(Math.abs(sum(peopleCsv.map((r) => Number(r.acres_finished))) - want.totals.acresFinished)).toBeLessThanOrEqual(
      0.05 * peopleCsv.length + 1e-9,
    );

    const machines = await csvOf(viewer, 'machines', [
      'machine',
      'operation',
      'acres_finished',
      'hours_logged',
      'engine_hours',
      'acres_per_engine_hour',
      'cost_dollars',
      'machine_cost_dollars',
      'machine_total_cost_dollars',
      'machine_cost_per_acre_dollars',
    ]);
    const names = { tractor: 'Big Tractor', sprayer: 'Sprayer, "SP"' };
    for (const m of want.byMachine) {
      for (const o of m.operations) {
        const r = machines.find((x) => x.machine === names[m.key] && x.operation === LABEL[o.operation])!;
        csvNear(r.acres_finished, o.acres, `${m.key} ${o.operation} acres`);
        csvNear(r.engine_hours, o.engineHours, `${m.key} ${o.operation} engine hours`);
      }
    }
    expect(machines).toHaveLength(sum(want.byMachine.map((m) => m.operations.length)));

    const weekly = await csvOf(viewer, 'weekly', ['operation', 'week_starting', 'acres_finished', 'cumulative_acres']);
    expect(weekly.map((r) => `${r.operation} ${r.week_starting}`)).toEqual(want.weekly.map((w) => `${LABEL[w.operation]} ${w.week}`));
    weekly.forEach((r, i) => {
      csvNear(r.acres_finished, want.weekly[i].acresFinished, `weekly ${i} acres`);
      csvNear(r.cumulative_acres, want.weekly[i].cumulativeAcres, `weekly ${i} cumulative`);
    });
  });

  it('when a field name looks like a formula or holds a comma and quotes, then the CSV quotes it and defuses the formula', async () => {
    const raw = (await viewer.get(`/api/season/${YEAR}/export/fields.csv`)).text;
    expect(raw).toContain('"Home Half, ""by the bins"""');
    expect(raw).toContain("\r\n'=Hill Forty,");
    expect(raw).not.toMatch(/\r\n=Hill/);
  });

  it('when the farm uses metric units, then the CSV gives hectares and says so in its header', async () => {
    expect((await owner.patch('/api/farm', { units: 'metric' })).status).toBe(200);
    try {
      const want = expected(JOBS, people);
      const ops = await csvOf(viewer, 'weekly', ['operation', 'week_starting', 'hectares_finished', 'cumulative_hectares']);
      ops.forEach((r, i) => csvNear(r.cumulative_hectares, want.weekly[i].cumulativeAcres * HA_PER_ACRE, `weekly ${i} ha`));
      const s = await summary();
      near(s.totals.acresFinished, want.totals.acresFinished, 'API stays in acres');
    } finally {
      await owner.patch('/api/farm', { units: 'us' });
    }
  });

  it('when the owner corrects a finished log, then the season totals follow', async () => {
    const job = JOBS.find((j) => j.key === 'n-harrow-1')!;
    const res = await owner.patch(`/api/assignments/${job.id}/log`, { acresDone: 90.25, hoursWorked: 3 });
    expect(res.status).toBe(200);
    const edited = JOBS.map((j) => (j.key === job.key ? { ...j, acres: 90.25, hours: 3 } : j));
    const s = await summary();
    checkSummary(s, edited);
    // North Quarter is no longer fully harrowed.
    expect(s.byField.find((f) => f.field === 'North Quarter')!.operations.harrowing!.dateFinished).toBeNull();
    const rows = await csvOf(viewer, 'operations', OPERATIONS_HEADER);
    csvNear(
      rows.find((r) => r.operation === 'Harrowing')!.acres_finished,
      expected(edited, people).operations[0].acresFinished,
      'CSV after edit',
    );
  });

  it('when the owner deletes a finished log, then its acres and hours leave the totals', async () => {
    const job = JOBS.find((j) => j.key === 's-harrow-1')!;
    const res = await owner.delete(`/api/assignments/${job.id}/log`);
    expect(res.status).toBe(200);
    const after = JOBS.map((j) => {
      if (j.key === 'n-harrow-1') return { ...j, acres: 90.25, hours: 3 };
      if (j.key === job.key) return { ...j, state: 'planned' as const, acres: null, hours: null, meter: null };
      return j;
    });
    checkSummary(await summary(), after);
  });

  it('when a viewer tries to change a log, then it is refused and the totals stay as they were', async () => {
    const before = await summary();
    const job = JOBS.find((j) => j.key === 'h-harrow')!;
    const patch = await viewer.patch(`/api/assignments/${job.id}/log`, { acresDone: 1 });
    expect(patch.status).toBe(403);
    expect(patch.body.error.message).toEqual(expect.any(String));
    expect((await viewer.delete(`/api/assignments/${job.id}/log`)).status).toBe(403);
    expect(await summary()).toEqual(before);
  });

  it('when an operator asks for the season, then the server refuses: the season is for the owner and viewers', async () => {
    for (const path of [`/api/season/${YEAR}/summary`, `/api/season/${YEAR}/export/fields.csv`, '/api/season']) {
      const res = await operator.get(path);
      expect(res.status).toBe(403);
      expect(res.body.error).toEqual({ code: 'forbidden', message: expect.any(String), requestId: res.headers['x-request-id'] });
    }
  });

  it('when the year is not a year, then the answer is 400 with a message that says so', async () => {
    for (const bad of ['20x6', '26', '1800', '3000', '2026.5']) {
      for (const path of [`/api/season/${bad}/summary`, `/api/season/${bad}/export/fields.csv`]) {
        const res = await viewer.get(path);
        expect({ path, status: res.status }).toEqual({ path, status: 400 });
        expect(res.body.error.code).toBe('invalid_input');
        expect(res.body.error.message).toMatch(/year/);
        expect(res.body.error.fields).toHaveProperty('year');
      }
    }
  });

  it('when the CSV table is unknown, then the answer is 404 naming the tables there are', async () => {
    const res = await viewer.get(`/api/season/${YEAR}/export/tractors.csv`);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(res.body.error.message).toMatch(/operations, fields, people, machines, weekly/);
  });

  it('when a season has no work and no crop plans, then everything is zero and nothing breaks', async () => {
    const s = await summary(viewer, 2031);
    expect(s.operations.every((o) => o.acresFinished === 0 && o.acresPlanned === 0 && o.progress === 0 && o.acresPerHour === null)).toBe(
      true,
    );
    expect(s.weekly).toEqual([]);
    expect(s.byField).toEqual([]);
    expect(s.totals).toEqual({
      acresFinished: 0,
      hoursLogged: 0,
      engineHours: 0,
      acresPerHour: null,
      jobsFinished: 0,
      jobsCalledOff: 0,
      weatherDaysLost: 0,
      jobsCalledOffForWeather: 0,
      fieldsWorked: 0,
      costCents: 0,
      costPerAcreCents: null,
      jobsUnpriced: 0,
    });
    const csv = await csvOf(viewer, 'weekly', ['operation', 'week_starting', 'acres_finished', 'cumulative_acres'], 2031);
    expect(csv).toEqual([]);
  });
});
