// Customers of custom work and the fields marked as theirs: the only file that reads or writes them.
import type { Tx } from '../db/knex';

export interface CustomerRow {
  id: number;
  name: string;
  email: string;
  address: string | null;
}

export interface CustomerFieldRow {
  id: number;
  name: string;
  acres: number;
  customer_id: number;
}

const COLUMNS = ['id', 'name', 'email', 'address'] as const;

export const listCustomers = (db: Tx, farmId: number): Promise<CustomerRow[]> =>
  db('customers').where({ farm_id: farmId }).orderByRaw('lower(name), id').select(COLUMNS);

export const customerById = (db: Tx, farmId: number, id: number): Promise<CustomerRow | undefined> =>
  db('customers').where({ farm_id: farmId, id }).first(COLUMNS);

/** The fields marked as customers' (of one customer, or of all), by name. */
export function customerFields(db: Tx, farmId: number, customerId?: number): Promise<CustomerFieldRow[]> {
  const q = db('fields').where({ farm_id: farmId }).whereNotNull('customer_id');
  if (customerId !== undefined) q.andWhere({ customer_id: customerId });
  return q.orderByRaw('lower(name), id').select('id', 'name', 'acres', 'customer_id');
}

export async function insertCustomer(db: Tx, farmId: number, c: Omit<CustomerRow, 'id'>): Promise<number> {
  const [row] = await db('customers')
    .insert({ farm_id: farmId, ...c })
    .returning('id');
  return row.id as number;
}

export async function updateCustomer(db: Tx, farmId: number, id: number, c: Partial<Omit<CustomerRow, 'id'>>): Promise<boolean> {
  const n = await db('customers')
    .where({ farm_id: farmId, id })
    .update({ ...c, updated_at: db.fn.now() });
  return n > 0;
}

export async function deleteCustomer(db: Tx, farmId: number, id: number): Promise<boolean> {
  return (await db('customers').where({ farm_id: farmId, id }).delete()) > 0;
}

/** Marks a field as a customer's (or the farm's own with null); false when the field is not the farm's. */
export async function setFieldCustomer(db: Tx, farmId: number, fieldId: number, customerId: number | null): Promise<boolean> {
  const n = await db('fields').where({ farm_id: farmId, id: fieldId }).update({ customer_id: customerId, updated_at: db.fn.now() });
  return n > 0;
}

/** True when an invoice or credit note names the customer. */
export async function hasInvoices(db: Tx, farmId: number, customerId: number): Promise<boolean> {
  return Boolean(await db('invoices').where({ farm_id: farmId, customer_id: customerId }).first('id'));
}
