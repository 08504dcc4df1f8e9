export { fieldAcres, fieldArea, geodesicAreaM2, geodesicPerimeterM, type FieldArea } from './geodesic-area';
export {
  assertBoundary,
  BOUNDARY_PROBLEM_CODES,
  checkAndMeasureBoundary,
  checkBoundary,
  type BoundaryMeasurement,
  type BoundaryProblem,
  type BoundaryProblemCode,
} from './boundary-check';
export { localProjection, projectionForField, type LocalProjection } from './local-projection';
export { formatLatLon } from './format-position';
