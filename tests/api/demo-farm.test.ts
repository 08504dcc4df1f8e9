// The demo farm fits the calendar of the day it is loaded: its history follows the order of a season
// on every field, its planned days lie ahead (in the coming spring when loaded in the off-season),
// and its people still sign in and find their planned work on the board and the run sheet.
import { DateTime } from 'luxon';
import type { Board } from '../../shared/schemas/board';
import type { RunSheet } from '../../shared/schemas/run-sheet';
import { DEMO_FARM_NAME, DEMO_TIME_ZONE, demoAccounts, seed } from '../../seeds/01_demo_farm';
import { Client, startTestApp, type TestApp } from '../support/test-app';

/** The order of operations in a season on one field (the issue's own statement of it). */
const ORDER = ['harrowing', 'seeding', 'spraying', 'swathing', 'combining', 'baling'];

/** [first, last] month-day of the days each operation may be planned on, with where each comes from. */
const WINDOWS: Record<string, { from: string; to: string; source: string }> = {
  // Start: "Statewide average starting fieldwork was April 25, while the normal starting date is April 15."
  // NDSU Crop and Pest Report, 9 May 2002 (read). End: North Dakota's final planting date for spring
  // wheat crop insurance, May 31 (ProAg news, "Lack of 2019 spring wheat planting", 2019; read).
  harrowing: { from: '04-15', to: '05-31', source: 'NDSU Crop and Pest Report 2002; final planting date May 31' },
  seeding: { from: '04-15', to: '05-31', source: 'NDSU Crop and Pest Report 2002; final planting date May 31' },
  // In-crop spraying in June to mid-July, harvest from August to the end of October:
  // common practice, no published source.
  spraying: { from: '06-01', to: '07-15', source: 'common practice, no published source' },
  swathing: { from: '08-01', to: '10-31', source: 'common practice, no published source' },
  combining: { from: '08-01', to: '10-31', source: 'common practice, no published source' },
};
/** The off-season on the northern plains: after harvest until fieldwork starts (see WINDOWS). */
const offSeason = (day: string) => day.slice(5) > '10-31' || day.slice(5) < '04-15';

interface Job {
  field: string;
  field_acres: number;
  operation: string;
  day: string;
  state: string;
  acres_done: number | null;
}

const atNoon = (day: string) => DateTime.fromISO(`${day}T12:00`, { zone: DEMO_TIME_ZONE }).toJSDate();

describe('the demo farm as of the day it is loaded', () => {
  let t: TestApp;
  let hadDemo = false;

  beforeAll(async () => {
    t = await startTestApp();
    hadDemo = !!(await t.db('farms').where({ name: DEMO_FARM_NAME }).first('id'));
  });
  afterAll(async () => {
    // Leave the database's demo farm as it was: loaded as of the real date, or not there at all.
    if (hadDemo) await seed(t.db, { reset: true });
    else {
      await t.db('farms').where({ name: DEMO_FARM_NAME }).delete();
      await t
        .db('users')
        .whereIn(
          'email',
          demoAccounts.map((a) => a.email),
        )
        .delete();
    }
    await t.close();
  });

  async function load(now: Date): Promise<{ farmId: number; jobs: Job[] }> {
    const farmId = await seed(t.db, { reset: true, now });
    const jobs: Job[] = await t
      .db('assignments as a')
      .join('fields as f', 'f.id', 'a.field_id')
      .where({ 'a.farm_id': farmId })
      .orderBy(['a.day', 'a.id'])
      .select('f.name as field', 'f.acres as field_acres', 'a.operation', 'a.day', 'a.state', 'a.acres_done');
    return { farmId, jobs };
  }

  /** For each field and season, the days each operation was worked (finished) or is planned. */
  function byFieldSeason(jobs: Job[]): Map<string, Map<string, Job[]>> {
    const out = new Map<string, Map<string, Job[]>>();
    for (const j of jobs) {
      if (j.state === 'called-off') continue;
      const key = `${j.field} ${j.day.slice(0, 4)}`;
      const ops = out.get(key) ?? new Map<string, Job[]>();
      ops.set(j.operation, [...(ops.get(j.operation) ?? []), j]);
      out.set(key, ops);
    }
    return out;
  }

  describe.each(['2026-12-02', '2027-04-10', '2027-05-10', '2027-06-20', '2027-08-25', '2027-10-05'])('loaded on %s', (day) => {
    let farmId: number;
    let jobs: Job[];
    beforeAll(async () => {
      ({ farmId, jobs } = await load(atNoon(day)));
    }, 60_000);

    it('when the history is read, then every field worked its operations in the order of a season, and none was combined unseeded', () => {
      const finished = jobs.filter((j) => j.state === 'finished');
      expect(finished.length).toBeGreaterThan(50);
      expect(finished.every((j) => j.day < day)).toBe(true);
      const problems: string[] = [];
      for (const [key, ops] of byFieldSeason(finished)) {
        const present = ORDER.filter((op) => ops.has(op));
        for (let i = 0; i < present.length; i++)
          for (let k = i + 1; k < present.length; k++) {
            const lastEarlier = ops.get(present[i])!.at(-1)!.day;
            const firstLater = ops.get(present[k])!.at(0)!.day;
            if (lastEarlier > firstLater) problems.push(`${key}: ${present[k]} on ${firstLater} before ${present[i]} on ${lastEarlier}`);
          }
        // Anything after seeding needs the field seeded in full first (a crop to spray, swath or combine).
        const afterSeeding = present.filter((op) => ORDER.indexOf(op) > ORDER.indexOf('seeding'));
        const seeded = (ops.get('seeding') ?? []).reduce((s, j) => s + Number(j.acres_done), 0);
        const acres = Number(ops.values().next().value![0].field_acres);
        if (afterSeeding.length && seeded < acres * 0.99)
          problems.push(`${key}: ${afterSeeding.join(', ')} on ${seeded} of ${acres} ac seeded`);
      }
      expect(problems).toEqual([]);
    });

    it('when the planned days are read, then they lie on or after the load date, in their operation windows, and in the coming spring in the off-season', () => {
      const planned = jobs.filter((j) => j.state === 'planned');
      expect(planned.length).toBeGreaterThan(0);
      const problems: string[] = [];
      const spring = Number(day.slice(0, 4)) + (day.slice(5) > '10-31' ? 1 : 0);
      for (const j of planned) {
        const w = WINDOWS[j.operation];
        if (j.day < day) problems.push(`${j.field} ${j.operation} planned on ${j.day}, before ${day}`);
        if (!w || j.day.slice(5) < w.from || j.day.slice(5) > w.to)
          problems.push(`${j.field} ${j.operation} on ${j.day} is outside ${w?.from}–${w?.to} (${w?.source})`);
        if (offSeason(day) && !(j.day.startsWith(`${spring}-`) && j.day.slice(5) <= WINDOWS.seeding.to))
          problems.push(`${j.field} ${j.operation} on ${j.day} is not in the spring of ${spring}`);
      }
      // A planned operation waits for the ones before it on that field (finished or planned no later).
      for (const [key, ops] of byFieldSeason(jobs.filter((j) => j.state !== 'called-off'))) {
        for (const [op, list] of ops) {
          if (!list.some((j) => j.state === 'planned')) continue;
          const firstPlanned = list.find((j) => j.state === 'planned')!.day;
          for (const before of ORDER.slice(0, ORDER.indexOf(op))) {
            const last = ops.get(before)?.at(-1)?.day;
            if (last && last > firstPlanned) problems.push(`${key}: ${op} planned on ${firstPlanned} before ${before} on ${last}`);
          }
          if (ORDER.indexOf(op) > ORDER.indexOf('seeding') && !ops.has('seeding'))
            problems.push(`${key}: ${op} planned on an unseeded field`);
        }
      }
      expect(problems).toEqual([]);
    });

    it("when the demo people sign in, then the owner's board of the first planned day has its cards without a hard conflict, and their operators see them on their run sheets", async () => {
      for (const a of demoAccounts) {
        const c = new Client(t.app);
        const res = await c.signIn(a.email, a.password);
        expect(res.status).toBe(200);
        expect((await c.get('/api/auth/me')).status).toBe(200);
      }
      const first = jobs.find((j) => j.state === 'planned')!.day;
      const owner = new Client(t.app);
      await owner.signIn(demoAccounts[0].email, demoAccounts[0].password);
      const board: Board = (await owner.get(`/api/board?date=${first}`)).body;
      expect(board.assignments.length).toBe(jobs.filter((j) => j.state === 'planned' && j.day === first).length);
      expect(board.conflicts.filter((c) => c.severity === 'hard')).toEqual([]);
      // The run sheet lists the jobs a person runs and the ones they mentor.
      const theirs = (name: string) => board.assignments.filter((x) => x.operator.name === name || x.mentor?.name === name).length;
      const operators = demoAccounts.filter((x) => x.role === 'operator' && theirs(x.name) > 0);
      expect(operators.length).toBeGreaterThan(0);
      for (const a of operators) {
        const c = new Client(t.app);
        await c.signIn(a.email, a.password);
        const sheet: RunSheet = (await c.get(`/api/run-sheet?date=${first}`)).body;
        expect(sheet.assignments.length).toBe(theirs(a.name));
      }
      // The fields list shows this calendar year's crop on every field.
      const [crops] = await t
        .db('crop_plans')
        .where({ farm_id: farmId, season: Number(day.slice(0, 4)) })
        .count({ n: '*' });
      const [fields] = await t.db('fields').where({ farm_id: farmId }).count({ n: '*' });
      expect(Number(crops.n)).toBe(Number(fields.n));
    }, 60_000);
  });

  it("when the demo is loaded late in the evening by the clock of UTC, then the farm's own day counts (America/Chicago)", async () => {
    // 03:00 UTC on 21 April 2027 is 22:00 on 20 April in Chicago (CDT, UTC−5): the harrow's first
    // day of that spring is still the farm's today, so it is planned, not finished.
    const { jobs } = await load(new Date('2027-04-21T03:00:00Z'));
    const planned = jobs.filter((j) => j.state === 'planned').map((j) => j.day);
    expect(planned.sort()[0]).toBe('2027-04-20');
    expect(jobs.filter((j) => j.state === 'finished' && j.day >= '2027-01-01')).toEqual([]);
  }, 60_000);
});
