/**
 * Total length of the headland laps, metres. Lap i (0-based) is driven with the implement's centre
 * (i + ½) widths in from the boundary. The perimeter of a polygon offset inward by d with round
 * joins is linear in d, L(d) = L(0) − d·(Σ 2 tan(θ/2) over convex corners − Σ θ over reflex
 * corners), as long as no edge of the offset shrinks to nothing; so lap lengths follow from the
 * boundary perimeter L(0) and the interior perimeter L(H), H = laps × width, without one polygon
 * offset per lap. Where offsets change shape (narrow necks), this is an estimate.
 *
 * With the laps at (i + ½)·H/laps, their mean is the midpoint: total = laps × (L(0) + L(H)) / 2.
 *
 * @param boundaryPerimeterM perimeter of the field (all rings), metres
 * @param interiorPerimeterM perimeter of the interior inside the headland (all rings), metres
 * @param laps number of headland passes
 * @returns Σ lap lengths, metres
 * @example headlandLapsM(3218.688, 2926.08, 2) // 6144.768 for a 160-acre square and 2 × 60 ft laps
 */
export function headlandLapsM(boundaryPerimeterM: number, interiorPerimeterM: number, laps: number): number {
  return laps > 0 ? (laps * (boundaryPerimeterM + interiorPerimeterM)) / 2 : 0;
}
