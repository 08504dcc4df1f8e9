import { createDb, migrationConfig, type Db } from '../../server/db/knex';
import { seed } from '../../seeds/01_demo_farm';

// The migration that stores a plan's speed in m/s, run both ways over saved plans of the demo farm.
// Outside reference: 1 mile = 1,609.344 m exactly (NIST Handbook 44, Appendix C), so
// 1 mph = 0.447 04 m/s; each expected m/s below is that product, worked by hand.
// `npm test` makes an empty database for the migration tests alone (MIGRATION_DATABASE_URL).
const MIGRATION = '20261202002300';

describe('plan speeds to SI (migration)', () => {
  let db: Db;
  beforeAll(() => {
    const url = process.env.MIGRATION_DATABASE_URL;
    if (!url) throw new Error('MIGRATION_DATABASE_URL is not set: run with npm test');
    db = createDb(url);
  });
  afterAll(() => db.destroy());

  const version = async () => String(await db.migrate.currentVersion(migrationConfig));

  it('when saved plans in mph are migrated up and down, then they read in m/s and come back to the same mph', async () => {
    await db.migrate.latest(migrationConfig);
    await seed(db, { reset: true });
    while ((await version()) >= MIGRATION) await db.migrate.down(migrationConfig);

    const field = await db('fields').orderBy('id').first('id', 'farm_id');
    // mph as saved before, and the m/s each is (mph × 0.447 04, by hand).
    const cases: [string, number, number][] = [
      ['harrowing', 5.5, 2.45872],
      ['seeding', 7, 3.12928],
      ['spraying', 0.1, 0.044704],
      ['swathing', 12.345, 5.5187088],
      // 12 km/h typed on a metric farm was saved as 12 ÷ 1.609 344 mph: 12 km/h = 3.333… m/s.
      ['combining', 12 / 1.609344, 12 / 3.6],
    ];
    await db('pass_plans').insert(
      cases.map(([operation, mph]) => ({
        farm_id: field.farm_id,
        field_id: field.id,
        operation,
        width_m: 18.288,
        headland_passes: 2,
        coverage: 'gaps-ok',
        speed_mph: mph,
        efficiency: 0.8,
        turn_seconds: 20,
        summary: JSON.stringify({ hours: 3.5, speedMph: mph, widthM: 18.288 }),
      })),
    );
    const rows = () => db('pass_plans').where({ field_id: field.id }).orderBy('id');

    await db.migrate.latest(migrationConfig);
    const up = await rows();
    expect(up.map((r) => r.operation)).toEqual(cases.map(([op]) => op));
    up.forEach((r, i) => {
      const [, , mps] = cases[i];
      expect(r).not.toHaveProperty('speed_mph');
      // The decimal products are exact, so the stored double is the one nearest to them.
      if (i < 4) expect(r.speed_mps).toBe(mps);
      else expect(r.speed_mps).toBeCloseTo(mps, 14);
      expect(r.summary).toEqual({ hours: 3.5, speedMps: r.speed_mps, widthM: 18.288 });
    });

    while ((await version()) >= MIGRATION) await db.migrate.down(migrationConfig);
    const down = await rows();
    down.forEach((r, i) => {
      const [, mph] = cases[i];
      expect(r).not.toHaveProperty('speed_mps');
      // Speeds typed to a few decimals come back bit for bit; the km/h one within a part in 10^15.
      if (i < 4) expect(r.speed_mph).toBe(mph);
      else expect(Math.abs(r.speed_mph - mph)).toBeLessThanOrEqual(mph * 1e-15);
      expect(r.summary).toEqual({ hours: 3.5, speedMph: r.speed_mph, widthM: 18.288 });
    });

    await db('pass_plans').where({ field_id: field.id }).delete();
    await db.migrate.latest(migrationConfig);
    expect((await db('pass_plans').columnInfo()).speed_mps).toBeDefined();
  }, 120_000);
});
