import { members, ownerOnly, type Case, type Ctx } from './types';

const planSettings = { widthM: 20, headingDeg: 0, headlandPasses: 1 };

/** A field with a saved harrowing plan. */
async function plannedField(c: Ctx): Promise<number> {
  const fieldId = await c.spareField();
  await c.t.db('pass_plans').insert({
    farm_id: c.farm.id,
    field_id: fieldId,
    operation: 'harrowing',
    width_m: 20,
    headland_passes: 1,
    heading_deg: 0,
    coverage: 'gaps-ok',
    speed_mps: 3.12928, // 7 mph
    efficiency: 0.85,
    turn_seconds: 20,
    summary: JSON.stringify({ passCount: 0 }),
  });
  return fieldId;
}

export const plans: Record<string, Case> = {
  'POST /api/plans/preview': { body: { widthM: 0 }, expect: members(400) },
  'GET /api/plans': { expect: members(200) },
  'GET /api/plans/:fieldId/:operation': { path: async (c) => `/api/plans/${await plannedField(c)}/harrowing`, expect: members(200, 404) },
  'GET /api/plans/:fieldId/:operation/passes.geojson': {
    path: async (c) => `/api/plans/${await plannedField(c)}/harrowing/passes.geojson`,
    expect: members(200, 404),
  },
  'PUT /api/plans/:fieldId/:operation': {
    path: async (c) => `/api/plans/${await c.spareField()}/harrowing`,
    body: planSettings,
    expect: ownerOnly(200, 404),
  },
  'DELETE /api/plans/:fieldId/:operation': {
    path: async (c) => `/api/plans/${await plannedField(c)}/harrowing`,
    expect: ownerOnly(204, 404),
  },
};
