// The rules for naming fields, in one place: the API's schemas, a file's import and the upload
// screen all judge names with these, and say what is wrong with a code each.

/** Longest field name, in characters. */
export const FIELD_NAME_MAX = 120;

/** What can be wrong with a field's name. */
export const FIELD_NAME_PROBLEM_CODES = ['name-missing', 'name-too-long', 'name-repeated', 'name-taken'] as const;
export type FieldNameProblemCode = (typeof FIELD_NAME_PROBLEM_CODES)[number];

/**
 * What makes two field names the same: case and spaces around them do not count (the database
 * compares `lower(name)` of trimmed names the same way).
 *
 * @example fieldNameKey('  North Forty ') === fieldNameKey('north forty') // true
 */
export const fieldNameKey = (name: string): string => name.trim().toLowerCase();

/** A name problem of one item of a list; `name` is the name as given, trimmed. */
export interface FieldNameProblem {
  index: number;
  name: string;
  code: Exclude<FieldNameProblemCode, 'name-taken'>;
}

/**
 * Problems with names given to new fields together (an import's features or the fields ticked to
 * save), in list order: a blank name, one longer than FIELD_NAME_MAX, or one the same as an earlier
 * item's (by `fieldNameKey`; the first keeps it). Names already used on the farm need the farm's
 * fields and are the server's to add (`name-taken`).
 *
 * @param items the names, with the index each is known by
 * @example fieldNameProblems([{ index: 0, name: 'North' }, { index: 1, name: 'north ' }])
 * // [{ index: 1, name: 'north', code: 'name-repeated' }]
 */
export function fieldNameProblems(items: readonly { index: number; name: string }[]): FieldNameProblem[] {
  const problems: FieldNameProblem[] = [];
  const seen = new Set<string>();
  for (const item of items) {
    const name = item.name.trim();
    if (!name) problems.push({ index: item.index, name, code: 'name-missing' });
    else if (name.length > FIELD_NAME_MAX) problems.push({ index: item.index, name, code: 'name-too-long' });
    const key = fieldNameKey(name);
    if (name && seen.has(key)) problems.push({ index: item.index, name, code: 'name-repeated' });
    seen.add(key);
  }
  return problems;
}
