// Boundary files in: GeoJSON, KML/KMZ and zipped shapefiles. A preview lists every feature
// found with its acres and problems; saving writes the chosen ones in one transaction, or none.
// Reading and checking the file runs in a compute worker (read-file.ts); the farm's own checks
// (names already used) run here.
import type { MultiPolygon, Polygon } from 'geojson';
import type { ImportPreview } from '../../../shared/schemas/fields';
import type { AppDeps } from '../../app-deps';
import { AppError } from '../../http/errors';
import { createField } from '../fields.service';
import { fieldNameTaken } from '../fields.repository';
import { acresToM2 } from '../../../shared/units';

const nameTakenMessage = (name: string) => `A field called "${name}" already exists on this farm; rename it or untick it`;

async function readChecked(deps: AppDeps, file: { name: string; data: Buffer }, nameAttribute?: string): Promise<ImportPreview> {
  return deps.compute.run('readBoundaryFile', { name: file.name, data: file.data, nameAttribute });
}

/** Reads a boundary file and checks every feature in it against the farm's fields. */
export async function previewImport(
  deps: AppDeps,
  farmId: number,
  file: { name: string; data: Buffer },
  nameAttribute?: string,
): Promise<ImportPreview> {
  const preview = await readChecked(deps, file, nameAttribute);
  for (const f of preview.features) {
    if (await fieldNameTaken(deps.db, farmId, f.name)) f.errors.push(nameTakenMessage(f.name));
  }
  return preview;
}

/** Saves the chosen features (all of them when no choice is given) in one transaction. */
export async function saveImport(
  deps: AppDeps,
  farmId: number,
  file: { name: string; data: Buffer },
  nameAttribute: string | undefined,
  selection: Array<{ index: number; name: string }> | undefined,
): Promise<{ saved: Array<{ id: number; name: string; acres: number }> }> {
  const preview = await readChecked(deps, file, nameAttribute);
  const chosen = selection ?? preview.features.map((f) => ({ index: f.index, name: f.name }));
  const problems: string[] = [];
  const names = new Set<string>();
  for (const c of chosen) {
    const f = preview.features[c.index];
    if (!f) {
      problems.push(`There is no feature ${c.index + 1} in the file`);
      continue;
    }
    // Name problems are judged on the chosen name below, not on the file's.
    problems.push(...f.errors.filter((e) => !e.includes('is used twice')));
    if (names.has(c.name.toLowerCase())) problems.push(`Two fields would be called "${c.name}"; rename one`);
    names.add(c.name.toLowerCase());
    if (await fieldNameTaken(deps.db, farmId, c.name)) problems.push(nameTakenMessage(c.name));
  }
  if (problems.length) {
    throw new AppError(
      422,
      'import_refused',
      `Nothing was saved. ${problems[0]}${problems.length > 1 ? ` (and ${problems.length - 1} more problem${problems.length > 2 ? 's' : ''})` : ''}`,
      undefined,
      { problems },
    );
  }
  const saved = await deps.db.transaction(async (tx) => {
    const rows: Array<{ id: number; name: string; acres: number }> = [];
    for (const c of chosen) {
      const f = preview.features[c.index];
      const acres = f.acres!;
      const measured = { boundary: f.geometry as Polygon | MultiPolygon, areaM2: acresToM2(acres), acres };
      const id = await createField(deps, farmId, { name: c.name, boundary: f.geometry }, tx, measured);
      rows.push({ id, name: c.name, acres });
    }
    return rows;
  });
  return { saved };
}
