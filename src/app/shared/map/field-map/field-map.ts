import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  type ElementRef,
  ViewEncapsulation,
  afterNextRender,
  effect,
  inject,
  input,
  output,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { HAZARD_LABELS, type HazardKind } from '@shared/schemas/fields';
import type { Feature, Geometry, Position } from 'geojson';
import * as L from 'leaflet';
import { Units } from '../../units/units';
import { clearanceStrokePx } from '../clearance';
import { loadGeoman } from '../geoman';
import { hazardDash, hazardSvg } from '../hazard-symbols';
import { MapConfig } from '../map-config';
import type { HazardFeature, MapField, MapLayer } from '../map-types';

/** Where an empty map looks before anything is drawn: the northern plains at region scale. */
const EMPTY_VIEW = { center: L.latLng(47, -98), zoom: 5 };
const FIT_PADDING = L.point(28, 28);
/** Where a field name may sit, in pixels from the field's centre: on it, else just above or below. */
const LABEL_SHIFTS_PX = [0, -26, 26, -52, 52];

interface Band {
  layer: L.Path;
  lat: number;
  clearanceM: number;
}

/**
 * The map every Furlong screen shares: field outlines with their names, hazards with their own
 * symbols and clearance zones, and any extra GeoJSON layers. Works with no tile layer (outlines on
 * a plain background); a tile URL comes from `GET /api/config` when one is configured.
 * With `editable`, the drawing plugin is loaded first so the map can be drawn on through `ready`.
 */
@Component({
  selector: 'app-field-map',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './field-map.html',
  styleUrl: './field-map.scss',
  // Leaflet builds its own DOM; these styles must reach it.
  encapsulation: ViewEncapsulation.None,
  host: { class: 'field-map' },
})
export class FieldMap {
  private readonly config = inject(MapConfig);
  private readonly units = inject(Units);

  readonly fields = input<readonly MapField[]>([]);
  readonly hazards = input<readonly HazardFeature[]>([]);
  readonly layers = input<readonly MapLayer[]>([]);
  readonly selectedId = input<number | null>(null);
  /** The map's accessible name. */
  readonly label = input('Map of the fields');
  /** Outlines and hazards answer clicks (off while drawing, so clicks reach the drawing tool). */
  readonly selectable = input(true);
  /** Loads the drawing plugin before the map is made. */
  readonly editable = input(false);
  /**
   * A point being marked, [lon, lat] (a hazard an operator is reporting): drawn above the outlines,
   * and, like every hazard symbol, never under a field's name (the name moves off it).
   */
  readonly mark = input<readonly [number, number] | null>(null);

  readonly fieldSelected = output<number>();
  readonly hazardSelected = output<number>();
  /** The Leaflet map, once made: for screens that draw on it or add their own layers. */
  readonly ready = output<L.Map>();

  private readonly canvas = viewChild.required<ElementRef<HTMLDivElement>>('canvas');
  private readonly map = signal<L.Map | null>(null);
  private readonly zones = L.featureGroup([], { pmIgnore: true });
  private readonly outlines = L.featureGroup([], { pmIgnore: true });
  private readonly extras = L.featureGroup([], { pmIgnore: true });
  private readonly hazardShapes = L.featureGroup([], { pmIgnore: true });
  private bands: Band[] = [];
  private markLayer: L.CircleMarker | null = null;
  /** Field labels opened by hovering, to close again when the pointer leaves. */
  private readonly hoverOpened = new Set<L.GeoJSON>();
  private fittedKey = '';
  /** The last fit was made while the map had no width or height. */
  private fittedBlind = false;
  private destroyed = false;

  constructor() {
    const destroyRef = inject(DestroyRef);
    afterNextRender(() => void this.create());
    destroyRef.onDestroy(() => {
      this.destroyed = true;
      this.map()?.remove();
    });

    effect(() => {
      const map = this.map();
      if (!map) return;
      this.drawFields(this.fields(), this.selectedId(), this.selectable());
      untracked(() => {
        this.fitIfChanged();
        this.declutterLabels(map);
      });
    });
    effect(() => {
      const map = this.map();
      if (!map) return;
      this.drawHazards(map, this.hazards(), this.selectable());
      untracked(() => {
        this.fitIfChanged();
        this.declutterLabels(map);
      });
    });
    effect(() => {
      const map = this.map();
      if (!map) return;
      const at = this.mark();
      this.markLayer?.remove();
      this.markLayer = at
        ? L.circleMarker([at[1], at[0]], {
            radius: 9,
            weight: 3,
            className: 'fm-mark',
            interactive: false,
            pmIgnore: true,
          } as L.CircleMarkerOptions).addTo(map)
        : null;
      untracked(() => this.declutterLabels(map));
    });
    effect(() => {
      if (!this.map()) return;
      this.drawExtras(this.layers());
      untracked(() => this.fitIfChanged());
    });
  }

  /** Fits the view to everything drawn (outlines, hazards, extra layers). */
  fit(): void {
    const map = this.map();
    const bounds = this.contentBounds();
    if (!map || !bounds) return;
    map.fitBounds(bounds, { padding: FIT_PADDING, maxZoom: 17 });
    this.fittedBlind = isEmptySize(map.getSize());
  }

  private async create(): Promise<void> {
    if (this.editable()) await loadGeoman();
    if (this.destroyed) return;
    L.Icon.Default.imagePath = '/leaflet/';
    const map = L.map(this.canvas().nativeElement, {
      center: EMPTY_VIEW.center,
      zoom: EMPTY_VIEW.zoom,
      zoomSnap: 0.25,
      attributionControl: false,
    });
    map.createPane('fm-zones').style.zIndex = '350';
    const us = this.units.system() === 'us';
    L.control.scale({ imperial: us, metric: !us, position: 'bottomleft', maxWidth: 120 }).addTo(map);
    this.zones.addTo(map);
    this.outlines.addTo(map);
    this.extras.addTo(map);
    this.hazardShapes.addTo(map);
    map.on('zoomend', () => {
      this.sizeBands(map);
      this.declutterLabels(map);
    });
    if (typeof ResizeObserver !== 'undefined') {
      const observer = new ResizeObserver(() => {
        map.invalidateSize();
        // A fit made while the map had no size (laid out hidden, or before its grid settled) picked a
        // region-wide zoom: fit again once it has one.
        if (this.fittedBlind && !isEmptySize(map.getSize())) this.fit();
      });
      observer.observe(this.canvas().nativeElement);
      map.on('unload', () => observer.disconnect());
    }
    // Enter finishes the shape being drawn; Escape leaves the drawing mode.
    if (map.pm) map.pm.setGlobalOptions({ finishOnEnter: true, exitModeOnEscape: true });
    this.map.set(map);
    this.ready.emit(map);
    void this.addTiles(map);
  }

  private async addTiles(map: L.Map): Promise<void> {
    const { mapTileUrl, mapTileAttribution } = await this.config.tiles();
    if (!mapTileUrl || this.destroyed) return;
    L.control.attribution({ prefix: false }).addTo(map);
    L.tileLayer(mapTileUrl, { attribution: mapTileAttribution ?? '', maxZoom: 20, pmIgnore: true })
      .addTo(map)
      .bringToBack();
  }

  private drawFields(fields: readonly MapField[], selectedId: number | null, selectable: boolean): void {
    this.outlines.clearLayers();
    for (const field of fields) {
      const classes = [
        'fm-field',
        field.muted ? 'fm-muted' : '',
        field.id === selectedId ? 'fm-selected' : '',
        field.colour ? 'fm-coloured' : '',
      ]
        .filter(Boolean)
        .join(' ');
      const layer = L.geoJSON(field.boundary, {
        pmIgnore: true,
        interactive: selectable,
        style: { className: classes, weight: field.id === selectedId ? 3 : 2 },
      } as L.GeoJSONOptions);
      layer.bindTooltip(textLabel(field.name), { permanent: true, direction: 'center', className: 'fm-label', opacity: 1 });
      if (selectable) {
        layer.on('click', () => this.fieldSelected.emit(field.id));
        layer.on('mouseover', () => this.hover(layer, true));
        layer.on('mouseout', () => this.hover(layer, false));
      }
      this.outlines.addLayer(layer);
      // The fill goes in through a custom property: the theme's CSS (which outranks SVG attributes) reads it.
      for (const path of pathsOf(layer)) {
        if (field.colour) path.style.setProperty('--fm-colour', field.colour);
        // Which field a shape is, for screens and tests that read the drawn map.
        path.dataset['fieldId'] = String(field.id);
      }
    }
  }

  /**
   * Hovering a field lifts it and outlines it strongly, and shows its name even when the name was
   * hidden to keep a zoomed-out farm readable (declutterLabels); leaving hides that name again.
   */
  private hover(layer: L.GeoJSON, on: boolean): void {
    for (const path of pathsOf(layer)) path.classList.toggle('fm-hover', on);
    const tip = layer.getTooltip();
    if (on) {
      layer.bringToFront();
      if (tip && !layer.isTooltipOpen()) {
        this.hoverOpened.add(layer);
        layer.openTooltip();
      }
      tip?.getElement()?.classList.add('fm-label-hover');
    } else {
      tip?.getElement()?.classList.remove('fm-label-hover');
      if (this.hoverOpened.delete(layer)) layer.closeTooltip();
    }
  }

  private drawHazards(map: L.Map, hazards: readonly HazardFeature[], selectable: boolean): void {
    this.zones.clearLayers();
    this.hazardShapes.clearLayers();
    this.bands = [];
    for (const hazard of hazards) {
      const { clearanceM, id } = hazard.properties;
      // The kind goes into class names and the symbol's markup: only a known kind, never the raw text.
      const kind: HazardKind = hazard.properties.kind in HAZARD_LABELS ? (hazard.properties.kind as HazardKind) : 'other';
      const name = `${HAZARD_LABELS[kind]}, clearance ${this.units.length(clearanceM)}`;
      const zoneStyle = { pane: 'fm-zones', className: 'fm-zone', interactive: false, pmIgnore: true };
      const at = anchorOf(hazard.geometry);
      if (!at) continue;
      for (const part of partsOf(hazard.geometry)) {
        if (part.type === 'Point') {
          if (clearanceM > 0) this.zones.addLayer(L.circle(latLng(part.coordinates), { ...zoneStyle, radius: clearanceM, weight: 1 }));
          continue;
        }
        const latlngs = part.type === 'LineString' ? part.coordinates.map(latLng) : part.coordinates.map((ring) => ring.map(latLng));
        const lat = at[1];
        if (clearanceM > 0) {
          const band =
            part.type === 'LineString'
              ? L.polyline(latlngs as L.LatLng[], { ...zoneStyle, lineCap: 'round', lineJoin: 'round' })
              : L.polygon(latlngs as L.LatLng[][], { ...zoneStyle, lineCap: 'round', lineJoin: 'round' });
          this.zones.addLayer(band);
          this.bands.push({ layer: band, lat, clearanceM });
        }
        const shapeStyle = {
          className: `fm-hz-shape fm-hz-${kind}`,
          dashArray: hazardDash(kind),
          weight: 3,
          interactive: false,
          pmIgnore: true,
        };
        this.hazardShapes.addLayer(
          part.type === 'LineString' ? L.polyline(latlngs as L.LatLng[], shapeStyle) : L.polygon(latlngs as L.LatLng[][], shapeStyle),
        );
      }
      const marker = L.marker(latLng(at), {
        icon: L.divIcon({ html: hazardSvg(kind), className: 'fm-hazard', iconSize: [24, 24], iconAnchor: [12, 12] }),
        title: name,
        alt: name,
        keyboard: selectable,
        interactive: selectable,
        pmIgnore: true,
      });
      if (selectable) marker.on('click', () => this.hazardSelected.emit(id));
      this.hazardShapes.addLayer(marker);
    }
    this.sizeBands(map);
  }

  private drawExtras(layers: readonly MapLayer[]): void {
    this.extras.clearLayers();
    for (const spec of layers) {
      const layer = L.geoJSON(spec.data, { pmIgnore: true, interactive: !!spec.tooltip, style: spec.style } as L.GeoJSONOptions);
      if (spec.tooltip) {
        const tip = spec.tooltip;
        layer.eachLayer((child) => {
          const text = tip((child as L.Layer & { feature?: Feature }).feature as Feature);
          if (text) child.bindTooltip(textLabel(text), { sticky: true });
        });
      }
      this.extras.addLayer(layer);
    }
  }

  /**
   * Shows field names largest field first and hides a name that would cover one already shown,
   * so a zoomed-out farm stays readable; zooming in brings the hidden names back. A name never
   * sits on a hazard marker: it moves above or below the marker (a hazard reported in the middle
   * of a small field would otherwise hide under the field's name).
   */
  private declutterLabels(map: L.Map): void {
    const placed: L.Bounds[] = [];
    const markers = [
      ...this.hazardShapes.getLayers().filter((layer): layer is L.Marker => layer instanceof L.Marker),
      ...(this.markLayer ? [this.markLayer] : []),
    ].map((marker) => {
      const p = map.latLngToLayerPoint(marker.getLatLng());
      return L.bounds(L.point(p.x - 13, p.y - 13), L.point(p.x + 13, p.y + 13));
    });
    const labelled = (this.outlines.getLayers() as L.GeoJSON[])
      .map((layer) => {
        const bounds = layer.getBounds();
        if (!bounds.isValid()) return null;
        const ne = map.latLngToLayerPoint(bounds.getNorthEast());
        const sw = map.latLngToLayerPoint(bounds.getSouthWest());
        return { layer, centre: map.latLngToLayerPoint(bounds.getCenter()), size: (ne.x - sw.x) * (sw.y - ne.y) };
      })
      .filter((entry) => entry !== null)
      .sort((a, b) => b.size - a.size);
    this.hoverOpened.clear();
    for (const { layer, centre } of labelled) {
      const tooltip = layer.getTooltip();
      const content = tooltip?.getContent();
      const text = content instanceof HTMLElement ? (content.textContent ?? '') : String(content ?? '');
      const half = (text.length * 6.5 + 14) / 2;
      const boxAt = (dy: number) => L.bounds(L.point(centre.x - half, centre.y + dy - 11), L.point(centre.x + half, centre.y + dy + 11));
      const free = (box: L.Bounds) => !placed.some((other) => other.overlaps(box)) && !markers.some((m) => m.overlaps(box));
      // Centre first, then a step above or below at a time (Leaflet adds the offset to the centre).
      const dy = LABEL_SHIFTS_PX.find((shift) => free(boxAt(shift)));
      if (dy === undefined && placed.some((other) => other.overlaps(boxAt(0)))) {
        layer.closeTooltip();
        continue;
      }
      const shift = dy ?? 0;
      if (tooltip) tooltip.options.offset = L.point(0, shift);
      placed.push(boxAt(shift));
      layer.closeTooltip();
      layer.openTooltip();
    }
  }

  /** Band strokes are in pixels; keep them as wide as the clearance on the ground at this zoom. */
  private sizeBands(map: L.Map): void {
    const zoom = map.getZoom();
    for (const band of this.bands) band.layer.setStyle({ weight: clearanceStrokePx(band.clearanceM, band.lat, zoom) });
  }

  private contentBounds(): L.LatLngBounds | null {
    for (const group of [this.outlines, this.hazardShapes, this.extras]) {
      const bounds = group.getLayers().length ? group.getBounds() : null;
      if (bounds?.isValid()) {
        if (group === this.outlines && this.hazardShapes.getLayers().length) bounds.extend(this.hazardShapes.getBounds());
        return bounds;
      }
    }
    return null;
  }

  /** Refits when the drawn content covers a different area (a new field, another import preview). */
  private fitIfChanged(): void {
    const key = this.contentBounds()?.toBBoxString() ?? '';
    if (!key || key === this.fittedKey) return;
    this.fittedKey = key;
    this.fit();
  }
}

const latLng = (p: Position): L.LatLng => L.latLng(p[1], p[0]);
const isEmptySize = (size: L.Point): boolean => size.x <= 0 || size.y <= 0;

/** The SVG path elements a GeoJSON layer drew (none before it is on a map, or with a canvas renderer). */
function pathsOf(layer: L.GeoJSON): SVGElement[] {
  const paths: SVGElement[] = [];
  layer.eachLayer((child) => {
    const el = (child as L.Path).getElement?.();
    if (el instanceof SVGElement) paths.push(el);
  });
  return paths;
}

/**
 * Tooltip content as text: Leaflet takes a string as HTML, so a field named with markup would
 * become markup. An element whose textContent is set shows the name exactly as typed.
 */
export function textLabel(text: string): HTMLElement {
  const span = document.createElement('span');
  span.textContent = text;
  return span;
}

type Part =
  | { type: 'Point'; coordinates: Position }
  | { type: 'LineString'; coordinates: Position[] }
  | { type: 'Polygon'; coordinates: Position[][] };

function partsOf(g: Geometry): Part[] {
  switch (g.type) {
    case 'Point':
    case 'LineString':
    case 'Polygon':
      return [g as Part];
    case 'MultiPoint':
      return g.coordinates.map((coordinates) => ({ type: 'Point', coordinates }));
    case 'MultiLineString':
      return g.coordinates.map((coordinates) => ({ type: 'LineString', coordinates }));
    case 'MultiPolygon':
      return g.coordinates.map((coordinates) => ({ type: 'Polygon', coordinates }));
    default:
      return g.geometries.flatMap(partsOf);
  }
}

/** Where a hazard's symbol sits: the point, the middle of a line's middle segment, the middle of an area. */
function anchorOf(g: Geometry): Position | null {
  const part = partsOf(g)[0];
  if (!part) return null;
  if (part.type === 'Point') return part.coordinates;
  if (part.type === 'LineString') {
    const c = part.coordinates;
    if (c.length < 2) return c[0] ?? null;
    const i = Math.floor((c.length - 1) / 2);
    return [(c[i][0] + c[i + 1][0]) / 2, (c[i][1] + c[i + 1][1]) / 2];
  }
  const ring = part.coordinates[0] ?? [];
  if (!ring.length) return null;
  const lons = ring.map((p) => p[0]);
  const lats = ring.map((p) => p[1]);
  return [(Math.min(...lons) + Math.max(...lons)) / 2, (Math.min(...lats) + Math.max(...lats)) / 2];
}
