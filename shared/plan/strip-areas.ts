import type { PlanarRegion } from './planar-region';

/**
 * Area of a region on the left of each of several lines across a heading, m²: for each c in `cuts`,
 * the area of { p in region : p·r ≤ c } with r = (cos h, −sin h) the right-hand normal of the
 * heading. Each ring is clipped to the half-plane with Sutherland–Hodgman (I. E. Sutherland and
 * G. W. Hodgman, "Reentrant polygon clipping", CACM 17(1), 1974) and its clipped area summed by the
 * shoelace formula without storing the clipped ring. Holes run clockwise, so they subtract. A half-plane
 * clip of a non-convex ring may add zero-width slivers along the cut; they carry no area.
 *
 * The area of the region inside a strip c₁ < u ≤ c₂ is then F(c₂) − F(c₁): no polygon union needed.
 *
 * @param region packed region (metres; outer rings counter-clockwise, holes clockwise)
 * @param cos cos of the heading
 * @param sin sin of the heading
 * @param cuts offsets across the heading, metres
 * @returns F(c) for each cut, m²
 * @example areasLeftOf(square100m, 1, 0, Float64Array.of(-50, 0, 50)) // [0, 5000, 10000] for a square centred on 0
 */
export function areasLeftOf(region: PlanarRegion, cos: number, sin: number, cuts: Float64Array): Float64Array {
  const { xs, ys, ringStart } = region;
  const n = xs.length;
  const u = new Float64Array(n);
  const t = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    u[i] = xs[i] * cos - ys[i] * sin;
    t[i] = xs[i] * sin + ys[i] * cos;
  }
  const out = new Float64Array(cuts.length);
  for (let q = 0; q < cuts.length; q++) {
    const c = cuts[q];
    let area2 = 0;
    for (let r = 0; r + 1 < ringStart.length; r++) {
      const s = ringStart[r],
        e = ringStart[r + 1];
      let started = false;
      let fu = 0,
        ft = 0,
        pu = 0,
        pt = 0;
      const emit = (eu: number, et: number): void => {
        if (!started) {
          fu = eu;
          ft = et;
          started = true;
        } else area2 += pu * et - eu * pt;
        pu = eu;
        pt = et;
      };
      for (let i = s, j = e - 1; i < e; j = i++) {
        const aIn = u[j] <= c,
          bIn = u[i] <= c;
        if (aIn !== bIn) emit(c, t[j] + ((c - u[j]) * (t[i] - t[j])) / (u[i] - u[j]));
        if (bIn) emit(u[i], t[i]);
      }
      if (started) area2 += pu * ft - fu * pt;
    }
    out[q] = area2 / 2;
  }
  return out;
}
