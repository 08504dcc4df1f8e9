import { FIELD_NAME_MAX, fieldNameProblems, type FieldNameProblem } from '@shared/field-names';
import { isNameProblem, type BoundaryOverlap, type ImportPreview, type ImportProblem } from '@shared/schemas/fields';

/** One feature of an uploaded file as the owner sees it in the preview. */
export interface ImportRow {
  index: number;
  name: string;
  /** The name the preview judged; its name problems hold only while the row keeps it. */
  previewName: string;
  acres: number | null;
  geometry: unknown;
  /** Every problem the preview found, with its code. */
  problems: ImportProblem[];
  /** The messages shown on the row: its boundary's problems, and its name's while the name is unchanged. */
  errors: string[];
  /**
   * A feature whose boundary has a problem can never be saved, so it cannot be ticked. One whose
   * only problem is its name (used twice in the file, already on the farm) can, once renamed.
   */
  tickable: boolean;
  ticked: boolean;
  /** A new name typed in the preview is already a field of the farm (the preview judged only the file's names). */
  nameTaken?: boolean;
  /** The farm's fields this feature overlaps: a warning, it can still be saved. */
  overlaps: BoundaryOverlap[];
}

/** The farm's field names as `rename` compares them: trimmed, any case. */
export const farmNameSet = (names: readonly string[]): ReadonlySet<string> => new Set(names.map((n) => n.trim().toLowerCase()));

/** The problems that still hold for a row under its current name. */
function standing(row: Pick<ImportRow, 'problems' | 'name' | 'previewName' | 'nameTaken' | 'index'>): ImportProblem[] {
  const renamed = row.name.trim() !== row.previewName;
  const kept = row.problems.filter((p) => !isNameProblem(p.code) || !renamed);
  if (renamed && row.nameTaken)
    kept.push({
      code: 'name-taken',
      message: `A field called "${row.name.trim()}" already exists on this farm; choose another name`,
      index: row.index,
    });
  return kept;
}

const withErrors = (row: ImportRow): ImportRow => ({ ...row, errors: standing(row).map((p) => p.message) });

/**
 * The preview's rows: every feature without a problem ticked; features whose boundary has a
 * problem unticked for good; features with a name problem unticked until the owner ticks them
 * (and renames them). When the preview is re-run (another name attribute), ticks the owner took
 * off stay off.
 */
export function rowsFromPreview(preview: ImportPreview, previous: readonly ImportRow[] = []): ImportRow[] {
  const before = new Map(previous.map((row) => [row.index, row]));
  return preview.features.map((f) => {
    const tickable = f.problems.every((p) => isNameProblem(p.code));
    const earlier = before.get(f.index);
    return withErrors({
      index: f.index,
      name: f.name,
      previewName: f.name,
      acres: f.acres,
      geometry: f.geometry,
      problems: f.problems,
      errors: [],
      tickable,
      ticked: f.problems.length === 0 && (earlier ? earlier.ticked || earlier.problems.length > 0 : true),
      overlaps: f.overlaps ?? [],
    });
  });
}

export function setTicked(rows: readonly ImportRow[], index: number, ticked: boolean): ImportRow[] {
  return rows.map((row) => (row.index === index ? { ...row, ticked: row.tickable && ticked } : row));
}

export function setAllTicked(rows: readonly ImportRow[], ticked: boolean): ImportRow[] {
  return rows.map((row) => ({ ...row, ticked: row.tickable && ticked }));
}

/**
 * Renames a row. A new name is judged against the farm's field names at once (`farmNames`, from
 * `farmNameSet`), so renaming to another name the farm has is caught before saving. A row held back
 * only by its name is ticked the moment a new name clears it: renaming is what the preview asked for.
 */
export function rename(rows: readonly ImportRow[], index: number, name: string, farmNames: ReadonlySet<string> = new Set()): ImportRow[] {
  return rows.map((row) => {
    if (row.index !== index) return row;
    const next = withErrors({ ...row, name, nameTaken: farmNames.has(name.trim().toLowerCase()) });
    const wasHeld = standing(row).some((p) => isNameProblem(p.code));
    const nowClear = row.tickable && standing(next).length === 0 && name.trim().length > 0;
    return wasHeld && nowClear && !row.ticked ? { ...next, ticked: true } : next;
  });
}

/** What `selection` carries to the server: the ticked features under the names shown. */
export function selectionOf(rows: readonly ImportRow[]): { index: number; name: string }[] {
  return rows.filter((row) => row.ticked && row.tickable).map((row) => ({ index: row.index, name: row.name.trim() }));
}

const NAME_MESSAGES: Record<FieldNameProblem['code'], (p: FieldNameProblem) => string> = {
  'name-missing': (p) => `Feature ${p.index + 1} needs a name.`,
  'name-too-long': (p) => `The name of feature ${p.index + 1} is longer than ${FIELD_NAME_MAX} characters.`,
  'name-repeated': (p) => `Two ticked fields are called “${p.name}”; give each its own name.`,
};

/**
 * Why the ticked rows cannot be saved yet, in plain words; empty when they can. Names are judged
 * by the shared rules on the ticked rows as named now; a name the preview found already on the
 * farm holds until the row is renamed.
 */
export function selectionProblems(rows: readonly ImportRow[]): string[] {
  const chosen = rows.filter((row) => row.ticked && row.tickable);
  if (chosen.length === 0) return ['Tick at least one field to save.'];
  const problems = fieldNameProblems(chosen).map((p) => NAME_MESSAGES[p.code](p));
  for (const row of chosen) for (const p of standing(row)) if (p.code === 'name-taken') problems.push(p.message);
  return problems;
}
