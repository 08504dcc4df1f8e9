// Test support only (imported by *.spec.ts): loads the fictional fixture fields and builds their
// work region the way planPasses does, so specs can compare the clipper with a reference.
import type { FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import { projectionForField, type LocalProjection } from '../geo/local-projection';
import { difference, hazardZones, offset, readJsts, writePolygonal } from './jsts-ops';
import { packRegion, type PlanarRegion } from './planar-region';

/* eslint-disable @typescript-eslint/no-explicit-any */

export interface FixtureRegion {
  boundary: Polygon | MultiPolygon;
  hazards: FeatureCollection;
  proj: LocalProjection;
  regionJ: any;
  region: PlanarRegion;
}

/** Boundary and hazards of a fixture field, and its work region inside `headlandM`. */
export function fixtureRegion(boundaryJson: string, hazardsJson: string, headlandM: number): FixtureRegion {
  const boundary = (JSON.parse(boundaryJson) as FeatureCollection).features[0].geometry as Polygon;
  const hazards = JSON.parse(hazardsJson) as FeatureCollection;
  const proj = projectionForField(boundary);
  const interior = offset(readJsts(proj.forwardGeometry(boundary)), -headlandM);
  const zones = hazardZones({ ...hazards, features: hazards.features.map((f) => ({ ...f, geometry: proj.forwardGeometry(f.geometry!) })) });
  const regionJ = zones ? difference(interior, zones) : interior;
  return { boundary, hazards, proj, regionJ, region: packRegion(writePolygonal(regionJ)!) };
}
