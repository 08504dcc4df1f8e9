/**
 * A lon/lat position as a farmer reads it: "47.61234° N, 99.91234° W" (5 decimals ≈ 1 m).
 *
 * @param lon longitude in degrees (east positive)
 * @param lat latitude in degrees (north positive)
 * @example formatLatLon(-99.91234, 47.61234) // '47.61234° N, 99.91234° W'
 */
export function formatLatLon(lon: number, lat: number): string {
  const ns = lat >= 0 ? 'N' : 'S';
  const ew = lon >= 0 ? 'E' : 'W';
  return `${Math.abs(lat).toFixed(5)}° ${ns}, ${Math.abs(lon).toFixed(5)}° ${ew}`;
}
