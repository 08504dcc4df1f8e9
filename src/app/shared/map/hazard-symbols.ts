import type { HazardKind } from '@shared/schemas/fields';

/**
 * Furlong's own hazard symbols: small SVG shapes drawn in 20×20 boxes. Colours come from CSS
 * classes (see field-map.scss), so the symbols follow the light and dark themes.
 */
export const HAZARD_GLYPHS: Record<HazardKind, string> = {
  // A small square: a bin or a yard site.
  bin: '<rect x="4" y="4" width="12" height="12" rx="1" />',
  // A triangle: a rock.
  rock: '<path d="M10 3 L17.5 16.5 H2.5 Z" />',
  // A zig-zag: a power pole or line.
  power: '<path class="hz-open" d="M2 15 L6 5 L10 15 L14 5 L18 15" />',
  // A dashed band: a draw or a steep break.
  draw: '<path class="hz-open hz-dash" d="M2 6.5 H18 M2 13.5 H18" />',
  // A wave: a waterway.
  waterway: '<path class="hz-open" d="M2 11 Q6 5 10 11 T18 11" />',
  // A rail with posts: a fence.
  fence: '<path class="hz-open" d="M2 10 H18 M5 5 V15 M10 5 V15 M15 5 V15" />',
  // A half-filled diamond: a neighbour's edge.
  neighbour: '<path d="M10 2 L18 10 L10 18 Z" /><path class="hz-open" d="M10 2 L2 10 L10 18" />',
  // A ring with a dot: anything else.
  other: '<circle class="hz-open" cx="10" cy="10" r="6.5" /><circle cx="10" cy="10" r="2.5" />',
};

/** The inline SVG for a kind, for templates (`[innerHTML]` is not needed: use `<app-hazard-symbol>`). */
export function hazardSvg(kind: string): string {
  const glyph = HAZARD_GLYPHS[kind as HazardKind] ?? HAZARD_GLYPHS.other;
  return `<svg class="hz-glyph hz-${kind}" viewBox="0 0 20 20" width="20" height="20" aria-hidden="true" focusable="false">${glyph}</svg>`;
}

/** Line style of the hazard itself (not its clearance zone), as a Leaflet dash pattern. */
export function hazardDash(kind: string): string | undefined {
  if (kind === 'draw') return '10 6';
  if (kind === 'fence') return '2 6';
  return undefined;
}
