import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { formatHeading } from '@shared/figures';
import { type HazardAt, type Where, headingBetween, savedPlanInput, whereAmI } from '@shared/plan/where';
import { HAZARD_LABELS, type HazardKind } from '@shared/schemas/terms';
import type { RunSheetItem } from '@shared/schemas/run-sheet';
import * as L from 'leaflet';
import { Units } from '../../../shared/units/units';
import { PLANNED_PASS_COLOUR } from '../../../shared/map/coverage-layers';
import { GEOLOCATION, PLAN_PASSES, type PlanLayout, type PlanPasses } from './passes-source';

/** One reading of the phone's position. */
export interface Fix {
  lon: number;
  lat: number;
  /** Radius of the phone's uncertainty, m. */
  accuracyM: number;
  /** Direction of travel, degrees clockwise from true north; null while standing or unknown. */
  headingDeg: number | null;
}

type Passes =
  | { state: 'none' }
  | { state: 'loading' }
  | { state: 'ready'; passes: PlanPasses; headland: PlanLayout['headland']; count: number }
  | { state: 'failed' };

/** Position reads asked of the phone: fresh, precise, and given up on after 30 s without a fix. */
const WATCH_OPTIONS: PositionOptions = { enableHighAccuracy: true, maximumAge: 5_000, timeout: 30_000 };

export const hazardName = (kind: string | null): string => (kind && kind in HAZARD_LABELS ? HAZARD_LABELS[kind as HazardKind] : 'Hazard');

/**
 * The pass line in words: on a pass ("Pass 12 of 40"), else the nearest one and how far, and why
 * none is under the phone (off the field, in a clearance zone, in the headland or a gap). Lengths come in the farm's units through `length`.
 */
export function passText(w: Where, count: number | null, length: (m: number) => string): string {
  if (!w.pass) return 'No passes in the saved plan';
  const of = count ? ` of ${count}` : '';
  if (w.pass.under && w.inField) return `Pass ${w.pass.pass}${of}`;
  const where = !w.inField ? 'Outside the field' : w.insideZones.length ? 'In a clearance zone' : 'In the headland or a gap';
  return `${where}; nearest pass ${w.pass.pass}${of}, ${length(w.pass.offsetM)} away`;
}

/** Why there is no position, in words an operator can act on. */
export function positionError(code: number): string {
  if (code === 1)
    return 'The phone does not let Furlong see its position. Allow location for this site in the browser’s settings to use this.';
  if (code === 3) return 'No position from the phone yet. Out in the open it usually comes within a minute.';
  return 'The phone cannot tell its position right now.';
}

/**
 * "Where am I" on a job's map: with the operator's permission (asked only when they tap), the
 * phone's position and heading on the map, the pass under it (from the saved plan's own passes,
 * worked out on the phone), and the nearest hazard clearance zone; inside one, a clear warning.
 * An aid only: the position never leaves the phone, and the screen says the tractor's display and
 * the operator's eyes come first.
 */
@Component({
  selector: 'app-job-position',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule],
  templateUrl: './job-position.html',
  styleUrl: './job-position.scss',
})
export class JobPosition {
  private readonly geolocation = inject(GEOLOCATION);
  private readonly planPasses = inject(PLAN_PASSES);
  protected readonly units = inject(Units);

  readonly item = input.required<RunSheetItem>();

  protected readonly watching = signal(false);
  protected readonly fix = signal<Fix | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly passes = signal<Passes>({ state: 'none' });
  private readonly map = signal<L.Map | null>(null);
  private watchId: number | null = null;
  /** The last fix a heading was worked out from (for phones that give none). */
  private headingFrom: Fix | null = null;
  private readonly layer = L.layerGroup([], { pmIgnore: true } as L.LayerOptions);
  /** The saved plan under everything else: its headland shaded, its passes as thin lines. */
  private readonly planLayer = L.layerGroup([], { pmIgnore: true } as L.LayerOptions);

  protected readonly where = computed<Where | null>(() => {
    const f = this.fix();
    if (!f) return null;
    const p = this.passes();
    const item = this.item();
    return whereAmI(
      [f.lon, f.lat],
      p.state === 'ready' && item.passPlan ? { passes: p.passes, widthM: item.passPlan.widthM } : null,
      item.field.boundary,
      item.field.hazards,
    );
  });
  protected readonly passLine = computed(() => {
    const w = this.where();
    const p = this.passes();
    if (!w) return null;
    if (!this.item().passPlan) return 'No pass plan saved for this field and operation';
    if (p.state === 'loading') return 'Working out the passes…';
    if (p.state === 'failed') return 'The pass plan could not be worked out on this phone';
    return passText(w, p.state === 'ready' ? p.count : null, (m) => this.units.length(m));
  });
  protected readonly insideZone = computed<HazardAt | null>(() => this.where()?.insideZones[0] ?? null);
  protected readonly nextZone = computed(() => {
    const z = this.where()?.nextZone;
    return z ? { name: hazardName(z.kind), away: this.units.length(z.toZoneM) } : null;
  });
  protected readonly headingText = computed(() => {
    const h = this.fix()?.headingDeg;
    return h == null ? 'Shown once you move' : formatHeading(h);
  });
  protected readonly accuracyText = computed(() => this.units.length(this.fix()?.accuracyM ?? null));
  protected readonly hazardName = hazardName;

  constructor() {
    inject(DestroyRef).onDestroy(() => this.stop());
    effect(() => this.draw(this.map(), this.fix(), this.where()));
    effect(() => this.drawPlan(this.map(), this.passes()));
  }

  /**
   * The job's Leaflet map, once made (FieldMap's `ready`): the saved plan is worked out (off the
   * page's thread) and drawn on it, so the operator sees the pass direction and the headland
   * before setting off, with or without the position.
   */
  attach(map: L.Map): void {
    this.planLayer.addTo(map);
    this.layer.addTo(map);
    this.map.set(map);
    this.loadPasses();
  }

  /** What the map shows of the plan, in words under it (null while nothing is drawn). */
  protected readonly planOnMap = computed(() => {
    const p = this.passes();
    if (!this.map() || !this.item().passPlan) return null;
    if (p.state === 'loading') return 'Working out the saved plan’s passes on this phone…';
    if (p.state === 'failed') return 'The saved plan’s passes could not be drawn on this phone.';
    if (p.state !== 'ready') return null;
    const passes = p.count === 1 ? '1 pass' : `${p.count} passes`;
    return `On the map: the saved plan’s ${passes} (grey lines)${p.headland ? ' and its headland (shaded)' : ''}.`;
  });

  protected start(): void {
    if (this.watching()) return;
    this.error.set(null);
    if (!this.geolocation) {
      this.error.set('This browser cannot tell the phone’s position.');
      return;
    }
    this.watching.set(true);
    this.loadPasses();
    // The permission prompt comes now, from this tap, never before.
    this.watchId = this.geolocation.watchPosition(
      (pos) => this.take(pos),
      (err) => {
        this.error.set(positionError(err.code));
        if (err.code === 1) this.stop();
      },
      WATCH_OPTIONS,
    );
  }

  protected stop(): void {
    if (this.watchId !== null) this.geolocation?.clearWatch(this.watchId);
    this.watchId = null;
    this.watching.set(false);
    this.fix.set(null);
    this.headingFrom = null;
  }

  private take(pos: GeolocationPosition): void {
    const c = pos.coords;
    const here: Fix = { lon: c.longitude, lat: c.latitude, accuracyM: c.accuracy, headingDeg: null };
    // The phone's own heading when it gives one (it is NaN or null while standing), else the
    // direction from the last fix a few metres back.
    if (typeof c.heading === 'number' && Number.isFinite(c.heading) && (c.speed ?? 1) > 0) here.headingDeg = c.heading;
    else if (this.headingFrom) {
      const h = headingBetween([this.headingFrom.lon, this.headingFrom.lat], [here.lon, here.lat]);
      here.headingDeg = h ?? this.fix()?.headingDeg ?? null;
      if (h !== null) this.headingFrom = here;
    } else this.headingFrom = here;
    this.error.set(null);
    this.fix.set(here);
  }

  private loadPasses(): void {
    const item = this.item();
    const saved = item.passPlan;
    if (!saved) {
      this.passes.set({ state: 'none' });
      return;
    }
    const state = this.passes().state;
    if (state === 'ready' || state === 'loading') return;
    this.passes.set({ state: 'loading' });
    this.planPasses(savedPlanInput({ boundary: item.field.boundary, hazards: item.field.hazards, name: item.field.name }, saved)).then(
      ({ passes, headland }) =>
        this.passes.set({ state: 'ready', passes, headland, count: Math.max(0, ...passes.features.map((f) => f.properties.pass)) }),
      () => this.passes.set({ state: 'failed' }),
    );
  }

  private drawPlan(map: L.Map | null, p: Passes): void {
    this.planLayer.clearLayers();
    if (!map || p.state !== 'ready') return;
    if (p.headland)
      this.planLayer.addLayer(
        L.geoJSON(p.headland, { interactive: false, style: { className: 'jp-headland', stroke: false } } as L.GeoJSONOptions),
      );
    this.planLayer.addLayer(
      L.geoJSON(p.passes, {
        interactive: false,
        style: { className: 'jp-plan-pass', color: PLANNED_PASS_COLOUR, weight: 1.5, opacity: 0.9 },
      } as L.GeoJSONOptions),
    );
  }

  /** The position (accuracy circle, dot, heading arrow) and the pass under it, on the job's map. */
  private draw(map: L.Map | null, fix: Fix | null, where: Where | null): void {
    this.layer.clearLayers();
    if (!map || !fix) return;
    const at = L.latLng(fix.lat, fix.lon);
    const p = this.passes();
    if (where?.pass && p.state === 'ready') {
      for (const f of p.passes.features.filter((x) => x.properties.pass === where.pass!.pass))
        this.layer.addLayer(
          L.polyline(
            f.geometry.coordinates.map(([lon, lat]) => L.latLng(lat, lon)),
            { className: 'jp-pass', interactive: false, weight: 4 },
          ),
        );
    }
    this.layer.addLayer(L.circle(at, { radius: fix.accuracyM, className: 'jp-accuracy', interactive: false, weight: 1 }));
    const arrow =
      fix.headingDeg === null
        ? ''
        : // An SVG transform attribute, not a style: the page's CSP allows no inline styles.
          `<svg class="jp-arrow" viewBox="-16 -16 32 32" aria-hidden="true"><path transform="rotate(${fix.headingDeg})" d="M0 -15 L7 2 L0 -2 L-7 2 Z"/></svg>`;
    this.layer.addLayer(
      L.marker(at, {
        icon: L.divIcon({
          className: 'jp-position',
          html: `${arrow}<span class="jp-dot"></span>`,
          iconSize: [32, 32],
          iconAnchor: [16, 16],
        }),
        interactive: false,
        keyboard: false,
      }),
    );
    if (!map.getBounds().contains(at)) map.fitBounds(map.getBounds().extend(at), { padding: [24, 24] });
  }
}
