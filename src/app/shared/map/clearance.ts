/** Web Mercator ground resolution at the equator for zoom 0, metres per pixel (256-pixel tiles). */
const EQUATOR_M_PER_PX_Z0 = 40_075_016.686 / 256;

/**
 * Metres covered by one screen pixel at a latitude and zoom on a Web Mercator map.
 * @param latDeg latitude, degrees
 * @param zoom Leaflet zoom level
 * @example metresPerPixel(0, 0) // ≈ 156_543.03
 */
export function metresPerPixel(latDeg: number, zoom: number): number {
  return (EQUATOR_M_PER_PX_Z0 * Math.cos((latDeg * Math.PI) / 180)) / 2 ** zoom;
}

/**
 * Stroke width in pixels that draws a band reaching `clearanceM` either side of a line, so a
 * round-capped stroke is the line's clearance buffer as seen on screen.
 * @param clearanceM clearance either side, metres
 * @param latDeg latitude of the hazard, degrees
 * @param zoom Leaflet zoom level
 */
export function clearanceStrokePx(clearanceM: number, latDeg: number, zoom: number): number {
  return (2 * clearanceM) / metresPerPixel(latDeg, zoom);
}
