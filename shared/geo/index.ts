export { fieldAcres, geodesicAreaM2, geodesicPerimeterM } from './geodesic-area';
export { assertBoundary, checkBoundary, type BoundaryProblem, type BoundaryProblemCode } from './boundary-check';
export { localProjection, projectionForField, type LocalProjection } from './local-projection';
export { formatLatLon } from './format-position';
