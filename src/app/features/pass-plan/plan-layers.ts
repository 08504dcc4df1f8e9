import type { Feature, LineString, Position } from 'geojson';
import type { PassProperties, PlanResult } from '@shared/plan/types';
import { formatHeading } from '@shared/figures';
import type { MapLayer } from '../../shared/map/map-types';

/**
 * The plan's extra map layers, bottom to top: headland ring, unworked or overlap strips, passes.
 * Colours come from CSS classes (plan-legend.scss) so the legend and the map match in both themes.
 *
 * @param length formats a length in metres in the farm's unit, for the pass tooltips
 */
export function planLayers(r: PlanResult, length: (m: number) => string): MapLayer[] {
  const layers: MapLayer[] = [];
  if (r.headland) layers.push({ id: 'headland', data: r.headland, style: { className: 'pp-headland', weight: 0 } });
  const strips = r.coverage === 'full' ? r.overlap : r.unworked;
  if (strips.features.length)
    layers.push({
      id: r.coverage === 'full' ? 'overlap' : 'unworked',
      data: strips,
      style: { className: `pp-${r.coverage === 'full' ? 'overlap' : 'unworked'}`, weight: 0 },
    });
  layers.push({
    id: 'passes',
    data: r.passes,
    style: { className: 'pp-pass', weight: 2 },
    tooltip: (f: Feature) => {
      const p = f.properties as PassProperties | null;
      if (!p) return null;
      return `Pass ${p.pass}${p.segment > 1 ? `, segment ${p.segment}` : ''}: ${length(p.lengthM)} at ${formatHeading(p.headingDeg)}`;
    },
  });
  return layers;
}

/** Where a pass number is written: the start of the pass's first segment. */
export interface PassLabel {
  pass: number;
  at: Position;
}

/** Pass numbers closer than this on screen would overlap; the ones between are left out, px. */
export const MIN_LABEL_GAP_PX = 30;

/** The start of every pass, in pass order. */
export function passLabels(passes: readonly Feature<LineString, PassProperties>[]): PassLabel[] {
  const starts = new Map<number, Position>();
  for (const f of passes) {
    const { pass, segment } = f.properties;
    const at = f.geometry.coordinates[0];
    if (at && (!starts.has(pass) || segment === 1)) starts.set(pass, at);
  }
  return [...starts.keys()].sort((a, b) => a - b).map((pass) => ({ pass, at: starts.get(pass) as Position }));
}

/**
 * The labels to write at the current zoom: the first pass, then each next one at least `gapPx` from
 * the last one kept, and the last pass (in place of a kept one it would overlap).
 *
 * @param screen where a label lands on screen, px
 */
export function spacedLabels<T extends PassLabel>(
  labels: readonly T[],
  screen: (label: T) => { x: number; y: number },
  gapPx = MIN_LABEL_GAP_PX,
): T[] {
  const kept: Array<{ label: T; x: number; y: number }> = [];
  const far = (a: { x: number; y: number }, b: { x: number; y: number }) => Math.hypot(a.x - b.x, a.y - b.y) >= gapPx;
  labels.forEach((label, i) => {
    const p = screen(label);
    const previous = kept.at(-1);
    if (!previous || far(previous, p)) kept.push({ label, ...p });
    else if (i === labels.length - 1) {
      if (kept.length > 1) kept.pop();
      kept.push({ label, ...p });
    }
  });
  return kept.map((k) => k.label);
}
