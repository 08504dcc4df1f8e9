// A job's measured coverage as map layers: the ground the track covered, the ground worked twice
// and the skips. Colours of our own, each with at least 3:1 contrast (WCAG 2.1 non-text contrast)
// against the map's plain background in both the light and the dark theme (coverage-layers.spec.ts);
// the skips are told apart by a dashed outline as well as by colour.
import type { JobCoverage } from '@shared/schemas/track-coverage';
import type { GeoJsonObject } from 'geojson';
import type { PathOptions } from 'leaflet';
import type { MapLayer } from './map-types';

export type CoverageKind = 'covered' | 'twice' | 'skipped';

export const COVERAGE_COLOURS: Record<CoverageKind, string> = {
  covered: '#2b7bb9',
  twice: '#c05a00',
  skipped: '#c8326e',
};

export const COVERAGE_LABELS: Record<CoverageKind, string> = {
  covered: 'Covered',
  twice: 'Worked twice',
  skipped: 'Skipped',
};

/** How each kind is drawn: covered as a light wash, twice darker on top, skips with a dashed outline on top of all. */
export const COVERAGE_STYLES: Record<CoverageKind, PathOptions> = {
  covered: { color: COVERAGE_COLOURS.covered, weight: 0, fillColor: COVERAGE_COLOURS.covered, fillOpacity: 0.35 },
  twice: { color: COVERAGE_COLOURS.twice, weight: 0, fillColor: COVERAGE_COLOURS.twice, fillOpacity: 0.6 },
  skipped: { color: COVERAGE_COLOURS.skipped, weight: 2, dashArray: '6 4', fillColor: COVERAGE_COLOURS.skipped, fillOpacity: 0.25 },
};

/**
 * The saved plan's passes under the coverage, as thin grey lines: where the work was meant to go.
 * Grey of our own, 3:1 or more against both map backgrounds (coverage-layers.spec.ts).
 */
export const PLANNED_PASS_COLOUR = '#767676';

/** The plan's passes as the bottom layer of a coverage map; none when no plan is saved. */
export function plannedPassLayers(passes: GeoJsonObject | null): MapLayer[] {
  return passes
    ? [{ id: 'planned-passes', data: passes, style: { color: PLANNED_PASS_COLOUR, weight: 1.5, opacity: 0.9, fill: false } }]
    : [];
}

export interface CoverageKey {
  kind: CoverageKind;
  label: string;
  colour: string;
  acres: number;
}

/** The layers of a coverage, drawn in order covered → twice → skipped; a kind with no ground has no layer. */
export function coverageLayers(c: JobCoverage, skipTooltip?: (acres: number) => string): MapLayer[] {
  const out: MapLayer[] = [];
  if (c.coveredGeometry) out.push({ id: 'coverage-covered', data: c.coveredGeometry, style: COVERAGE_STYLES.covered });
  if (c.twiceGeometry) out.push({ id: 'coverage-twice', data: c.twiceGeometry, style: COVERAGE_STYLES.twice });
  if (c.skipGeometry)
    out.push({
      id: 'coverage-skipped',
      data: c.skipGeometry,
      style: COVERAGE_STYLES.skipped,
      ...(skipTooltip ? { tooltip: () => skipTooltip(c.skippedAcres) } : {}),
    });
  return out;
}

/** The map's key: each kind with its colour and acres, in drawing order. */
export function coverageKey(c: JobCoverage): CoverageKey[] {
  const acres: Record<CoverageKind, number> = { covered: c.coveredAcres, twice: c.workedTwiceAcres, skipped: c.skippedAcres };
  return (['covered', 'twice', 'skipped'] as const).map((kind) => ({
    kind,
    label: COVERAGE_LABELS[kind],
    colour: COVERAGE_COLOURS[kind],
    acres: acres[kind],
  }));
}
