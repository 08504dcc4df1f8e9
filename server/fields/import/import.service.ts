// Boundary files in: GeoJSON, KML/KMZ and zipped shapefiles. A preview lists every feature
// found with its acres and problems; saving writes the chosen ones in one transaction, or none.
// Reading and checking the file runs in a compute worker (read-file.ts); the farm's own checks
// (names already used) run here.
import type { MultiPolygon, Polygon } from 'geojson';
import { fieldNameProblems } from '../../../shared/field-names';
import { isNameProblem, type ImportPreview, type ImportProblem } from '../../../shared/schemas/fields';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../http/errors';
import { createField } from '../fields.service';
import { fieldNameTaken } from '../fields.repository';
import type { ReadFile } from './read-file';

const nameTaken = (name: string, index: number): ImportProblem => ({
  code: 'name-taken',
  message: `A field called "${name}" already exists on this farm; rename it or untick it`,
  index,
});

/** Reads, checks and measures every feature of the file once, in a compute worker. */
async function readChecked(deps: AppDeps, file: { name: string; data: Buffer }, nameAttribute?: string): Promise<ReadFile> {
  return deps.compute.run('readBoundaryFile', { name: file.name, data: file.data, nameAttribute });
}

/** Reads a boundary file and checks every feature in it against the farm's fields. */
export async function previewImport(
  deps: AppDeps,
  farmId: number,
  file: { name: string; data: Buffer },
  nameAttribute?: string,
): Promise<ImportPreview> {
  const read = await readChecked(deps, file, nameAttribute);
  const features = [];
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  for (const { areaM2, ...f } of read.features) {
    if (await fieldNameTaken(deps.db, farmId, f.name)) {
      const taken = nameTaken(f.name, f.index);
      f.problems.push(taken);
      f.errors.push(taken.message);
    }
    features.push(f);
  }
  return { ...read, features };
}

/** Saves the chosen features (all of them when no choice is given) in one transaction. */
export async function saveImport(
  deps: AppDeps,
  farmId: number,
  file: { name: string; data: Buffer },
  nameAttribute: string | undefined,
  selection: Array<{ index: number; name: string }> | undefined,
): Promise<{ saved: Array<{ id: number; name: string; acres: number }> }> {
  const read = await readChecked(deps, file, nameAttribute);
  const chosen = selection ?? read.features.map((f) => ({ index: f.index, name: f.name }));
  // Names are judged as chosen, not as the file has them (the schema has refused blank and long ones).
  const repeated = new Set(
    fieldNameProblems(chosen.map((c, i) => ({ index: i, name: c.name })))
      .filter((p) => p.code === 'name-repeated')
      .map((p) => p.index),
  );
  const problems: ImportProblem[] = [];
  for (const [i, c] of chosen.entries()) {
    const f = read.features[c.index];
    if (!f) {
      problems.push({ code: 'no-such-feature', message: `There is no feature ${c.index + 1} in the file`, index: c.index });
      continue;
    }
    problems.push(...f.problems.filter((p) => !isNameProblem(p.code)));
    if (repeated.has(i))
      problems.push({ code: 'name-repeated', message: `Two fields would be called "${c.name}"; rename one`, index: c.index });
    if (await fieldNameTaken(deps.db, farmId, c.name)) problems.push(nameTaken(c.name, c.index));
  }
  if (problems.length) {
    throw new AppError(
      422,
      'import_refused',
      `Nothing was saved. ${problems[0].message}${problems.length > 1 ? ` (and ${problems.length - 1} more problem${problems.length > 2 ? 's' : ''})` : ''}`,
      undefined,
      { problems },
    );
  }
  const saved = await deps.db.transaction(async (tx) => {
    const rows: Array<{ id: number; name: string; acres: number }> = [];
    for (const c of chosen) {
      const f = read.features[c.index];
      // Checked and measured when the file was read: not measured again.
      const measured = { boundary: f.geometry as Polygon | MultiPolygon, areaM2: f.areaM2!, acres: f.acres! };
      const id = await createField(deps, farmId, { name: c.name, boundary: f.geometry }, tx, measured);
      rows.push({ id, name: c.name, acres: measured.acres });
    }
    return rows;
  });
  return { saved };
}
