import type { Customer } from '@shared/schemas/customers';

/** A field as the customer form lists it: whose it is now. */
export interface FieldChoice {
  id: number;
  name: string;
  acres: number;
  /** The customer whose field it is now, other than the one in the form; null when the farm's own or this customer's. */
  otherCustomer: string | null;
}

/** One change of a field's owner to send: `PUT /api/fields/:id/customer`. */
export interface FieldMark {
  fieldId: number;
  customerId: number | null;
}

/**
 * The farm's fields for a customer's form, by name: each with the other customer it belongs to now
 * (choosing it moves it to this customer).
 *
 * @param fields every field of the farm
 * @param customers every customer with their fields
 * @param customerId the customer in the form; null for a new one
 */
export function fieldChoices(
  fields: ReadonlyArray<{ id: number; name: string; acres: number }>,
  customers: readonly Customer[],
  customerId: number | null,
): FieldChoice[] {
  const owner = new Map<number, Customer>();
  for (const c of customers) for (const f of c.fields) owner.set(f.id, c);
  return fields
    .map((f) => {
      const c = owner.get(f.id);
      return { id: f.id, name: f.name, acres: f.acres, otherCustomer: c && c.id !== customerId ? c.name : null };
    })
    .sort((a, b) => a.name.localeCompare(b.name));
}

/**
 * What to send so that exactly `chosen` are the customer's fields: each newly chosen field is
 * marked theirs, each of theirs no longer chosen goes back to the farm; unchanged fields send nothing.
 *
 * @example fieldMarks(7, [1, 2], [2, 3]) // [{ fieldId: 3, customerId: 7 }, { fieldId: 1, customerId: null }]
 */
export function fieldMarks(customerId: number, theirsNow: readonly number[], chosen: readonly number[]): FieldMark[] {
  const now = new Set(theirsNow);
  const want = new Set(chosen);
  return [
    ...[...want].filter((id) => !now.has(id)).map((fieldId) => ({ fieldId, customerId })),
    ...[...now].filter((id) => !want.has(id)).map((fieldId) => ({ fieldId, customerId: null })),
  ];
}
