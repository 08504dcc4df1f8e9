// The field the track-coverage tests drive over: a 200 m × 300 m rectangle centred at 47.6° N,
// 99.9° W (drawn in a local projection around its centre), and the field's own projection, in which
// the tests lay out their passes in metres (x across the field, y along it).
import { localProjection, projectionForField } from '../../shared/geo/local-projection';

const centre = localProjection([-99.9, 47.6]);
const ring = [
  [-100, -150],
  [100, -150],
  [100, 150],
  [-100, 150],
  [-100, -150],
].map((p) => centre.inverse(p));

export const trackField = { type: 'Polygon' as const, coordinates: [ring] };
export const trackFieldProjection = projectionForField(trackField);
