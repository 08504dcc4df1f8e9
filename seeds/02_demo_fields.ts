// Fields of the fictional Tamarack Ridge Farm: invented boundaries laid on a half-mile grid near
// 47.6° N, 99.9° W, with a slough, a yard site with bins, a draw, a skewed road edge and hazards.
import type { Position } from 'geojson';
import { geodesicAreaM2 } from '../shared/geo/geodesic-area';
import { ACRE_M2 } from '../shared/units';
import type { DemoStep } from './steps';

const ORIGIN: Position = [-99.96, 47.56];
const HALF_MILE_LAT = 0.0072455; // ≈ 804.7 m north
const HALF_MILE_LON = 0.0107225; // ≈ 804.7 m east at 47.6° N

/** A position `x` half-miles east and `y` half-miles north of the origin. */
const at = (x: number, y: number): Position => [+(ORIGIN[0] + x * HALF_MILE_LON).toFixed(7), +(ORIGIN[1] + y * HALF_MILE_LAT).toFixed(7)];
const ring = (pts: Array<[number, number]>): Position[] => [...pts.map(([x, y]) => at(x, y)), at(pts[0][0], pts[0][1])];
const box = (x: number, y: number, w: number, h: number): Array<[number, number]> => [
  [x, y],
  [x + w, y],
  [x + w, y + h],
  [x, y + h],
];
/** Holes run clockwise (RFC 7946 right-hand rule). */
const hole = (pts: Array<[number, number]>) => ring(pts).reverse();
const blob = (cx: number, cy: number, r: number, n = 10): Array<[number, number]> =>
  Array.from({ length: n }, (_, i) => {
    const a = (2 * Math.PI * i) / n;
    const k = 1 + 0.25 * Math.sin(3 * a);
    return [cx + r * k * Math.cos(a), cy + r * 0.8 * k * Math.sin(a)];
  });

interface DemoHazard {
  kind: string;
  geometry: { type: 'Point' | 'LineString' | 'Polygon'; coordinates: unknown };
  clearanceM: number;
  note: string;
}

interface DemoField {
  name: string;
  rings: Position[][];
  /** A three-year rotation: the crop of season S is `rotation[S % 3]`. */
  rotation: [string, string, string];
  hazards?: DemoHazard[];
}

const point = (x: number, y: number) => ({ type: 'Point' as const, coordinates: at(x, y) });
const line = (...pts: Array<[number, number]>) => ({ type: 'LineString' as const, coordinates: pts.map(([x, y]) => at(x, y)) });
const area = (pts: Array<[number, number]>) => ({ type: 'Polygon' as const, coordinates: [ring(pts)] });

const FIELDS: DemoField[] = [
  {
    name: 'Home Quarter',
    rings: [ring(box(0, 0, 1, 1)), hole(box(0.05, 0.7, 0.22, 0.22))],
    rotation: ['canola', 'spring wheat', 'barley'],
    hazards: [
      { kind: 'bin', geometry: point(0.3, 0.8), clearanceM: 15, note: 'Four hopper bins and the auger east of the yard' },
      { kind: 'power', geometry: line([0, 0.6], [0.16, 0.7]), clearanceM: 10, note: 'Service line into the yard' },
    ],
  },
  {
    name: 'North Section',
    rings: [ring(box(0, 2, 2, 2)), hole(blob(1.2, 3.1, 0.18))],
    rotation: ['spring wheat', 'canola', 'durum'],
    hazards: [
      { kind: 'waterway', geometry: area(blob(1.2, 3.1, 0.26)), clearanceM: 5, note: 'Slough edge is soft in a wet spring' },
      { kind: 'rock', geometry: point(0.4, 2.5), clearanceM: 3, note: 'Large rock, marked with a flag' },
      { kind: 'power', geometry: line([0, 3.95], [2, 3.95]), clearanceM: 10, note: 'Transmission line along the north edge' },
    ],
  },
  {
    name: 'Slough Quarter',
    rings: [ring(box(2, 0, 1, 1)), hole(blob(2.5, 0.5, 0.15))],
    rotation: ['durum', 'field peas', 'spring wheat'],
    hazards: [{ kind: 'waterway', geometry: area(blob(2.5, 0.5, 0.2)), clearanceM: 5, note: 'Cattails; do not cut into the slough' }],
  },
  {
    name: 'Draw Half',
    rings: [ring(box(3, 0, 2, 1))],
    rotation: ['barley', 'durum', 'canola'],
    hazards: [
      {
        kind: 'draw',
        geometry: area([
          [3.7, 0],
          [3.85, 0],
          [4.1, 1],
          [3.95, 1],
        ]),
        clearanceM: 10,
        note: 'Steep draw crossing north–south: cross only at the culvert',
      },
      { kind: 'fence', geometry: line([5, 0], [5, 1]), clearanceM: 2, note: 'Pasture fence on the east edge' },
    ],
  },
  {
    name: 'Bin Site Eighty',
    rings: [ring(box(1, 0, 1, 0.5))],
    rotation: ['field peas', 'barley', 'spring wheat'],
    hazards: [{ kind: 'bin', geometry: point(1.9, 0.1), clearanceM: 15, note: 'Two bins on the road corner' }],
  },
  {
    name: 'Skewed Quarter',
    rings: [
      ring([
        [5, 0],
        [6, 0],
        [6, 1],
        [5.35, 1],
        [5, 0.65],
      ]),
    ],
    rotation: ['spring wheat', 'canola', 'field peas'],
    hazards: [{ kind: 'neighbour', geometry: line([5, 0.65], [5.35, 1]), clearanceM: 3, note: "Neighbour's edge along the angled road" }],
  },
  { name: 'Tamarack Flats', rings: [ring(box(2, 2, 2, 2))], rotation: ['canola', 'spring wheat', 'durum'] },
  {
    name: 'Schoolhouse Quarter',
    rings: [ring(box(4, 2, 1, 1))],
    rotation: ['durum', 'barley', 'canola'],
    hazards: [{ kind: 'power', geometry: point(4.5, 2.05), clearanceM: 8, note: 'Power pole with a guy wire' }],
  },
  {
    name: 'Rock Pile Quarter',
    rings: [ring(box(5, 2, 1, 1))],
    rotation: ['barley', 'field peas', 'spring wheat'],
    hazards: [
      { kind: 'rock', geometry: area(blob(5.5, 2.6, 0.05, 8)), clearanceM: 5, note: 'Rock pile' },
      { kind: 'rock', geometry: point(5.2, 2.3), clearanceM: 3, note: 'Rock' },
    ],
  },
  { name: 'East Half', rings: [ring(box(6, 0, 1, 2))], rotation: ['spring wheat', 'durum', 'canola'] },
  { name: 'South Section', rings: [ring(box(0, -3, 2, 2))], rotation: ['field peas', 'spring wheat', 'barley'] },
  {
    name: 'Coulee Section',
    rings: [ring(box(2, -3, 2, 2))],
    rotation: ['spring wheat', 'canola', 'durum'],
    hazards: [
      {
        kind: 'draw',
        geometry: line([2, -2.2], [2.8, -2.0], [3.4, -1.6], [4, -1.5]),
        clearanceM: 12,
        note: 'Coulee bank: steep, keep well off the break',
      },
    ],
  },
  { name: 'Railroad Eighty', rings: [ring(box(4, -1.5, 1, 0.5))], rotation: ['canola', 'barley', 'spring wheat'] },
  { name: 'West Half', rings: [ring(box(-1, 0, 1, 2))], rotation: ['barley', 'durum', 'field peas'] },
];

/** The crop a demo field grows in a season (its place in the field's rotation). */
export function demoCrop(fieldName: string, season: number): string {
  const f = FIELDS.find((x) => x.name === fieldName);
  if (!f) throw new Error(`${fieldName} is not a demo field`);
  return f.rotation[((season % 3) + 3) % 3];
}

/** The fields and their hazards; the crop plans come with the seasons' work (03_demo_fleet_crew.ts). */
export const seedDemoFields: DemoStep = async (tx, { farmId }) => {
  for (const f of FIELDS) {
    const boundary = { type: 'Polygon' as const, coordinates: f.rings };
    const areaM2 = geodesicAreaM2(boundary);
    const [row] = await tx('fields')
      .insert({ farm_id: farmId, name: f.name, boundary: JSON.stringify(boundary), area_m2: areaM2, acres: areaM2 / ACRE_M2 })
      .returning('id');
    for (const h of f.hazards ?? []) {
      await tx('hazards').insert({
        farm_id: farmId,
        field_id: row.id,
        kind: h.kind,
        geometry: JSON.stringify(h.geometry),
        clearance_m: h.clearanceM,
        note: h.note,
      });
    }
  }
};
