import type { FeatureCollection, Geometry, MultiPolygon, Polygon } from 'geojson';
import * as z from 'zod';
import { FIELD_NAME_MAX, FIELD_NAME_PROBLEM_CODES, type FieldNameProblemCode } from '../field-names';
import { BOUNDARY_PROBLEM_CODES } from '../geo/boundary-problem-codes';
import { dbId, idParam, textWithoutNul } from './common';

import { HAZARD_KINDS } from './terms';

export { HAZARD_KINDS, HAZARD_LABELS, type HazardKind } from './terms';

export const CROPS = [
  'spring wheat',
  'durum',
  'barley',
  'oats',
  'canola',
  'field peas',
  'lentils',
  'flax',
  'sunflowers',
  'soybeans',
  'corn',
  'fallow',
] as const;

// Without NUL here too: an import's list of names comes as a multipart form field, not through server/http/validate.
const fieldName = textWithoutNul('A field name')
  .trim()
  .min(1, 'Give the field a name')
  .max(FIELD_NAME_MAX, `Use at most ${FIELD_NAME_MAX} characters`);

/** A geometry object; its coordinates are checked in detail by shared/geo/boundary-check. */
export const geometry = z.object({ type: z.string(), coordinates: z.unknown() }).passthrough();

export const fieldCreateBody = z.object({
  name: fieldName,
  boundary: geometry,
  notes: z.string().max(2000).optional(),
});

export const fieldPatchBody = z
  .object({ name: fieldName.optional(), boundary: geometry.optional(), notes: z.string().max(2000).nullable().optional() })
  .refine((v) => Object.keys(v).length > 0, 'Nothing to change');

export const hazardBody = z.object({
  kind: z.enum(HAZARD_KINDS, { message: `Kind must be one of: ${HAZARD_KINDS.join(', ')}` }),
  geometry,
  clearanceM: z.number().min(0, 'Clearance cannot be negative').max(500, 'Clearance is at most 500 m'),
  note: z.string().trim().max(500).optional().nullable(),
});

export const hazardPatchBody = hazardBody.partial().extend({ status: z.enum(['confirmed']).optional() });

export const season = z.coerce.number().int().min(1990, 'Season is a year such as 2026').max(2100, 'Season is a year such as 2026');

/** `?season=` on the field routes: the crop year to show; the farm's current year when left out. */
export const seasonQuery = z.object({ season: season.optional() });
export const hazardParams = idParam.extend({ hazardId: dbId });
export const cropParams = idParam.extend({ season });
/** `/api/crop-plans/:season` */
export const seasonParam = z.object({ season });
/** Copy every crop plan of the season `from` into the season in the address. */
export const cropCopyBody = z.object({ from: season });

export const cropPlanBody = z.object({
  crop: z.string().trim().min(1, 'Choose a crop').max(60),
  varietyNote: z.string().trim().max(200).optional().nullable(),
});

export const importQuery = z.object({
  dryRun: z.enum(['true', 'false']).optional(),
  nameAttribute: z.string().max(80).optional(),
});

/** The owner's choices in an import: which features to save, under which names. */
export const importSelection = z
  .array(z.object({ index: z.number().int().min(0), name: fieldName }))
  .min(1, 'Tick at least one field to save');

export interface FieldSummary {
  id: number;
  name: string;
  acres: number;
  hectares: number;
  crop: string | null;
  hazardCount: number;
  lastOperation: { operation: string; date: string } | null;
  boundary: { type: 'Polygon' | 'MultiPolygon'; coordinates: unknown };
}

/**
 * What can be wrong with a feature of an imported file, or with the choice of features to save:
 * the boundary's problems (shared/geo/boundary-check; a feature that is no area is `not-polygon`),
 * its name's (shared/field-names), and `no-such-feature` for a chosen index the file lacks.
 * Screens and API clients decide by these codes; the message is for people.
 */
export const IMPORT_PROBLEM_CODES = [...BOUNDARY_PROBLEM_CODES, ...FIELD_NAME_PROBLEM_CODES, 'no-such-feature'] as const;
export const importProblemCode = z.enum(IMPORT_PROBLEM_CODES);
export type ImportProblemCode = z.infer<typeof importProblemCode>;

/** One problem of an import: its code, the sentence shown, and the feature (0-based) it is about. */
export const importProblem = z.object({ code: importProblemCode, message: z.string(), index: z.number().int().min(0).optional() });
export type ImportProblem = z.infer<typeof importProblem>;

/** The `problems` a 422 `import_refused` carries beside its message. */
export const importProblems = z.array(importProblem);

const NAME_CODES: ReadonlySet<string> = new Set(FIELD_NAME_PROBLEM_CODES);
/** True for a problem of the name alone: saving the feature under another name clears it. */
export const isNameProblem = (code: ImportProblemCode): code is FieldNameProblemCode => NAME_CODES.has(code);

/**
 * Another field of the farm that a boundary overlaps (shared/geo/overlap: shared edges and slivers
 * left out): a warning beside a saved field or an import row, never a refusal.
 */
export const boundaryOverlap = z.object({
  fieldId: z.number().int(),
  name: z.string(),
  /** Overlap on the WGS84 ellipsoid, m². */
  areaM2: z.number(),
  acres: z.number(),
});
export type BoundaryOverlap = z.infer<typeof boundaryOverlap>;

export interface ImportedFeature {
  index: number;
  name: string;
  acres: number | null;
  geometry: unknown;
  properties: Record<string, unknown>;
  /** What is wrong with the feature, each with its code; empty when it can be saved as it is. */
  problems: ImportProblem[];
  /** The problems' messages, in the same order (kept for readers of the older answer). */
  errors: string[];
  /** The farm's fields this feature overlaps (a warning: it can still be saved). */
  overlaps?: BoundaryOverlap[];
}

/** An AB line found in imported ISO 11783-10 task data, offered as a plan's heading. */
export interface ImportGuidance {
  /** The feature (partfield) it belongs to. */
  index: number;
  fieldName: string;
  /** The guidance pattern's designator. */
  name: string;
  /** Degrees clockwise from true north, 0 ≤ h < 180, as a plan takes it. */
  headingDeg: number;
  /** The line's width (pass spacing), metres, when the file states it. */
  widthM: number | null;
}

export interface ImportPreview {
  format: 'geojson' | 'kml' | 'kmz' | 'shapefile' | 'taskdata';
  attributes: string[];
  nameAttribute: string | null;
  features: ImportedFeature[];
  /** ISO 11783-10 task data only: its AB lines. */
  guidance?: ImportGuidance[];
}

/** One crop plan of a field: the crop of a season. */
export const cropPlan = z.object({ season: z.number().int(), crop: z.string(), varietyNote: z.string().nullable() });
export type CropPlan = z.infer<typeof cropPlan>;

/** What the API keeps on each hazard feature of a field. */
export const fieldHazardProperties = z.object({
  id: z.number().int(),
  fieldId: z.number().int(),
  kind: z.string(),
  /** Clearance distance around the hazard, metres. */
  clearanceM: z.number(),
  note: z.string().nullable(),
  status: z.string(),
});
export type FieldHazardProperties = z.infer<typeof fieldHazardProperties>;

/** `GET /api/fields/:id` (also the answer to creating or changing a field). */
export const fieldDetail = z.object({
  id: z.number().int(),
  name: z.string(),
  acres: z.number(),
  hectares: z.number(),
  areaM2: z.number(),
  notes: z.string().nullable(),
  boundary: z.object({ type: z.enum(['Polygon', 'MultiPolygon']), coordinates: z.unknown() }),
  hazards: z.object({
    type: z.literal('FeatureCollection'),
    features: z.array(z.object({ type: z.literal('Feature'), id: z.number().int(), geometry, properties: fieldHazardProperties })),
  }),
  crop: z.string().nullable(),
  crops: z.array(cropPlan),
  updatedAt: z.string(),
  /** On the answer to creating a field or changing its boundary: the farm's fields it overlaps. */
  overlaps: z.array(boundaryOverlap).optional(),
});
/** The schema says the JSON; the GeoJSON parts are typed with the geojson types the map code uses. */
export type FieldDetail = Omit<z.infer<typeof fieldDetail>, 'boundary' | 'hazards'> & {
  boundary: Polygon | MultiPolygon;
  hazards: FeatureCollection<Geometry, FieldHazardProperties>;
};

/** `POST /api/fields/import` when fields were saved. */
export const importSaved = z.object({ saved: z.array(z.object({ id: z.number().int(), name: z.string(), acres: z.number() })) });
export type ImportSaved = z.infer<typeof importSaved>;
