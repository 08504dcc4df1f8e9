// What the farm's own work cost, against fixture logs and rates this file writes itself. Every
// expected amount is worked out here from the fixture rows with exact integer arithmetic (BigInt,
// no call into the code under test) and must match the API and the CSV to the cent.
// The rules (shared/costs.ts): machine = engine hours (the hours worked when a meter reading is
// missing) × the machine's hourly cost; labour = hours worked × the operator's hourly cost; fuel =
// acres × gallons per acre × the fuel price. Rounded once, to the cent, a half away from zero.
import type { Operation } from '../../shared/operations';
import type { CostSettingsAnswer } from '../../shared/schemas/costs';
import type { SeasonSummary } from '../../shared/schemas/season';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';

const YEAR = 2026;

/** Fuel per acre the test expects for the operations it uses: each from its published source, not from the code. */
const DEFAULT_GAL: Partial<Record<Operation, string>> = {
  // University of Missouri Extension G1208 (Frisby 1993), Table 1: harrow, spike-tooth, 0.30 gal/ac.
  harrowing: '0.30',
  // University of Nebraska–Lincoln CropWatch, "Fuel Requirements": spray, 0.11 gal/ac.
  spraying: '0.11',
};
/** The owner's own figure for seeding (the default, 0.50 from memory, is changed here). */
const SEEDING_GAL = '0.55';
const FUEL_PRICE_CENTS = 389;

type Who = 'operator' | 'second' | 'owner';
type MachineKey = 'tractor' | 'sprayer' | 'old';
/** Hourly costs in whole cents; the old tractor and the owner have none (their jobs are unpriced in part). */
const MACHINE_RATE: Record<MachineKey, number | null> = { tractor: 9550, sprayer: 12275, old: null };
const LABOUR_RATE: Record<Who, number | null> = { operator: 2650, second: 3125, owner: null };

interface FieldFx {
  key: string;
  name: string;
  acres: string;
  id?: number;
}
const FIELDS: FieldFx[] = [
  { key: 'a', name: 'Cost North', acres: '160.25' },
  { key: 'b', name: 'Cost Slough', acres: '80.5' },
];

interface JobFx {
  day: string;
  field: string;
  operation: Operation;
  operator: Who;
  machine: MachineKey;
  state: 'finished' | 'called-off' | 'planned';
  acres: string | null;
  hours: string | null;
  meter: [string, string] | null;
}
const JOBS: JobFx[] = [
  {
    day: '2026-04-20',
    field: 'a',
    operation: 'harrowing',
    operator: 'operator',
    machine: 'tractor',
    state: 'finished',
    acres: '100.25',
    hours: '3.5',
    meter: ['1000.0', '1003.8'],
  },
  // No meter readings: the machine's hours are the hours worked.
  {
    day: '2026-04-21',
    field: 'a',
    operation: 'harrowing',
    operator: 'second',
    machine: 'tractor',
    state: 'finished',
    acres: '60',
    hours: '2.25',
    meter: null,
  },
  {
    day: '2026-04-22',
    field: 'b',
    operation: 'harrowing',
    operator: 'owner',
    machine: 'old',
    state: 'finished',
    acres: '40.5',
    hours: '1.5',
    meter: ['10.0', '11.6'],
  },
  {
    day: '2026-05-04',
    field: 'a',
    operation: 'seeding',
    operator: 'operator',
    machine: 'tractor',
    state: 'finished',
    acres: '160.25',
    hours: '6.75',
    meter: ['1003.8', '1011.0'],
  },
  {
    day: '2026-06-10',
    field: 'b',
    operation: 'spraying',
    operator: 'second',
    machine: 'sprayer',
    state: 'finished',
    acres: '80.5',
    hours: '1.25',
    meter: ['500.0', '501.4'],
  },
  {
    day: '2026-06-24',
    field: 'b',
    operation: 'spraying',
    operator: 'second',
    machine: 'sprayer',
    state: 'finished',
    acres: '79.87',
    hours: '1.3',
    meter: ['501.4', '502.9'],
  },
  // Not counted: called off, planned, and last season.
  {
    day: '2026-06-25',
    field: 'a',
    operation: 'spraying',
    operator: 'operator',
    machine: 'sprayer',
    state: 'called-off',
    acres: null,
    hours: null,
    meter: null,
  },
  {
    day: '2026-06-26',
    field: 'a',
    operation: 'spraying',
    operator: 'operator',
    machine: 'sprayer',
    state: 'planned',
    acres: null,
    hours: null,
    meter: null,
  },
  {
    day: '2025-10-01',
    field: 'a',
    operation: 'harrowing',
    operator: 'operator',
    machine: 'tractor',
    state: 'finished',
    acres: '155',
    hours: '5',
    meter: ['900.0', '905.0'],
  },
];

// ── Exact arithmetic: decimals as BigInt in units of 10⁻⁶ ─────────────────────────────────────

const SCALE = 6;
/** "3.5" → 3_500_000n (units of 10⁻⁶). */
function dec(s: string): bigint {
  const [w, f = ''] = s.split('.');
  return BigInt(w) * 10n ** BigInt(SCALE) + BigInt(f.padEnd(SCALE, '0'));
}
/** a × b of two 10⁻⁶ numbers, kept exact in 10⁻¹² units. */
const mul = (a: bigint, b: bigint) => a * b;
/** Exact cents in 10⁻ᵏ units → whole cents, a half away from zero (PostgreSQL round(numeric), from memory). */
function round(x: bigint, unitsPerCent: bigint): number {
  const neg = x < 0n;
  const a = neg ? -x : x;
  const r = (a * 2n + unitsPerCent) / (2n * unitsPerCent);
  return Number(neg ? -r : r);
}
/** Exact money in units of 10⁻¹⁸ cents: the common unit of every part below. */
const U = 10n ** 18n;

function galOf(op: Operation): string {
  return op === 'seeding' ? SEEDING_GAL : DEFAULT_GAL[op]!;
}

interface JobCost {
  job: JobFx;
  machine: bigint;
  labour: bigint;
  fuel: bigint;
  unpriced: boolean;
}

function jobCost(j: JobFx): JobCost {
  const engine = j.meter ? dec(j.meter[1]) - dec(j.meter[0]) : dec(j.hours!);
  const mRate = MACHINE_RATE[j.machine];
  const lRate = LABOUR_RATE[j.operator];
  // engine (10⁻⁶ h) × cents → 10⁻⁶ cents; × 10¹² → 10⁻¹⁸ cents.
  const machine = mRate === null ? 0n : engine * BigInt(mRate) * 10n ** 12n;
  const labour = lRate === null ? 0n : dec(j.hours!) * BigInt(lRate) * 10n ** 12n;
  // acres (10⁻⁶) × gal/ac (10⁻⁶) × cents → 10⁻¹² cents; × 10⁶ → 10⁻¹⁸.
  const fuel = mul(dec(j.acres!), dec(galOf(j.operation))) * BigInt(FUEL_PRICE_CENTS) * 10n ** 6n;
  return { job: j, machine, labour, fuel, unpriced: mRate === null || lRate === null };
}

const done = JOBS.filter((j) => j.state === 'finished' && j.day.startsWith(`${YEAR}-`)).map(jobCost);
const total = (cs: JobCost[]) => cs.reduce((s, c) => s + c.machine + c.labour + c.fuel, 0n);
const acresOf = (cs: JobCost[]) => cs.reduce((s, c) => s + dec(c.job.acres!), 0n);
/** Cost per acre, whole cents: exact cost ÷ exact acres, rounded once. */
function perAcre(cost: bigint, acres: bigint): number | null {
  if (acres === 0n) return null;
  // cost (10⁻¹⁸ cents) × 10⁶ / acres (10⁻⁶) → 10⁻¹⁸ cents per acre.
  const scaled = cost * 10n ** BigInt(SCALE);
  const q = scaled / acres;
  const rem = scaled % acres;
  // Round q (10⁻¹⁸ units) with the remainder taken into account exactly: compare 2·(q mod U + rem/acres) with U.
  const whole = q / U;
  const frac2 = 2n * ((q % U) * acres + rem);
  return Number(frac2 >= U * acres ? whole + 1n : whole);
}

function expectedOperation(op: Operation) {
  const cs = done.filter((c) => c.job.operation === op);
  return {
    costCents: round(total(cs), U),
    machineCents: round(
      cs.reduce((s, c) => s + c.machine, 0n),
      U,
    ),
    labourCents: round(
      cs.reduce((s, c) => s + c.labour, 0n),
      U,
    ),
    fuelCents: round(
      cs.reduce((s, c) => s + c.fuel, 0n),
      U,
    ),
    costPerAcreCents: perAcre(total(cs), acresOf(cs)),
    jobsUnpriced: cs.filter((c) => c.unpriced).length,
  };
}

const dollars = (cents: number) => `${Math.trunc(cents / 100)}.${String(cents % 100).padStart(2, '0')}`;

/** RFC 4180 records (no quoted line breaks in this fixture). */
function parseCsv(text: string): Array<Record<string, string>> {
  const lines = text
    .replace(/^\uFEFF/, '')
    .split('\r\n')
    .filter(Boolean);
  const split = (line: string) => {
    const out: string[] = [];
    let cell = '';
    let q = false;
    for (let i = 0; i < line.length; i++) {
      const c = line[i];
      if (q && c === '"' && line[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (c === '"') q = !q;
      else if (c === ',' && !q) {
        out.push(cell);
        cell = '';
      } else cell += c;
    }
    out.push(cell);
    return out;
  };
  const [head, ...rows] = lines.map(split);
  return rows.map((r) => Object.fromEntries(head.map((h, i) => [h, r[i]])));
}

describe('season costs', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let viewer: Client;
  let operator: Client;
  const machineIds = {} as Record<MachineKey, number>;
  const people = {} as Record<Who, number>;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Costs');
    const db = t.db;
    const [u2] = await db('users')
      .insert({ email: `second-cost-${farm.id}@furlong.test`, name: `Second ${farm.id}` })
      .returning('id');
    const [m2] = await db('memberships').insert({ farm_id: farm.id, user_id: u2.id, role: 'operator', status: 'active' }).returning('id');
    people.operator = farm.operator.membershipId;
    people.second = m2.id;
    people.owner = farm.owner.membershipId;
    for (const [i, f] of FIELDS.entries()) {
      const [row] = await db('fields')
        .insert({
          farm_id: farm.id,
          name: f.name,
          boundary: JSON.stringify(rect(-99.5 + i * 0.01, 47.2, 0.005, 0.005)),
          area_m2: Number(f.acres) * 4046.8564224,
          acres: f.acres,
        })
        .returning('id');
      f.id = row.id;
      await db('crop_plans').insert({ farm_id: farm.id, field_id: row.id, season: YEAR, crop: 'spring wheat' });
    }
    for (const [key, kind] of [
      ['tractor', 'tractor-4wd'],
      ['sprayer', 'sprayer-sp'],
      ['old', 'tractor-mfwd'],
    ] as const) {
      const [m] = await db('machines')
        .insert({ farm_id: farm.id, name: `Cost ${key}`, kind, power_hp: 300, engine_hours: 1 })
        .returning('id');
      machineIds[key] = m.id;
    }
    const [implement] = await db('implements')
      .insert({ farm_id: farm.id, name: 'Cost harrow', kind: 'harrow', width_m: 20, operations: ['harrowing', 'seeding', 'spraying'] })
      .returning('id');
    for (const [i, j] of JOBS.entries()) {
      await db('assignments').insert({
        farm_id: farm.id,
        day: j.day,
        field_id: FIELDS.find((f) => f.key === j.field)!.id,
        operation: j.operation,
        operator_id: people[j.operator],
        machine_id: machineIds[j.machine],
        implement_id: implement.id,
        run_order: i + 1,
        state: j.state,
        acres_planned: 10,
        acres_done: j.acres,
        hours_worked: j.hours,
        engine_hours_start: j.meter?.[0] ?? null,
        engine_hours_end: j.meter?.[1] ?? null,
        call_off_reason: j.state === 'called-off' ? 'weather' : null,
      });
    }
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    viewer = new Client(t.app);
    await viewer.signIn(farm.viewer.email, farm.viewer.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);

    // The owner enters the rates through the API, as on the Members page.
    const fuel = (await owner.get('/api/costs')).body as CostSettingsAnswer;
    const galPerAcre = Object.fromEntries(
      fuel.fuel.map((f) => [f.operation, f.operation === 'seeding' ? Number(SEEDING_GAL) : f.galPerAcre]),
    );
    expect((await owner.put('/api/costs/fuel', { fuelPriceCents: FUEL_PRICE_CENTS, galPerAcre })).status).toBe(200);
    for (const k of Object.keys(MACHINE_RATE) as MachineKey[])
      if (MACHINE_RATE[k] !== null)
        expect((await owner.put(`/api/costs/machines/${machineIds[k]}`, { hourlyCents: MACHINE_RATE[k] })).status).toBe(200);
    for (const k of Object.keys(LABOUR_RATE) as Who[])
      if (LABOUR_RATE[k] !== null)
        expect((await owner.put(`/api/costs/people/${people[k]}`, { hourlyCents: LABOUR_RATE[k] })).status).toBe(200);
  });
  afterAll(() => t.close());

  const summary = async (c: Client = viewer): Promise<SeasonSummary> => {
    const res = await c.get(`/api/season/${YEAR}/summary`);
    expect(res.status).toBe(200);
    return res.body as SeasonSummary;
  };

  it('when the viewer reads the season, then each operation costs what the fixture logs, rates and fuel price make, to the cent', async () => {
    const s = await summary();
    for (const op of ['harrowing', 'seeding', 'spraying'] as const) {
      const got = s.operations.find((o) => o.operation === op)!;
      const { costCents, machineCents, labourCents, fuelCents, costPerAcreCents, jobsUnpriced } = got;
      expect({ op, costCents, machineCents, labourCents, fuelCents, costPerAcreCents, jobsUnpriced }).toEqual({
        op,
        ...expectedOperation(op),
      });
    }
    // An operation without work costs nothing and has no cost per acre.
    expect(s.operations.find((o) => o.operation === 'baling')).toMatchObject({ costCents: 0, costPerAcreCents: null });
    // A hand check of one job (worked on paper): harrowing 2026-04-20, 3.8 engine h × $95.50 = $362.90,
    // 3.5 h × $26.50 = $92.75, 100.25 ac × 0.30 gal/ac (Missouri G1208) × $3.89 = $116.99175.
    expect(round(total(done.slice(0, 1)), U)).toBe(36290 + 9275 + 11699);
  });

  it('when the season total is read, then it is rounded once from the exact sum, not added up from the rounded operations', async () => {
    const s = await summary();
    expect(s.totals.costCents).toBe(round(total(done), U));
    // In this fixture the rounded operations add up to a cent less (97,511 + 120,933 + 50,428 = 268,872 ¢, against 268,872.74 ¢ exact).
    expect(s.totals.costCents).not.toBe(s.operations.reduce((x, o) => x + o.costCents, 0));
    expect(s.totals.costPerAcreCents).toBe(perAcre(total(done), acresOf(done)));
    // The owner's harrowing on the old tractor has neither rate.
    expect(s.totals.jobsUnpriced).toBe(1);
  });

  it('when the fields and machines are read, then each one costs its own jobs, per acre of the field and per acre the machine finished', async () => {
    const s = await summary();
    for (const f of FIELDS) {
      const cs = done.filter((c) => c.job.field === f.key);
      const got = s.byField.find((x) => x.fieldId === f.id)!;
      expect({ field: f.name, cost: got.costCents, perAcre: got.costPerAcreCents }).toEqual({
        field: f.name,
        cost: round(total(cs), U),
        perAcre: perAcre(total(cs), dec(f.acres)),
      });
      for (const op of ['harrowing', 'seeding', 'spraying'] as const) {
        const ofOp = cs.filter((c) => c.job.operation === op);
        if (ofOp.length) expect({ f: f.key, op, c: got.operations[op]!.costCents }).toEqual({ f: f.key, op, c: round(total(ofOp), U) });
      }
    }
    for (const k of Object.keys(machineIds) as MachineKey[]) {
      const cs = done.filter((c) => c.job.machine === k);
      const got = s.byMachine.find((m) => m.machineId === machineIds[k])!;
      expect({ k, cost: got.costCents, own: got.machineCents, perAcre: got.costPerAcreCents }).toEqual({
        k,
        cost: round(total(cs), U),
        own: round(
          cs.reduce((x, c) => x + c.machine, 0n),
          U,
        ),
        perAcre: perAcre(total(cs), acresOf(cs)),
      });
    }
  });

  it('when the tables are downloaded as CSV, then the money columns are the same cents as dollars', async () => {
    const ops = parseCsv((await viewer.get(`/api/season/${YEAR}/export/operations.csv`)).text);
    for (const op of ['harrowing', 'seeding', 'spraying'] as const) {
      const w = expectedOperation(op);
      const r = ops.find((x) => x.operation.toLowerCase() === op)!;
      expect({
        op,
        cost: r.cost_dollars,
        fuel: r.fuel_cost_dollars,
        perAcre: r.cost_per_acre_dollars,
        unpriced: r.jobs_without_rates,
      }).toEqual({
        op,
        cost: dollars(w.costCents),
        fuel: dollars(w.fuelCents),
        perAcre: dollars(w.costPerAcreCents!),
        unpriced: String(w.jobsUnpriced),
      });
    }
    const fields = parseCsv((await viewer.get(`/api/season/${YEAR}/export/fields.csv`)).text);
    for (const f of FIELDS) {
      const cs = done.filter((c) => c.job.field === f.key);
      for (const r of fields.filter((x) => x.field === f.name)) expect(r.field_cost_dollars).toBe(dollars(round(total(cs), U)));
    }
    const machines = parseCsv((await viewer.get(`/api/season/${YEAR}/export/machines.csv`)).text);
    const tractor = machines.filter((r) => r.machine === 'Cost tractor');
    expect(tractor.map((r) => r.machine_total_cost_dollars)).toEqual(
      tractor.map(() => dollars(round(total(done.filter((c) => c.job.machine === 'tractor')), U))),
    );
  });

  it('when the rates are read, then the viewer sees them with each fuel default and its source, and an operator is refused', async () => {
    const res = await viewer.get('/api/costs');
    expect(res.status).toBe(200);
    const a = res.body as CostSettingsAnswer;
    expect(a.fuelPriceCents).toBe(FUEL_PRICE_CENTS);
    const harrow = a.fuel.find((f) => f.operation === 'harrowing')!;
    // University of Missouri Extension G1208 (Frisby 1993), Table 1: spike-tooth harrow 0.30 gal/ac.
    expect(harrow).toMatchObject({ galPerAcre: 0.3, defaultGalPerAcre: 0.3, source: { kind: 'published' } });
    expect(harrow.source.note).toMatch(/G1208/);
    expect(a.fuel.find((f) => f.operation === 'seeding')).toMatchObject({
      galPerAcre: 0.55,
      defaultGalPerAcre: 0.5,
      source: { kind: 'from memory' },
    });
    expect(a.machines.find((m) => m.machineId === machineIds.tractor)!.hourlyCents).toBe(9550);
    expect(a.people.find((p) => p.membershipId === people.second)!.hourlyCents).toBe(3125);

    for (const [method, path, body] of [
      ['get', '/api/costs', undefined],
      ['put', '/api/costs/fuel', { fuelPriceCents: 1, galPerAcre: {} }],
      ['put', `/api/costs/machines/${machineIds.tractor}`, { hourlyCents: 1 }],
      ['put', `/api/costs/people/${people.operator}`, { hourlyCents: 1 }],
      ['get', `/api/season/${YEAR}/summary`, undefined],
    ] as const) {
      const r = method === 'get' ? await operator.get(path) : await operator.put(path, body);
      expect({ path, status: r.status, money: /Cents|cost/.test(JSON.stringify(r.body)) }).toEqual({ path, status: 403, money: false });
    }
    // The viewer reads but never sets.
    expect((await viewer.put(`/api/costs/machines/${machineIds.tractor}`, { hourlyCents: 1 })).status).toBe(403);
  });

  it('when the owner gives a rate that makes no sense, then it is refused with a reason and nothing changes', async () => {
    const before = await summary();
    for (const [path, body, field] of [
      [`/api/costs/machines/${machineIds.tractor}`, { hourlyCents: -5 }, 'hourlyCents'],
      [`/api/costs/machines/${machineIds.tractor}`, { hourlyCents: 12.5 }, 'hourlyCents'],
      [`/api/costs/people/${people.operator}`, { hourlyCents: '26.50' }, 'hourlyCents'],
      ['/api/costs/fuel', { fuelPriceCents: 389, galPerAcre: { harrowing: 0.3 } }, 'galPerAcre.tillage'],
      [
        '/api/costs/fuel',
        { fuelPriceCents: 9_999_999, galPerAcre: Object.fromEntries(before.operations.map((o) => [o.operation, 0.3])) },
        'fuelPriceCents',
      ],
    ] as const) {
      const r = await owner.put(path, body);
      expect({ path, status: r.status }).toEqual({ path, status: 400 });
      expect(r.body.error.fields).toHaveProperty([field]);
      expect(r.body.error.message).toEqual(expect.any(String));
    }
    expect((await owner.put('/api/costs/machines/999999', { hourlyCents: 100 })).status).toBe(404);
    expect(await summary()).toEqual(before);
  });

  it('when the owner changes a machine rate, then the season cost follows, and clearing it leaves those jobs unpriced', async () => {
    expect((await owner.put(`/api/costs/machines/${machineIds.sprayer}`, { hourlyCents: null })).status).toBe(200);
    const s = await summary();
    const sprays = done.filter((c) => c.job.operation === 'spraying').map((c) => ({ ...c, machine: 0n }));
    expect(s.operations.find((o) => o.operation === 'spraying')).toMatchObject({
      costCents: round(total(sprays), U),
      machineCents: 0,
      jobsUnpriced: 2,
    });
    expect((await owner.put(`/api/costs/machines/${machineIds.sprayer}`, { hourlyCents: 12275 })).status).toBe(200);
    expect((await summary()).operations.find((o) => o.operation === 'spraying')!.costCents).toBe(expectedOperation('spraying').costCents);
  });
});
