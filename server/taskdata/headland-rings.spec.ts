import type { MultiPolygon, Polygon, Position } from 'geojson';
import { difference, offset, readJsts, writePolygonal } from '../../shared/plan/jsts-ops';
import { headlandFromRings, planeArea } from './headland-rings';

// Reference: the JTS Topology Suite's overlay (jsts), field minus interior, on the same rings.
const square = (x: number, y: number, s: number, ccw = true): Position[] => {
  const r = [
    [x, y],
    [x + s, y],
    [x + s, y + s],
    [x, y + s],
    [x, y],
  ];
  return ccw ? r : r.reverse();
};

function both(field: Polygon | MultiPolygon, inwardM: number) {
  const fieldJ = readJsts(field);
  const interiorJ = offset(fieldJ, -inwardM);
  return { mine: headlandFromRings(field, writePolygonal(interiorJ)), jts: writePolygonal(difference(fieldJ, interiorJ))! };
}

const polygonsOf = (g: Polygon | MultiPolygon) => (g.type === 'Polygon' ? [g.coordinates] : g.coordinates);

describe('headlandFromRings', () => {
  it('when a field has a hole, then the headland is the ring round the edge and the ring round the hole, as the JTS overlay finds', () => {
    const field: Polygon = { type: 'Polygon', coordinates: [square(0, 0, 800), square(300, 300, 100, false)] };
    const { mine, jts } = both(field, 36.576);
    expect(mine).not.toBeNull();
    expect(polygonsOf(mine!).map((p) => p.length)).toEqual(polygonsOf(jts).map((p) => p.length));
    expect(planeArea(mine!)).toBeCloseTo(planeArea(jts), 3);
    // Checked by hand: 800² − 726.848² outside, plus the round-cornered band round the hole (JTS, 16 segments a quarter).
    expect(planeArea(mine!)).toBeGreaterThan(800 * 800 - 726.848 * 726.848);
  });

  it('when a field has two parts and one is too narrow to keep an interior, then that part is headland whole', () => {
    const field: MultiPolygon = { type: 'MultiPolygon', coordinates: [[square(0, 0, 500)], [square(1000, 0, 50)]] };
    const { mine, jts } = both(field, 36.576);
    expect(polygonsOf(mine!)).toHaveLength(2);
    expect(planeArea(mine!)).toBeCloseTo(planeArea(jts), 3);
  });

  it('when the interior vanishes, then the headland is the whole field', () => {
    const field: Polygon = { type: 'Polygon', coordinates: [square(0, 0, 60)] };
    const mine = headlandFromRings(field, null);
    expect(planeArea(mine!)).toBeCloseTo(3600, 6);
  });

  it('when the rings do not nest as an inward offset does (an interior ring outside the field), then it answers null for the overlay to do', () => {
    const field: Polygon = { type: 'Polygon', coordinates: [square(0, 0, 100)] };
    const bad: Polygon = { type: 'Polygon', coordinates: [square(200, 0, 50)] };
    expect(headlandFromRings(field, bad)).toBeNull();
  });
});
