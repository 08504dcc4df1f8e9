import { FIELD_NAME_MAX, fieldNameProblems, type FieldNameProblem } from '@shared/field-names';
import { isNameProblem, type ImportPreview, type ImportProblem } from '@shared/schemas/fields';

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
}

/** The problems that still hold for a row under its current name. */
const standing = (row: Pick<ImportRow, 'problems' | 'name' | 'previewName'>): ImportProblem[] =>
  row.problems.filter((p) => !isNameProblem(p.code) || row.name.trim() === row.previewName);

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
    });
  });
}

export function setTicked(rows: readonly ImportRow[], index: number, ticked: boolean): ImportRow[] {
  return rows.map((row) => (row.index === index ? { ...row, ticked: row.tickable && ticked } : row));
}

export function setAllTicked(rows: readonly ImportRow[], ticked: boolean): ImportRow[] {
  return rows.map((row) => ({ ...row, ticked: row.tickable && ticked }));
}

export function rename(rows: readonly ImportRow[], index: number, name: string): ImportRow[] {
  return rows.map((row) => (row.index === index ? withErrors({ ...row, name }) : row));
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
