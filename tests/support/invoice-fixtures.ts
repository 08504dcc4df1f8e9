// Rows for invoice tests, written straight to the database: a customer, a field of theirs, finished
// jobs on it, and invoices in a given state.
import type { Db } from '../../server/db/knex';
import { takeNumber } from '../../server/invoices/invoices.repository';
import type { Operation } from '../../shared/operations';
import { rect } from './geo-fixtures';

let n = 0;
const tag = () => `${Date.now().toString(36)}-${++n}`;

export async function insertCustomer(db: Db, farmId: number, name = `Neighbour ${tag()}`): Promise<number> {
  const [row] = await db('customers')
    .insert({ farm_id: farmId, name, email: `neighbour-${tag()}@furlong.test`, address: 'Box 12\nMapleton' })
    .returning('id');
  return row.id as number;
}

export async function insertCustomerField(db: Db, farmId: number, customerId: number | null, name = `Custom ${tag()}`): Promise<number> {
  const k = ++n;
  const [row] = await db('fields')
    .insert({
      farm_id: farmId,
      customer_id: customerId,
      name,
      boundary: JSON.stringify(rect(-97.5 + (k % 500) * 0.006, 46.2 + Math.floor(k / 500) * 0.006, 0.005, 0.005)),
      area_m2: 160 * 4046.8564224,
      acres: 160,
    })
    .returning('id');
  return row.id as number;
}

export interface FinishedJob {
  day: string;
  operation: Operation;
  acres: string | null;
  hours: string | null;
  /** `measured`: the acres came from the job's track; the typed figure is kept beside them. */
  source?: 'typed' | 'measured';
  typed?: string;
  state?: 'finished' | 'called-off' | 'planned';
}

async function equipment(db: Db, farmId: number): Promise<{ machine: number; implement: number }> {
  const [m] = await db('machines')
    .insert({ farm_id: farmId, name: `Tractor ${tag()}`, kind: 'tractor-4wd', power_hp: 400, engine_hours: 1000 })
    .returning('id');
  const [i] = await db('implements')
    .insert({ farm_id: farmId, name: `Harrow ${tag()}`, kind: 'harrow', width_m: 25.6, operations: ['harrowing'] })
    .returning('id');
  return { machine: m.id, implement: i.id };
}

export async function insertJob(db: Db, farmId: number, fieldId: number, operatorId: number, j: FinishedJob): Promise<number> {
  const { machine, implement } = await equipment(db, farmId);
  const state = j.state ?? 'finished';
  const [a] = await db('assignments')
    .insert({
      farm_id: farmId,
      day: j.day,
      field_id: fieldId,
      operation: j.operation,
      operator_id: operatorId,
      machine_id: machine,
      implement_id: implement,
      run_order: 1,
      acres_planned: 160,
      state,
      ...(state === 'finished'
        ? {
            acres_done: j.acres,
            acres_typed: j.typed ?? j.acres,
            acres_source: j.source ?? 'typed',
            hours_worked: j.hours,
            started_at: `${j.day}T13:00:00Z`,
            finished_at: `${j.day}T18:00:00Z`,
          }
        : {}),
    })
    .returning('id');
  return a.id as number;
}

/** An invoice of one line (100 ac harrowing at $5.00: $500.00) in the given state, numbered from the farm's counter. */
export async function insertInvoice(
  db: Db,
  farmId: number,
  customerId: number,
  state: 'draft' | 'sent' | 'paid' = 'draft',
): Promise<number> {
  return db.transaction(async (tx) => {
    const number = await takeNumber(tx, farmId);
    const [inv] = await tx('invoices')
      .insert({
        farm_id: farmId,
        customer_id: customerId,
        number,
        state,
        period_from: '2026-04-01',
        period_to: '2026-04-30',
        issued_on: '2026-05-01',
        customer_name: 'Matrix Neighbour',
        customer_email: 'matrix@furlong.test',
        currency: 'usd',
        subtotal_cents: 50_000,
        tax_cents: 0,
        total_cents: 50_000,
        sent_at: state === 'draft' ? null : tx.fn.now(),
      })
      .returning('id');
    await tx('invoice_lines').insert({
      invoice_id: inv.id,
      position: 1,
      field_name: 'Matrix Field',
      operation: 'harrowing',
      day: '2026-04-10',
      unit: 'acre',
      quantity: 100,
      quantity_source: 'typed',
      rate_cents: 500,
      amount_cents: 50_000,
    });
    return inv.id as number;
  });
}
