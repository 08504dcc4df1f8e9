import { z } from 'zod';
import { textWithoutNul } from './common';

export const HAZARD_KINDS = ['bin', 'rock', 'power', 'draw', 'waterway', 'fence', 'neighbour', 'other'] as const;
export type HazardKind = (typeof HAZARD_KINDS)[number];

/** What each hazard kind is called on screen. */
export const HAZARD_LABELS: Record<HazardKind, string> = {
  bin: 'Bin or yard site',
  rock: 'Rock',
  power: 'Power pole or line',
  draw: 'Draw or steep break',
  waterway: 'Waterway',
  fence: 'Fence',
  neighbour: "Neighbour's edge",
  other: 'Other',
};

export const CROPS = ['spring wheat', 'durum', 'barley', 'oats', 'canola', 'field peas', 'lentils', 'flax', 'sunflowers', 'soybeans', 'corn', 'fallow'] as const;

// Without NUL here too: an import's list of names comes as a multipart form field, not through server/http/validate.
const fieldName = textWithoutNul('A field name').trim().min(1, 'Give the field a name').max(120, 'Use at most 120 characters');

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

export const cropPlanBody = z.object({
  crop: z.string().trim().min(1, 'Choose a crop').max(60),
  varietyNote: z.string().trim().max(200).optional().nullable(),
});

export const importQuery = z.object({
  dryRun: z.enum(['true', 'false']).optional(),
  nameAttribute: z.string().max(80).optional(),
});

/** The owner's choices in an import: which features to save, under which names. */
export const importSelection = z.array(z.object({ index: z.number().int().min(0), name: fieldName })).min(1, 'Tick at least one field to save');

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

export interface ImportedFeature {
  index: number;
  name: string;
  acres: number | null;
  geometry: unknown;
  properties: Record<string, unknown>;
  errors: string[];
}

export interface ImportPreview {
  format: 'geojson' | 'kml' | 'kmz' | 'shapefile';
  attributes: string[];
  nameAttribute: string | null;
  features: ImportedFeature[];
}
