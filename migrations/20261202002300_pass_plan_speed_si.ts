import type { Knex } from 'knex';

// A saved pass plan keeps its working speed in metres per second, like its width in metres: the
// screens convert to mph or km/h for display only, so switching a farm's units and back never
// changes a saved plan. The summary kept with the plan carries the same speed under `speedMps`.
//
// Exact conversion: 1 mph = 1,609.344 m / 3,600 s = 0.447 04 m/s exactly (NIST Handbook 44,
// Appendix C: 1 mile = 1,609.344 m). Each stored double is read as the shortest decimal that
// reads back as it (PostgreSQL float8 output with extra_float_digits > 0), multiplied or divided
// in numeric (exact for the product; 30 decimals for the quotient) and rounded once to the nearest
// double. A speed typed with up to three decimals (5.5 mph) comes back from down(up()) bit for bit.
//
// The rows are rewritten by ALTER COLUMN ... TYPE ... USING, not by UPDATE: an UPDATE would queue
// the deferred farm-revision trigger and PostgreSQL refuses further ALTER TABLE while it is pending.

const MPS_PER_MPH = '0.44704';
const toMps = (col: string) => `(${col}::text::numeric * ${MPS_PER_MPH})::double precision`;
const toMph = (col: string) => `(${col}::text::numeric(60, 30) / ${MPS_PER_MPH})::double precision`;

/** Renames the summary's speed key and gives it the converted speed; a summary without a number there stays as it is. */
const summaryUsing = (from: string, to: string, value: string) =>
  `CASE WHEN jsonb_typeof(summary -> '${from}') = 'number' THEN (summary - '${from}') || jsonb_build_object('${to}', ${value}) ELSE summary END`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw('SET LOCAL extra_float_digits = 1');
  await knex.raw('ALTER TABLE pass_plans RENAME COLUMN speed_mph TO speed_mps');
  // In one statement every USING reads the row as it was: speed_mps still holds mph here.
  await knex.raw(
    `ALTER TABLE pass_plans
       ALTER COLUMN speed_mps TYPE double precision USING ${toMps('speed_mps')},
       ALTER COLUMN summary TYPE jsonb USING ${summaryUsing('speedMph', 'speedMps', toMps('speed_mps'))}`,
  );
  await knex.raw("COMMENT ON COLUMN pass_plans.speed_mps IS 'Working speed, metres per second; shown in mph or km/h'");
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('SET LOCAL extra_float_digits = 1');
  await knex.raw('ALTER TABLE pass_plans RENAME COLUMN speed_mps TO speed_mph');
  await knex.raw(
    `ALTER TABLE pass_plans
       ALTER COLUMN speed_mph TYPE double precision USING ${toMph('speed_mph')},
       ALTER COLUMN summary TYPE jsonb USING ${summaryUsing('speedMps', 'speedMph', toMph('speed_mph'))}`,
  );
  await knex.raw('COMMENT ON COLUMN pass_plans.speed_mph IS NULL');
}
