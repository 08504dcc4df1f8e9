// Hand-made plans for the specs (jsdom specs do not run the planner itself).
import type { PlanResult } from '@shared/plan/types';
import { mphToMps } from '@shared/units';
import type { Polygon } from 'geojson';
import type { SavedPlanWithResult, PlanField } from './pass-plan-api';

export const SQUARE: Polygon = {
  type: 'Polygon',
  coordinates: [
    [
      [-99.9, 47.6],
      [-99.89, 47.6],
      [-99.89, 47.61],
      [-99.9, 47.61],
      [-99.9, 47.6],
    ],
  ],
};

export const FIELD: PlanField = {
  id: 7,
  name: 'Home Quarter',
  acres: 160,
  boundary: SQUARE,
  hazards: {
    type: 'FeatureCollection',
    features: [
      {
        type: 'Feature',
        geometry: { type: 'Point', coordinates: [-99.895, 47.605] },
        properties: { id: 3, fieldId: 7, kind: 'bin', clearanceM: 15, note: null, status: 'confirmed' },
      },
    ],
  },
};

export function planResult(change: Partial<PlanResult> = {}): PlanResult {
  return {
    fieldAcres: 159.6,
    headlandAcres: 12.3,
    interiorAcres: 147.3,
    workRegionAcres: 146.9,
    workedAcres: 146.1,
    unworkedAcres: 0.8,
    overlapAcres: 0,
    headingDeg: 90,
    headingCandidates: [
      { headingDeg: 90, passCount: 31, segmentCount: 31, turns: 30, passLengthM: 24_000, hours: 2.75, alongEdge: true },
      { headingDeg: 0, passCount: 33, segmentCount: 33, turns: 32, passLengthM: 24_100, hours: 2.8, alongEdge: true },
      { headingDeg: 84.5, passCount: 36, segmentCount: 36, turns: 35, passLengthM: 23_900, hours: 2.74, alongEdge: false },
    ],
    edgeMarginPct: 3,
    passCount: 31,
    segmentCount: 31,
    turns: 30,
    passLengthM: 24_000,
    headlandLengthM: 3_200,
    totalDistanceM: 27_200,
    hours: 2.75,
    capacityHours: 3.1,
    capacityAcresPerHour: 51.5,
    capacityHaPerHour: 20.8,
    widthM: 25.6032,
    speedMps: mphToMps(7),
    efficiency: 0.85,
    turnSeconds: 20,
    headlandPasses: 2,
    coverage: 'gaps-ok',
    headland: SQUARE,
    workRegion: SQUARE,
    hazardZones: null,
    passes: {
      type: 'FeatureCollection',
      features: [1, 2, 3].map((pass) => ({
        type: 'Feature',
        geometry: {
          type: 'LineString',
          coordinates: [
            [-99.9, 47.6 + pass * 0.001],
            [-99.89, 47.6 + pass * 0.001],
          ],
        },
        properties: { pass, segment: 1, headingDeg: 90, lengthM: 750 },
      })),
    },
    unworked: { type: 'FeatureCollection', features: [] },
    overlap: { type: 'FeatureCollection', features: [] },
    warnings: [],
    ...change,
  };
}

export function savedPlan(change: Partial<SavedPlanWithResult> = {}): SavedPlanWithResult {
  const result = planResult();
  const { headland: _h, workRegion: _w, hazardZones: _z, passes: _p, unworked: _u, overlap: _o, ...summary } = result;
  return {
    id: 1,
    fieldId: 7,
    fieldName: 'Home Quarter',
    operation: 'harrowing',
    implementId: null,
    implementName: null,
    implementWidthM: null,
    widthM: 25.6032,
    headlandPasses: 2,
    headingDeg: 90,
    coverage: 'gaps-ok',
    speedMps: mphToMps(7),
    efficiency: 0.85,
    turnSeconds: 20,
    summary,
    updatedAt: '2026-04-20T12:00:00Z',
    result,
    ...change,
  };
}
