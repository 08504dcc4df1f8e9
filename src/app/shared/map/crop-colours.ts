import { cropName } from '@shared/figures';
import { CROPS } from '@shared/schemas/fields';

/**
 * Furlong's own fill colours for the crops on a map: twelve hues far apart on the colour wheel
 * and in lightness, so neighbouring fields of different crops stay apart (drawn at 55 % over the
 * plain map). A crop outside the list takes one of the spare colours by its name, always the same.
 */
export const CROP_COLOURS: Readonly<Record<(typeof CROPS)[number], string>> = {
  'spring wheat': '#c8922a',
  durum: '#8a5a2e',
  barley: '#d9c27a',
  oats: '#9aa85a',
  canola: '#e8d21c',
  'field peas': '#4f9a48',
  lentils: '#8a72b8',
  flax: '#4a7fc1',
  sunflowers: '#e0782a',
  soybeans: '#2f8f83',
  corn: '#b5453a',
  fallow: '#a39f94',
};

const SPARE = ['#c26a9a', '#5fa8b8', '#7b8f3a', '#b88a5e', '#6f6fd0', '#d08a8a'];

/** The fill colour of a crop; null for a field with no crop planned (drawn outline only). */
export function cropColour(crop: string | null | undefined): string | null {
  if (!crop) return null;
  const key = crop.trim().toLowerCase();
  if (key in CROP_COLOURS) return CROP_COLOURS[key as keyof typeof CROP_COLOURS];
  let hash = 0;
  for (const ch of key) hash = (hash * 31 + ch.charCodeAt(0)) >>> 0;
  return SPARE[hash % SPARE.length];
}

/** One line of a map's colour key. A null colour is drawn as an empty outline. */
export interface LegendEntry {
  label: string;
  colour: string | null;
  count: number;
}

/** The key for the crops on a map: each crop present once (with its field count), "Not planned" last. */
export function cropLegend(crops: readonly (string | null | undefined)[]): LegendEntry[] {
  const counts = new Map<string, number>();
  let none = 0;
  for (const crop of crops) {
    // One entry per crop however it was typed ("Spring Wheat", "spring  wheat"), named in the one style.
    const key = cropName(crop)?.toLowerCase();
    if (key) counts.set(key, (counts.get(key) ?? 0) + 1);
    else none++;
  }
  const order = CROPS as readonly string[];
  const rank = (c: string) => (order.includes(c) ? order.indexOf(c) : order.length);
  const entries: LegendEntry[] = [...counts]
    .sort(([a], [b]) => rank(a) - rank(b) || a.localeCompare(b))
    .map(([key, count]) => ({ label: cropName(key) ?? key, colour: cropColour(key), count }));
  if (none) entries.push({ label: 'Not planned', colour: null, count: none });
  return entries;
}
