// The work board's weather: each card's go / caution / no-go over its window from the stored
// forecast (the fake forecast server's scenarios, stored through the real client), a no-go as a
// board conflict (hard when the owner made the rule blocking), stale forecasts marked with their
// age, no forecast → no verdict, the day's hourly strip, and the next day with work.
import type { Board } from '../../shared/schemas/board';
import type { WeatherLimitsAnswer } from '../../shared/schemas/weather';
import { refreshFarmWeather } from '../../server/weather/weather.service';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';
import { effectiveCapacityAcPerH } from '../../shared/plan/field-capacity';
import { implementDefaults } from '../../shared/plan/implement-defaults';
import { mpsToMph } from '../../shared/units';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

/** The fake's scenario hours start at midnight UTC of this day (May: the farm, America/Chicago, is UTC−5). */
const NOW = new Date('2026-05-14T15:30:00Z');
const DAY = '2026-05-14';
/** Forecasts are fetched on the real clock, which the board's age and stale checks read. */
const fetchedNow = () => new Date(Math.floor(Date.now() / 60_000) * 60_000);
const refresh = (farmId: number, now = fetchedNow()) => refreshFarmWeather(t.db, farmId, { url: t.weather.url, now });

interface Setup {
  farm: TestFarm;
  owner: Client;
  fieldId: number;
  sprayer: number;
  harrow: number;
  tractor: number;
}

/** A farm with one field near −101.5° (the weather test's point), a sprayer, a harrow and a tractor. */
async function setUp(label: string): Promise<Setup> {
  const farm = await makeFarm(t.db, label);
  await t.db('farms').where({ id: farm.id }).update({ time_zone: 'America/Chicago', units: 'us', day_hours_limit: 12 });
  const owner = new Client(t.app);
  await owner.signIn(farm.owner.email, farm.owner.password);
  const [f] = await t
    .db('fields')
    .insert({
      farm_id: farm.id,
      name: 'Coulee quarter',
      boundary: JSON.stringify(rect(-101.512, 50.098, 0.004, 0.003)),
      area_m2: 80_000,
      acres: 19.77,
    })
    .returning('id');
  for (const op of ['spraying', 'harrowing'])
    await t.db('crew_skills').insert({ farm_id: farm.id, membership_id: farm.operator.membershipId, operation: op, level: 'qualified' });
  return {
    farm,
    owner,
    fieldId: f.id as number,
    sprayer: await insertImplement(t.db, farm.id, { kind: 'sprayer', operations: ['spraying'], width_m: 36.576 }),
    harrow: await insertImplement(t.db, farm.id),
    tractor: await insertMachine(t.db, farm.id, { power_hp: 450 }),
  };
}

const boardOf = async (s: Setup, day = DAY): Promise<Board> => {
  const res = await s.owner.get(`/api/board?date=${day}`);
  expect(res.status).toBe(200);
  return res.body as Board;
};

async function addCard(s: Setup, card: Record<string, unknown>, day = DAY): Promise<number> {
  const { version } = await boardOf(s, day);
  const res = await s.owner.post('/api/assignments', {
    version,
    date: day,
    fieldId: s.fieldId,
    operatorId: s.farm.operator.membershipId,
    machineId: s.tractor,
    ...card,
  });
  expect(res.status).toBe(201);
  return res.body.savedAssignmentId as number;
}

describe('the board with weather', () => {
  let s: Setup;
  let spray: number;
  let harrowCard: number;

  beforeAll(async () => {
    t.weather.mode = 'ok';
    t.weather.now = NOW;
    t.weather.scenario = 'windy-afternoon';
    s = await setUp('Board weather');
    spray = await addCard(s, { operation: 'spraying', implementId: s.sprayer, startTime: '10:00', endTime: '16:00' });
    harrowCard = await addCard(s, { operation: 'harrowing', implementId: s.harrow });
  });

  it('when no forecast is stored yet, then the board answers 200 with no verdict, no strip and no weather conflict', async () => {
    const b = await boardOf(s);
    expect(b.weather).toEqual({ cards: [], strip: null, note: null });
    expect(b.conflicts.filter((c) => c.code === 'weather_no_go')).toEqual([]);
  });

  it('when the windy afternoon is stored, then the spraying card is no-go with the first windy hour of its window as its reason', async () => {
    expect(await refresh(s.farm.id)).toMatchObject({ refreshed: 1, failed: 0 });
    const b = await boardOf(s);
    const card = b.weather.cards.find((c) => c.assignmentId === spray)!;
    expect(card).toMatchObject({ verdict: 'no-go', from: '10:00', to: '16:00', over: 'card', blocking: false, stale: false });
    // The scenario's afternoon wind, 30 km/h, starts at 12:00 by the sun: 14:00 at the farm (UTC−5, −101.5° → sun 1.77 h behind
    // the clock). 30 km/h ÷ 1.609344 km/h per mile (international mile, 1959 yard and pound agreement) = 18.6 mph, over the
    // 10 mph label window (National Pesticide Stewardship Alliance, "Evaluate the Weather").
    expect(card.reason).toBe('wind 18.6 mph at 14:00, above the spraying limit of 10.0 mph');
    expect(card.reasons).toContain('wind 18.6 mph at 15:00, above the spraying limit of 10.0 mph');
    // 16:00 is the window's end: its hour is not judged.
    expect(card.reasons.join(' ')).not.toContain('at 16:00');
    expect(b.conflicts.filter((c) => c.code === 'weather_no_go')).toEqual([
      {
        code: 'weather_no_go',
        severity: 'soft',
        message: 'Weather no-go for Coulee quarter spraying over 10:00–16:00: wind 18.6 mph at 14:00, above the spraying limit of 10.0 mph',
        assignmentIds: [spray],
      },
    ]);
  });

  it('when a card has no window, then it is judged over the working day (07:00 for the farm day limit of 12 h): harrowing ignores wind', async () => {
    const card = (await boardOf(s)).weather.cards.find((c) => c.assignmentId === harrowCard)!;
    expect(card).toMatchObject({ verdict: 'go', reason: null, from: '07:00', to: '19:00', over: 'working-day' });
  });

  it('when the day is read, then its strip shows the hours of the working day from the point of its field', async () => {
    const strip = (await boardOf(s)).weather.strip!;
    expect(strip).toMatchObject({ basis: 'most-fields', fieldName: 'Coulee quarter', stale: false });
    expect(strip.hours.map((h) => h.time)).toEqual(Array.from({ length: 12 }, (_, i) => `${String(7 + i).padStart(2, '0')}:00`));
    // The scenario's values round-trip (sent as float32 m/s, stored, back to km/h to 2 decimals).
    expect(strip.hours.find((h) => h.time === '15:00')!.windSpeedKmh).toBe(30);
    expect(strip.hours.find((h) => h.time === '10:00')!.windSpeedKmh).toBeLessThan(30);
    expect(strip.hours.every((h) => h.precipitationMm === 0)).toBe(true);
  });

  it('when the owner makes the spraying rule blocking, then the no-go is a hard conflict and publishing is refused', async () => {
    const limits = (await s.owner.get('/api/weather/limits')).body as WeatherLimitsAnswer;
    const put = await s.owner.put('/api/weather/limits', { ...limits.limits, spraying: { ...limits.limits.spraying, blocking: true } });
    expect(put.status).toBe(200);
    const b = await boardOf(s);
    expect(b.weather.cards.find((c) => c.assignmentId === spray)!.blocking).toBe(true);
    expect(b.conflicts.filter((c) => c.code === 'weather_no_go').map((c) => c.severity)).toEqual(['hard']);
    const published = await s.owner.post(`/api/board/${DAY}/publish`, { version: b.version });
    expect(published.status).toBe(409);
    expect(published.body.error.code).toBe('board_conflicts');
    expect(published.body.error.message).toContain('wind 18.6 mph at 14:00');
  });

  it('when the calm scenario replaces it, then the spraying card is no longer no-go and the conflict is gone', async () => {
    t.weather.scenario = 'calm';
    // A forced fetch an hour later (refreshes are hourly at most).
    expect((await refresh(s.farm.id, new Date(fetchedNow().getTime() + 3_600_000))).refreshed).toBe(1);
    const b = await boardOf(s);
    expect(b.weather.cards.find((c) => c.assignmentId === spray)!.verdict).not.toBe('no-go');
    expect(b.conflicts.filter((c) => c.code === 'weather_no_go')).toEqual([]);
    t.weather.scenario = 'windy-afternoon';
  });
});

describe('stale and missing forecasts', () => {
  beforeEach(() => {
    t.weather.mode = 'ok';
    t.weather.now = NOW;
    t.weather.scenario = 'windy-afternoon';
  });

  it('when the stored forecast is three hours old, then the card still has its verdict and says the forecast is stale, with its age', async () => {
    const s = await setUp('Board weather old');
    const spray = await addCard(s, { operation: 'spraying', implementId: s.sprayer, startTime: '10:00', endTime: '16:00' });
    const fetched = new Date(fetchedNow().getTime() - 3 * 3_600_000);
    await refresh(s.farm.id, fetched);
    const card = (await boardOf(s)).weather.cards.find((c) => c.assignmentId === spray)!;
    expect(card).toMatchObject({ verdict: 'no-go', stale: true, fetchedAt: fetched.toISOString() });
    expect(card.ageMinutes).toBeGreaterThanOrEqual(180);
    // Written as every hour figure is (shared/figures.ts): one decimal, the same on the card and the run sheet.
    expect(card.staleReason).toBe('Forecast from 3.0 h ago: no newer forecast has arrived');
    expect(card.staleAfter).toBe(new Date(fetched.getTime() + 2 * 3_600_000).toISOString());
  });

  it('when the last refresh failed, then the card says so and keeps the last forecast', async () => {
    const s = await setUp('Board weather failed');
    const spray = await addCard(s, { operation: 'spraying', implementId: s.sprayer, startTime: '10:00', endTime: '16:00' });
    await refresh(s.farm.id, new Date(fetchedNow().getTime() - 2 * 3_600_000));
    t.weather.mode = 'error500';
    expect((await refresh(s.farm.id)).failed).toBe(1);
    const b = await boardOf(s);
    const card = b.weather.cards.find((c) => c.assignmentId === spray)!;
    expect(card).toMatchObject({ verdict: 'no-go', stale: true });
    expect(card.staleReason).toMatch(/the last refresh failed/);
    expect(b.weather.strip!.stale).toBe(true);
  });

  it('when the day is beyond the stored forecast, then its cards have no verdict, the board answers and says forecasts reach 7 days ahead', async () => {
    const s = await setUp('Board weather far');
    await addCard(s, { operation: 'spraying', implementId: s.sprayer, startTime: '10:00', endTime: '16:00' }, '2026-06-20');
    await refresh(s.farm.id);
    const b = await boardOf(s, '2026-06-20');
    // The fake's 7 days from 2026-05-14 end on 2026-05-20: the board says why there is no weather.
    expect(b.weather).toEqual({ cards: [], strip: null, note: 'No forecast yet: forecasts reach 7 days ahead' });
    // The forecast's last day still has its strip and no such line.
    await addCard(s, { operation: 'spraying', implementId: s.sprayer, startTime: '10:00', endTime: '16:00' }, '2026-05-20');
    const last = await boardOf(s, '2026-05-20');
    expect(last.weather.strip).not.toBeNull();
    expect(last.weather.note).toBeNull();
  });

  it('when the weather tables cannot be read, then the board still answers 200 with its cards and no verdicts', async () => {
    const s = await setUp('Board weather broken');
    await addCard(s, { operation: 'spraying', implementId: s.sprayer, startTime: '10:00', endTime: '16:00' });
    await refresh(s.farm.id);
    await t.db.raw('ALTER TABLE weather_hours RENAME TO weather_hours_away');
    try {
      // A change moves the revision, so the board is read afresh, not served from memory.
      await t
        .db('farms')
        .where({ id: s.farm.id })
        .update({ name: `${s.farm.name} ` });
      const b = await boardOf(s);
      expect(b.assignments).toHaveLength(1);
      expect(b.weather).toEqual({ cards: [], strip: null, note: null });
    } finally {
      await t.db.raw('ALTER TABLE weather_hours_away RENAME TO weather_hours');
    }
  });
});

describe('the next day with work', () => {
  it('when the day shown is empty, then the board names the first later day with cards; with none later, null', async () => {
    const s = await setUp('Board next day');
    await addCard(s, { operation: 'harrowing', implementId: s.harrow }, '2027-04-20');
    await addCard(s, { operation: 'harrowing', implementId: s.harrow }, '2027-05-02');
    expect((await boardOf(s, '2026-12-03')).nextDayWithWork).toBe('2027-04-20');
    expect((await boardOf(s, '2027-04-20')).nextDayWithWork).toBe('2027-05-02');
    expect((await boardOf(s, '2027-05-02')).nextDayWithWork).toBeNull();
  });
});

describe('the board with weather: a card given only a start', () => {
  it('when a spraying card starts at 08:00 and runs 4 h, then it is judged over 08:00–12:00 (its own hours), as the run sheet reads it', async () => {
    t.weather.mode = 'ok';
    t.weather.now = NOW;
    t.weather.scenario = 'windy-afternoon';
    const s = await setUp('Board weather start only');
    // Acres for 4 h at the 120 ft boom's effective field capacity (width × speed × efficiency ÷ 8.25, ASABE EP496 /
    // Iowa State AEN-73): the card ends at 12:00 with no end time set.
    const d = implementDefaults('sprayer');
    const acresPlanned = Math.round(4 * effectiveCapacityAcPerH(120, mpsToMph(d.speedMps), d.efficiency) * 100) / 100;
    const spray = await addCard(s, { operation: 'spraying', implementId: s.sprayer, startTime: '08:00', endTime: null, acresPlanned });
    expect(await refresh(s.farm.id)).toMatchObject({ refreshed: 1, failed: 0 });
    const b = await boardOf(s);
    expect(b.assignments.find((a) => a.id === spray)).toMatchObject({ startTime: '08:00', endTime: '12:00' });
    const card = b.weather.cards.find((c) => c.assignmentId === spray)!;
    expect(card).toMatchObject({ from: '08:00', to: '12:00', over: 'card' });
    // Its hours end before the scenario's windy afternoon (from 14:00 at the farm): no wind reason, no weather conflict.
    expect(card.reasons.join(' ')).not.toContain('above the spraying limit');
    expect(b.conflicts.filter((c) => c.code === 'weather_no_go')).toEqual([]);
  });
});
