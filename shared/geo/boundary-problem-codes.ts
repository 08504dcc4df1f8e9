// Kept apart from the checks (no imports), so schemas and screens can name the codes without
// loading the geodesic code.

/** What can be wrong with a field boundary: stable codes that screens and API clients decide by. */
export const BOUNDARY_PROBLEM_CODES = [
  'not-polygon',
  'bad-coordinates',
  'not-finite',
  'out-of-range',
  'swapped',
  'too-many-positions',
  'too-many-rings',
  'too-few-positions',
  'not-closed',
  'zero-area',
  'self-intersection',
  'rings-cross',
  'rings-touch',
  'hole-outside',
  'parts-overlap',
] as const;
export type BoundaryProblemCode = (typeof BOUNDARY_PROBLEM_CODES)[number];
