import { rect } from '../../support/geo-fixtures';
import { members, ownerOnly, type Case, type Ctx } from './types';

const hazard = async (c: Ctx) => {
  const fieldId = await c.spareField();
  const [h] = await c.t
    .db('hazards')
    .insert({
      farm_id: c.farm.id,
      field_id: fieldId,
      kind: 'rock',
      geometry: JSON.stringify({ type: 'Point', coordinates: [-99.9, 47.6] }),
      clearance_m: 2,
    })
    .returning('id');
  return `/api/fields/${fieldId}/hazards/${h.id}`;
};

export const fields: Record<string, Case> = {
  'GET /api/fields': { expect: members(200) },
  'GET /api/fields/export.geojson': { expect: members(200) },
  'POST /api/fields': { body: {}, expect: ownerOnly(400) },
  'POST /api/fields/import': { expect: ownerOnly(400) },
  'GET /api/fields/:id': { path: async (c) => `/api/fields/${await c.spareField()}`, expect: members(200, 404) },
  'PATCH /api/fields/:id': {
    path: async (c) => `/api/fields/${await c.spareField()}`,
    body: { notes: 'checked' },
    expect: ownerOnly(200, 404),
  },
  'DELETE /api/fields/:id': { path: async (c) => `/api/fields/${await c.spareField()}`, expect: ownerOnly(204, 404) },
  'POST /api/fields/:id/hazards': {
    path: async (c) => `/api/fields/${await c.spareField()}/hazards`,
    body: { kind: 'rock', geometry: { type: 'Point', coordinates: [-99.9, 47.6] }, clearanceM: 3 },
    expect: ownerOnly(201, 404),
  },
  'PATCH /api/fields/:id/hazards/:hazardId': { path: hazard, body: { clearanceM: 4 }, expect: ownerOnly(200, 404) },
  'DELETE /api/fields/:id/hazards/:hazardId': { path: hazard, expect: ownerOnly(204, 404) },
  'PUT /api/fields/:id/crops/:season': {
    path: async (c) => `/api/fields/${await c.spareField()}/crops/2026`,
    body: { crop: 'barley' },
    expect: ownerOnly(200, 404),
  },
  'DELETE /api/fields/:id/crops/:season': {
    path: async (c) => `/api/fields/${await c.spareField()}/crops/2026`,
    expect: ownerOnly(204, 404),
  },
  'GET /api/crop-plans/:season': { path: () => '/api/crop-plans/2026', expect: members(200) },
  'POST /api/crop-plans/:season/copy': { path: () => '/api/crop-plans/2026/copy', body: { from: 2025 }, expect: ownerOnly(200) },
};

/** A new small field on the farm under test. */
export async function spareField(c: Pick<Ctx, 't' | 'farm'>): Promise<number> {
  const n = Math.floor(Math.random() * 1e9);
  const boundary = rect(-99.9 + (n % 1000) * 1e-4, 47.6, 0.001, 0.001);
  const [row] = await c.t
    .db('fields')
    .insert({ farm_id: c.farm.id, name: `Spare ${n}`, boundary: JSON.stringify(boundary), area_m2: 1, acres: 1 })
    .returning('id');
  return row.id;
}
