import type { Customer } from '@shared/schemas/customers';
import { fieldChoices, fieldMarks } from './field-marks';

const customer = (id: number, name: string, fields: number[]): Customer => ({
  id,
  name,
  email: `${id}@furlong.test`,
  address: null,
  fields: fields.map((f) => ({ id: f, name: `F${f}`, acres: 10 })),
});

describe('fieldMarks', () => {
  it('when fields are added and taken off, then each change is sent once and unchanged fields send nothing', () => {
    expect(fieldMarks(7, [1, 2], [2, 3])).toEqual([
      { fieldId: 3, customerId: 7 },
      { fieldId: 1, customerId: null },
    ]);
  });

  it('when nothing changes, then nothing is sent', () => {
    expect(fieldMarks(7, [4, 5], [5, 4])).toEqual([]);
  });
});

describe('fieldChoices', () => {
  it('when another customer has a field, then it is named; the form’s own customer’s fields and the farm’s are not', () => {
    const fields = [
      { id: 3, name: 'South quarter', acres: 160 },
      { id: 1, name: 'Home quarter', acres: 155 },
      { id: 2, name: 'Coulee', acres: 80 },
    ];
    const customers = [customer(7, 'Prairie Gate', [1]), customer(8, 'Willow Flats', [2])];
    expect(fieldChoices(fields, customers, 7)).toEqual([
      { id: 2, name: 'Coulee', acres: 80, otherCustomer: 'Willow Flats' },
      { id: 1, name: 'Home quarter', acres: 155, otherCustomer: null },
      { id: 3, name: 'South quarter', acres: 160, otherCustomer: null },
    ]);
    expect(fieldChoices(fields, customers, null).find((f) => f.id === 1)!.otherCustomer).toBe('Prairie Gate');
  });
});
