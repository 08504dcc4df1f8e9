let loading: Promise<unknown> | null = null;

/**
 * Loads the drawing and editing plugin (Leaflet-Geoman) on first use, so read-only maps never
 * download it. It hooks into maps created after it loads, so call this before creating the map.
 * The plugin extends the global `L` that Leaflet's bundle sets; every layer Furlong draws for
 * display passes `pmIgnore: true`, so only what the person draws can be edited.
 */
export function loadGeoman(): Promise<void> {
  loading ??= import('@geoman-io/leaflet-geoman-free');
  return loading.then(() => undefined);
}
