import type { Polygon } from 'geojson';

const LAT0 = 47.6;
const LON0 = -99.9;
const M_LAT = 1 / 111_200;
const M_LON = 1 / (111_200 * Math.cos((LAT0 * Math.PI) / 180));

/**
 * A comb-shaped boundary about `sideM` metres square: a strip along the south edge with `teeth`
 * thin teeth reaching north (4·teeth + 4 positions). Edges of the teeth overlap each other in
 * every direction a sweep might take, the worst shape for crossing checks and headland offsets.
 */
export function combBoundary(teeth: number, sideM = 1609): Polygon {
  const toothM = sideM / (2 * teeth);
  const x = (m: number) => LON0 + m * M_LON;
  const y = (m: number) => LAT0 + m * M_LAT;
  const ring: number[][] = [
    [x(0), y(0)],
    [x(sideM), y(0)],
  ];
  for (let i = teeth - 1; i >= 0; i--) {
    ring.push([x((2 * i + 2) * toothM), y(sideM)], [x((2 * i + 1) * toothM), y(sideM)]);
    ring.push([x((2 * i + 1) * toothM), y(0.1 * sideM)], [x(2 * i * toothM), y(0.1 * sideM)]);
  }
  ring.pop();
  ring.push([x(0), y(sideM)], [x(0), y(0)]);
  return { type: 'Polygon', coordinates: [ring] };
}

/** A plain square field `sideM` metres on a side. */
export function squareBoundary(sideM = 1609): Polygon {
  const x = (m: number) => LON0 + m * M_LON;
  const y = (m: number) => LAT0 + m * M_LAT;
  return {
    type: 'Polygon',
    coordinates: [
      [
        [x(0), y(0)],
        [x(sideM), y(0)],
        [x(sideM), y(sideM)],
        [x(0), y(sideM)],
        [x(0), y(0)],
      ],
    ],
  };
}
