import type { Feature, LineString } from 'geojson';
import type { PassProperties } from '@shared/plan/types';
import { SQUARE, planResult } from './plan-fixtures';
import { passLabels, planLayers, spacedLabels } from './plan-layers';

const pass = (n: number, segment = 1, x = n): Feature<LineString, PassProperties> => ({
  type: 'Feature',
  geometry: {
    type: 'LineString',
    coordinates: [
      [x, segment],
      [x, segment + 0.5],
    ],
  },
  properties: { pass: n, segment, headingDeg: 0, lengthM: 100 },
});

describe('plan layers', () => {
  it('when there are few passes, then every pass is labelled at the start of its first segment', () => {
    const labels = passLabels([pass(2, 2), pass(1), pass(2, 1)]);
    expect(labels).toEqual([
      { pass: 1, at: [1, 1] },
      { pass: 2, at: [2, 1] },
    ]);
  });

  it('when labels would crowd on screen, then every few are kept, always the first and the last', () => {
    const labels = passLabels(Array.from({ length: 95 }, (_, i) => pass(i + 1)));
    // 10 px apart on screen with a 30 px gap: every third pass, and the last in place of pass 94.
    const shown = spacedLabels(labels, ({ at }) => ({ x: at[0] * 10, y: 0 }), 30).map((l) => l.pass);
    expect(shown.slice(0, 3)).toEqual([1, 4, 7]);
    expect(shown.slice(-2)).toEqual([91, 95]);
  });

  it('when labels are far apart, then all are kept', () => {
    const labels = passLabels([pass(1), pass(2), pass(3)]);
    expect(spacedLabels(labels, ({ at }) => ({ x: at[0] * 100, y: 0 })).map((l) => l.pass)).toEqual([1, 2, 3]);
  });

  it('when a plan is drawn, then headland, strips and passes come in that order with pass tooltips', () => {
    const result = planResult({
      unworked: { type: 'FeatureCollection', features: [{ type: 'Feature', geometry: SQUARE, properties: {} }] },
    });
    const layers = planLayers(result, (m) => `${Math.round(m / 0.3048)} ft`);
    expect(layers.map((l) => l.id)).toEqual(['headland', 'unworked', 'passes']);
    const tip = layers[2].tooltip!(result.passes.features[0]);
    expect(tip).toBe('Pass 1: 2461 ft at 90.0°');
  });

  it('when no skip is allowed and nothing overlaps, then there is no strip layer', () => {
    const layers = planLayers(planResult({ coverage: 'full', headland: null }), String);
    expect(layers.map((l) => l.id)).toEqual(['passes']);
  });
});
