import type { Position } from 'geojson';
import { offset, readJsts, writePolygonal } from '../../shared/plan/jsts-ops';
import { pointZone } from './point-zone';

// Reference: the JTS Topology Suite's buffer of a point (jsts), with the planner's buffer settings.
describe('pointZone', () => {
  it('when a point is given a clearance, then its zone has the same vertices as the JTS buffer of the point', () => {
    const p: Position = [1234.5, -678.25];
    const mine = pointZone(p, 15).coordinates[0];
    const jts = (writePolygonal(offset(readJsts({ type: 'Point', coordinates: p }), 15)) as { coordinates: Position[][] }).coordinates[0];
    expect(mine).toHaveLength(jts.length);
    const key = (q: Position) => `${q[0].toFixed(6)},${q[1].toFixed(6)}`;
    expect(new Set(mine.map(key))).toEqual(new Set(jts.map(key)));
  });
});
