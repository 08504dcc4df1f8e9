// Writer packages used only by the tests to make fixtures; they ship no types.
declare module 'tokml' {
  const tokml: (geojson: object, options?: { name?: string; description?: string }) => string;
  export default tokml;
}
declare module '@mapbox/shp-write' {
  const shpwrite: { zip: (geojson: object, options?: object) => Promise<unknown> };
  export default shpwrite;
}
