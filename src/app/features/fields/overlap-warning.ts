import type { BoundaryOverlap } from '@shared/schemas/fields';

/**
 * The warning for a boundary that overlaps other fields of the farm, in plain words, e.g.
 * "Overlaps Home Quarter by 12.4 ac and West Quarter by 0.3 ac." `area` formats acres in the farm's
 * units (Units.area). Null when there is no overlap (shared edges and slivers are not counted).
 */
export function overlapWarning(overlaps: readonly BoundaryOverlap[] | undefined, area: (acres: number) => string): string | null {
  if (!overlaps?.length) return null;
  const parts = overlaps.map((o) => `${o.name} by ${area(o.acres)}`);
  const list = parts.length === 1 ? parts[0] : `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
  return `Overlaps ${list}.`;
}
