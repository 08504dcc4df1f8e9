// Customers of custom work (neighbours the farm works for) and which fields are theirs. Read by
// the owner and viewers (the accountant); changed by the owner. Operators see no customers: they
// see the fields and jobs as usual, nothing about who pays.
import * as z from 'zod';
import { dbIdNumber, email } from './common';

export const CUSTOMER_LIMITS = { nameMax: 120, addressMax: 500 } as const;

const name = z
  .string({ error: 'Enter the customer’s name' })
  .trim()
  .min(1, 'Enter the customer’s name')
  .max(CUSTOMER_LIMITS.nameMax, `Keep the name to ${CUSTOMER_LIMITS.nameMax} characters`);
const address = z
  .string({ error: 'Enter the address as text' })
  .trim()
  .max(CUSTOMER_LIMITS.addressMax, `Keep the address to ${CUSTOMER_LIMITS.addressMax} characters`)
  .nullable()
  .transform((a) => (a ? a : null));

/** `POST /api/customers`: a neighbour's name, contact e-mail (invoices go there) and postal address (optional, printed on invoices). */
export const customerBody = z.object({
  name,
  email: z.string({ error: 'Enter the customer’s e-mail address' }).pipe(email),
  address: address.optional().default(null),
});
export type CustomerBody = z.infer<typeof customerBody>;

/** `PATCH /api/customers/:id`: any of the same, at least one. */
export const customerPatchBody = z
  .object({ name, email: z.string().pipe(email), address })
  .partial()
  .refine((b) => Object.keys(b).length > 0, 'Send at least one of name, email, address');
export type CustomerPatchBody = z.infer<typeof customerPatchBody>;

/** `PUT /api/fields/:id/customer`: whose field it is, or null for the farm's own. */
export const fieldCustomerBody = z.object({ customerId: dbIdNumber.nullable() });
export type FieldCustomerBody = z.infer<typeof fieldCustomerBody>;
export const fieldCustomerAnswer = z.object({ fieldId: z.number().int(), customerId: z.number().int().nullable() });
export type FieldCustomerAnswer = z.infer<typeof fieldCustomerAnswer>;

/** A customer as every customer route answers it, with the fields marked as theirs. */
export const customer = z.object({
  id: z.number().int(),
  name: z.string(),
  email: z.string(),
  address: z.string().nullable(),
  fields: z.array(z.object({ id: z.number().int(), name: z.string(), acres: z.number() })),
});
export type Customer = z.infer<typeof customer>;
export const customerList = z.array(customer);
