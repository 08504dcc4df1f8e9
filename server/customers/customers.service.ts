// Customers of custom work. A customer's fields are ordinary fields marked with the customer's id:
// jobs on them go on the board like any job, and the finished ones can be invoiced
// (server/invoices). A customer who has invoices cannot be removed: the invoices name them.
import type { Customer, CustomerBody, CustomerPatchBody, FieldCustomerAnswer } from '../../shared/schemas/customers';
import type { Tx } from '../db/knex';
import { AppError, notFound } from '../http/errors';
import * as repo from './customers.repository';

const NOT_FOUND = 'That customer';

function shape(c: repo.CustomerRow, fields: repo.CustomerFieldRow[]): Customer {
  return {
    id: c.id,
    name: c.name,
    email: c.email,
    address: c.address,
    fields: fields.filter((f) => f.customer_id === c.id).map((f) => ({ id: f.id, name: f.name, acres: f.acres })),
  };
}

export async function listCustomers(db: Tx, farmId: number): Promise<Customer[]> {
  const [customers, fields] = await Promise.all([repo.listCustomers(db, farmId), repo.customerFields(db, farmId)]);
  return customers.map((c) => shape(c, fields));
}

export async function getCustomer(db: Tx, farmId: number, id: number): Promise<Customer> {
  const c = await repo.customerById(db, farmId, id);
  if (!c) throw notFound(NOT_FOUND);
  return shape(c, await repo.customerFields(db, farmId, id));
}

export async function createCustomer(db: Tx, farmId: number, body: CustomerBody): Promise<Customer> {
  const id = await repo.insertCustomer(db, farmId, { name: body.name, email: body.email, address: body.address });
  return getCustomer(db, farmId, id);
}

export async function updateCustomer(db: Tx, farmId: number, id: number, body: CustomerPatchBody): Promise<Customer> {
  if (!(await repo.updateCustomer(db, farmId, id, body))) throw notFound(NOT_FOUND);
  return getCustomer(db, farmId, id);
}

export async function removeCustomer(db: Tx, farmId: number, id: number): Promise<void> {
  if (!(await repo.customerById(db, farmId, id))) throw notFound(NOT_FOUND);
  if (await repo.hasInvoices(db, farmId, id))
    throw new AppError(409, 'customer_invoiced', 'This customer has invoices, which must keep their name: the customer cannot be removed');
  // Their fields become the farm's own (ON DELETE SET NULL); the jobs on them stay.
  await repo.deleteCustomer(db, farmId, id);
}

export async function setFieldCustomer(db: Tx, farmId: number, fieldId: number, customerId: number | null): Promise<FieldCustomerAnswer> {
  if (customerId !== null && !(await repo.customerById(db, farmId, customerId))) throw notFound(NOT_FOUND);
  if (!(await repo.setFieldCustomer(db, farmId, fieldId, customerId))) throw notFound('That field');
  return { fieldId, customerId };
}
