import { FIELD_NAME_MAX, fieldNameKey, fieldNameProblems } from './field-names';

// Furlong's own naming rules (no published source): names are compared without case or the
// spaces around them, as the database's unique index on lower(name) compares them.
describe('field names', () => {
  it('when two names differ only in case and spaces around them, then they are the same name', () => {
    expect(fieldNameKey('  North Forty ')).toBe(fieldNameKey('north forty'));
    expect(fieldNameKey('North Forty')).not.toBe(fieldNameKey('North  Forty'));
  });

  it('when names are blank, too long or repeated, then each problem has its code and the first of a repeated name keeps it', () => {
    const long = 'x'.repeat(FIELD_NAME_MAX + 1);
    expect(
      fieldNameProblems([
        { index: 0, name: 'North' },
        { index: 1, name: '   ' },
        { index: 2, name: ' north ' },
        { index: 3, name: long },
        { index: 4, name: 'South' },
      ]),
    ).toEqual([
      { index: 1, name: '', code: 'name-missing' },
      { index: 2, name: 'north', code: 'name-repeated' },
      { index: 3, name: long, code: 'name-too-long' },
    ]);
  });

  it('when a name is exactly the longest allowed, then it is fine', () => {
    expect(fieldNameProblems([{ index: 0, name: 'y'.repeat(FIELD_NAME_MAX) }])).toEqual([]);
  });
});
