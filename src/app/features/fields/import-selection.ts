import type { ImportPreview } from '@shared/schemas/fields';

/** One feature of an uploaded file as the owner sees it in the preview. */
export interface ImportRow {
  index: number;
  name: string;
  acres: number | null;
  geometry: unknown;
  errors: string[];
  /** A feature with errors can never be saved, so it cannot be ticked. */
  tickable: boolean;
  ticked: boolean;
}

/**
 * The preview's rows: every usable feature ticked, features with errors unticked for good. When the
 * preview is re-run (another name attribute), ticks the owner took off stay off.
 */
export function rowsFromPreview(preview: ImportPreview, previous: readonly ImportRow[] = []): ImportRow[] {
  const before = new Map(previous.map((row) => [row.index, row]));
  return preview.features.map((f) => {
    const tickable = f.errors.length === 0;
    const earlier = before.get(f.index);
    return {
      index: f.index,
      name: f.name,
      acres: f.acres,
      geometry: f.geometry,
      errors: f.errors,
      tickable,
      ticked: tickable && (earlier ? earlier.ticked || !earlier.tickable : true),
    };
  });
}

export function setTicked(rows: readonly ImportRow[], index: number, ticked: boolean): ImportRow[] {
  return rows.map((row) => (row.index === index ? { ...row, ticked: row.tickable && ticked } : row));
}

export function setAllTicked(rows: readonly ImportRow[], ticked: boolean): ImportRow[] {
  return rows.map((row) => ({ ...row, ticked: row.tickable && ticked }));
}

export function rename(rows: readonly ImportRow[], index: number, name: string): ImportRow[] {
  return rows.map((row) => (row.index === index ? { ...row, name } : row));
}

/** What `selection` carries to the server: the ticked features under the names shown. */
export function selectionOf(rows: readonly ImportRow[]): { index: number; name: string }[] {
  return rows.filter((row) => row.ticked && row.tickable).map((row) => ({ index: row.index, name: row.name.trim() }));
}

/** Why the ticked rows cannot be saved yet, in plain words; empty when they can. */
export function selectionProblems(rows: readonly ImportRow[]): string[] {
  const chosen = rows.filter((row) => row.ticked && row.tickable);
  if (chosen.length === 0) return ['Tick at least one field to save.'];
  const problems: string[] = [];
  const seen = new Map<string, number>();
  for (const row of chosen) {
    const name = row.name.trim();
    if (!name) problems.push(`Feature ${row.index + 1} needs a name.`);
    else if (name.length > 120) problems.push(`The name of feature ${row.index + 1} is longer than 120 characters.`);
    const key = name.toLowerCase();
    if (name && seen.has(key)) problems.push(`Two ticked fields are called “${name}”; give each its own name.`);
    seen.set(key, row.index);
  }
  return problems;
}
