import { LRUCache } from 'lru-cache';
import type { Request } from 'express';
import multer from 'multer';
import { idParam } from '../../shared/schemas/common';
import {
  cropCopyBody,
  cropParams,
  cropPlanBody,
  fieldCreateBody,
  fieldPatchBody,
  hazardBody,
  hazardParams,
  hazardPatchBody,
  importQuery,
  importSelection,
  seasonParam,
  seasonQuery,
} from '../../shared/schemas/fields';
import { MAX_UPLOAD_BYTES } from '../../shared/limits';
import type { AppDeps } from '../app-deps';
import { heavyWork } from '../http/heavy';
import { AppError } from '../http/errors';
import { jsonReading, sendReading, type JsonReading } from '../http/json-reading';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params, query } from '../http/validate';
import * as fields from './fields.service';
import { previewImport, saveImport } from './import/import.service';

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 10, fieldSize: 256 * 1024 },
});

/** The season asked for (`?season=`), else the farm's current one (the year at the farm). */
const seasonOf = (req: Request): number => query(req, seasonQuery).season ?? fields.currentSeason(principal(req).timeZone);

export function fieldRoutes(r: Routes, deps: AppDeps): void {
  // Boundary checks and file imports run in a compute worker.
  const imports = heavyWork(60);
  const boundaryWrites = heavyWork(120);
  // The list is computed once per farm revision and season (every field, crop plan, hazard and
  // job write moves the revision) and sent gzip-compressed with an ETag, as the board is: 200
  // fields are 52 KB of JSON that took a query and their serialising on every request.
  const lists = new LRUCache<string, JsonReading, { farmId: number; season: number }>({
    maxSize: 32 * 1024 * 1024,
    sizeCalculation: (r) => r.json.length + r.gzipped.length,
    fetchMethod: async (key, _stale, { context }) =>
      jsonReading(await fields.listFields(deps, context.farmId, context.season), `fields-${key.replaceAll('|', '-')}`),
  });
  r.get('/', 'member', async (req, res) => {
    const by = principal(req);
    const season = seasonOf(req);
    const reading = await lists.fetch(`${by.farmId}|${season}|${by.farmRevision}`, { context: { farmId: by.farmId, season } });
    sendReading(req, res, reading!);
  });

  r.get('/export.geojson', 'member', async (req, res) => {
    const fc = await fields.exportGeoJson(deps, principal(req).farmId, seasonOf(req));
    res.set('Content-Disposition', 'attachment; filename="fields.geojson"').type('application/geo+json').send(JSON.stringify(fc));
  });

  r.post('/', ['owner'], ...boundaryWrites, async (req, res) => {
    const input = body(req, fieldCreateBody);
    const farmId = principal(req).farmId;
    const id = await fields.createField(deps, farmId, input);
    const overlaps = await fields.overlapsOfField(deps, farmId, id);
    res.status(201).json({ ...(await fields.getField(deps, farmId, id, seasonOf(req))), overlaps });
  });

  r.post('/import', ['owner'], ...imports, upload.single('file'), async (req, res) => {
    const q = query(req, importQuery);
    if (!req.file) throw new AppError(400, 'no_file', 'Choose a boundary file to upload');
    const file = { name: req.file.originalname, data: req.file.buffer };
    const farmId = principal(req).farmId;
    if (q.dryRun === 'true') {
      res.json(await fields.withOverlaps(deps, farmId, await previewImport(deps, farmId, file, q.nameAttribute)));
      return;
    }
    let selection: Array<{ index: number; name: string }> | undefined;
    if (typeof req.body?.selection === 'string') {
      let raw: unknown;
      try {
        raw = JSON.parse(req.body.selection);
      } catch {
        throw new AppError(400, 'invalid_input', 'The list of fields to save is not valid JSON');
      }
      const parsed = importSelection.safeParse(raw);
      if (!parsed.success) throw new AppError(400, 'invalid_input', parsed.error.issues[0].message);
      selection = parsed.data;
    }
    res.status(201).json(await saveImport(deps, farmId, file, q.nameAttribute, selection));
  });

  r.get('/:id', 'member', async (req, res) => {
    res.json(await fields.getField(deps, principal(req).farmId, params(req, idParam).id, seasonOf(req)));
  });

  r.patch('/:id', ['owner'], ...boundaryWrites, async (req, res) => {
    const { id } = params(req, idParam);
    const farmId = principal(req).farmId;
    const patch = body(req, fieldPatchBody);
    await fields.updateField(deps, farmId, id, patch);
    const detail = await fields.getField(deps, farmId, id, seasonOf(req));
    // Only a redrawn boundary is compared again: a rename or a note says nothing new about overlaps.
    res.json(patch.boundary !== undefined ? { ...detail, overlaps: await fields.overlapsOfField(deps, farmId, id) } : detail);
  });

  r.delete('/:id', ['owner'], async (req, res) => {
    await fields.deleteField(deps, principal(req).farmId, params(req, idParam).id);
    res.status(204).end();
  });

  r.post('/:id/hazards', ['owner'], async (req, res) => {
    const { id } = params(req, idParam);
    res.status(201).json(await fields.addHazard(deps, principal(req).farmId, id, body(req, hazardBody)));
  });

  r.patch('/:id/hazards/:hazardId', ['owner'], async (req, res) => {
    const p = params(req, hazardParams);
    res.json(await fields.updateHazard(deps, principal(req).farmId, p.id, p.hazardId, body(req, hazardPatchBody)));
  });

  r.delete('/:id/hazards/:hazardId', ['owner'], async (req, res) => {
    const p = params(req, hazardParams);
    await fields.deleteHazard(deps, principal(req).farmId, p.id, p.hazardId);
    res.status(204).end();
  });

  r.put('/:id/crops/:season', ['owner'], async (req, res) => {
    const p = params(req, cropParams);
    const b = body(req, cropPlanBody);
    await fields.setCropPlan(deps, principal(req).farmId, p.id, p.season, b.crop, b.varietyNote ?? null);
    res.json({ fieldId: p.id, season: p.season, crop: b.crop, varietyNote: b.varietyNote ?? null });
  });

  r.delete('/:id/crops/:season', ['owner'], async (req, res) => {
    const p = params(req, cropParams);
    await fields.clearCropPlan(deps, principal(req).farmId, p.id, p.season);
    res.status(204).end();
  });
}

export function cropPlanRoutes(r: Routes, deps: AppDeps): void {
  r.get('/:season', 'member', async (req, res) => {
    res.json(await fields.listCropPlans(deps, principal(req).farmId, params(req, seasonParam).season));
  });
  r.post('/:season/copy', ['owner'], async (req, res) => {
    const to = params(req, seasonParam).season;
    const { from } = body(req, cropCopyBody);
    res.json(await fields.copyCropPlans(deps, principal(req).farmId, from, to));
  });
}
