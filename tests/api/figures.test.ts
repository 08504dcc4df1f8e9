import type { Board } from '../../shared/schemas/board';
import type { SeasonSummary } from '../../shared/schemas/season';
import { cropName, formatArea, formatHours, formatLength, formatWidth } from '../../shared/figures';
import { acresToHa } from '../../shared/units';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

// One stored figure, three readers: the board card the screen formats, the work-order e-mail and the
// season CSV. Outside reference for the digits: an en-US Intl.NumberFormat with one decimal (ECMA-402,
// rounding half away from zero), built here; 1 acre = 0.404 685 642 24 ha (NIST SP 811, Appendix B).
const oneDecimal = (n: number) => new Intl.NumberFormat('en-US', { minimumFractionDigits: 1, maximumFractionDigits: 1 }).format(n);

describe('figures read the same on the board, in the work order and in the season CSV', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let fieldId: number;
  let machine: number;
  let harrow: number;
  const day = '2026-07-02';

  const csv = async (table: string): Promise<Array<Record<string, string>>> => {
    const res = await owner.get(`/api/season/2026/export/${table}.csv`).buffer(true);
    expect(res.status).toBe(200);
    const [head, ...rows] = (res.text as string)
      .replace(/^\uFEFF/, '')
      .trimEnd()
      .split('\r\n')
      .map((l) => l.split(','));
    return rows.map((r) => Object.fromEntries(head.map((h, i) => [h, r[i]])));
  };
  const drain = async () => {
    for (let i = 0; i < 50; i++) {
      await t.flushMail();
      const [{ n }] = await t.db('mail_outbox').where({ farm_id: farm.id, status: 'queued' }).count({ n: '*' });
      if (Number(n) === 0) return;
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error('the outbox did not drain');
  };

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Figures');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    await t
      .db('crew_skills')
      .insert({ farm_id: farm.id, membership_id: farm.operator.membershipId, operation: 'harrowing', level: 'qualified' });
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: 'Long Section',
        boundary: JSON.stringify(rect(-99.7, 47.7, 0.01, 0.01)),
        area_m2: 822.66 * 4046.8564224,
        acres: 822.66,
      })
      .returning('id');
    fieldId = f.id;
    // A pole 100 ft (30.48 m) clear: the run sheet and the field map write "100 ft" / "30 m".
    await t.db('hazards').insert({
      farm_id: farm.id,
      field_id: fieldId,
      kind: 'power',
      geometry: JSON.stringify({ type: 'Point', coordinates: [-99.695, 47.705] }),
      clearance_m: 30.48,
      note: null,
    });
    // Typed in title case: every reader shows it in the one style.
    await t.db('crop_plans').insert({ farm_id: farm.id, field_id: fieldId, season: 2026, crop: 'Spring Wheat' });
    machine = await insertMachine(t.db, farm.id, { name: 'Big Tractor' });
    harrow = await insertImplement(t.db, farm.id, { name: 'Heavy harrow', width_m: 25.6032 }); // 84 ft exactly
    // A finished job earlier in the season: 378.09 ac in 55.18 h.
    await t.db('assignments').insert({
      farm_id: farm.id,
      day: '2026-05-04',
      field_id: fieldId,
      operation: 'harrowing',
      operator_id: farm.operator.membershipId,
      machine_id: machine,
      implement_id: harrow,
      run_order: 1,
      state: 'finished',
      acres_planned: 378.09,
      acres_done: 378.09,
      hours_worked: 55.18,
    });
  });
  afterAll(() => t.close());

  it('when a card of 822.66 ac is published, then the e-mail says "822.7 ac" as the screen formats the card, and the same hours and width', async () => {
    const version = ((await owner.get(`/api/board?date=${day}`)).body as Board).version;
    const res = await owner.post('/api/assignments', {
      version,
      date: day,
      operation: 'harrowing',
      fieldId,
      operatorId: farm.operator.membershipId,
      machineId: machine,
      implementId: harrow,
      acresPlanned: 822.66,
    });
    expect(res.status).toBe(201);
    const board = (await owner.get(`/api/board?date=${day}`)).body as Board;
    const card = board.assignments.find((a) => a.field.id === fieldId)!;
    expect(card.acresPlanned).toBe(822.66);
    // What the board card shows (the area pipe and hoursText call these).
    const screenAcres = formatArea(card.acresPlanned, 'us');
    const screenHours = formatHours(card.planHours);
    expect(screenAcres).toBe(`${oneDecimal(822.66)} ac`);
    expect(screenAcres).toBe('822.7 ac');

    expect((await owner.post(`/api/board/${day}/publish`, {})).status).toBe(200);
    await drain();
    const mail = t.mail.to(farm.operator.email).find((m) => m.subject.includes('July 2, 2026'))!;
    expect(mail.text).toContain(`Long Section: Harrowing, `);
    expect(mail.text).toContain(`, ${screenAcres}, ${screenHours} planned`);
    expect(mail.text).not.toContain('822.66');
    expect(mail.text).toContain(`Implement: Heavy harrow (84.0 ft)`);
    expect(mail.html).toContain(`${screenAcres}, ${screenHours} planned`);
    expect(formatWidth(card.implement.widthM, 'us')).toBe('84.0 ft');
    // A clearance in whole feet, in the farm's units only, as the run sheet writes it (100 ft = 30.48 m, NIST SP 811).
    expect(formatLength(30.48, 'us')).toBe('100 ft');
    expect(mail.text).toContain('Power pole or line: keep 100 ft clear');
    expect(mail.text).not.toContain('30.5 m');
  });

  it('when the farm switches to metric, then the work order writes the clearance in whole metres as the screen does (30.48 m → "30 m")', async () => {
    expect((await owner.patch('/api/farm', { units: 'metric' })).status).toBe(200);
    try {
      const before = t.mail.to(farm.operator.email).length;
      expect((await owner.post(`/api/board/${day}/publish`, {})).status).toBe(200);
      await drain();
      const mails = t.mail.to(farm.operator.email).filter((m) => m.subject.includes('July 2, 2026'));
      expect(t.mail.to(farm.operator.email).length).toBeGreaterThan(before);
      const mail = mails[mails.length - 1];
      expect(formatLength(30.48, 'metric')).toBe('30 m');
      expect(mail.text).toContain('Power pole or line: keep 30 m clear');
      expect(mail.html).toContain('keep 30 m clear');
    } finally {
      await owner.patch('/api/farm', { units: 'us' });
    }
  });

  it('when the season is exported, then the CSV has the screen digits for acres and hours (378.09 ac → 378.1, 55.18 h → 55.2) and the crop in one style', async () => {
    const summary = (await owner.get('/api/season/2026/summary')).body as SeasonSummary;
    const field = summary.byField.find((f) => f.field === 'Long Section')!;
    const harrowing = field.operations.harrowing!;
    expect(harrowing.acres).toBeCloseTo(378.09, 6);
    expect(harrowing.hours).toBeCloseTo(55.18, 6);

    const rows = await csv('fields');
    const row = rows.find((r) => r.field === 'Long Section')!;
    expect(row.crop).toBe('Spring wheat');
    expect(row.crop).toBe(cropName(field.crop));
    // Each cell with the unit after it is what the screen shows of the API's figure.
    expect(`${row.field_acres} ac`).toBe(formatArea(field.acres, 'us'));
    expect(row.field_acres).toBe(oneDecimal(822.66));
    expect(`${row.acres_finished} ac`).toBe(formatArea(harrowing.acres, 'us'));
    expect(row.acres_finished).toBe('378.1');
    expect(`${row.hours_logged} h`).toBe(formatHours(harrowing.hours));
    expect(row.hours_logged).toBe('55.2');
  });

  it('when the farm uses metric, then the CSV hectares have the digits the screen shows in hectares', async () => {
    expect((await owner.patch('/api/farm', { units: 'metric' })).status).toBe(200);
    try {
      const row = (await csv('fields')).find((r) => r.field === 'Long Section')!;
      // 822.66 ac = 332.918… ha.
      expect(row.field_hectares).toBe(oneDecimal(acresToHa(822.66)));
      expect(`${row.field_hectares} ha`).toBe(formatArea(822.66, 'metric'));
    } finally {
      await owner.patch('/api/farm', { units: 'us' });
    }
  });
});
