import type { JobCoverage } from '@shared/schemas/track-coverage';
import { COVERAGE_COLOURS, COVERAGE_STYLES, PLANNED_PASS_COLOUR, coverageKey, coverageLayers, plannedPassLayers } from './coverage-layers';

/**
 * Contrast ratio by WCAG 2.1's definitions of relative luminance (sRGB, linearised with the
 * 0.04045 / 12.92 / 2.4 curve) and of contrast ratio ((L1 + 0.05) / (L2 + 0.05)).
 */
function contrast(a: string, b: string): number {
  const lum = (hex: string) => {
    const n = parseInt(hex.slice(1), 16);
    const lin = (c: number) => (c / 255 <= 0.04045 ? c / 255 / 12.92 : ((c / 255 + 0.055) / 1.055) ** 2.4);
    return 0.2126 * lin(n >> 16) + 0.7152 * lin((n >> 8) & 255) + 0.0722 * lin(n & 255);
  };
  const [hi, lo] = [lum(a), lum(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

const square = (x: number) => ({
  type: 'MultiPolygon' as const,
  coordinates: [
    [
      [
        [x, 47],
        [x + 0.001, 47],
        [x + 0.001, 47.001],
        [x, 47],
      ],
    ],
  ],
});

const coverage: JobCoverage = {
  assignmentId: 7,
  fieldAcres: 160,
  workRegionAcres: 158,
  coveredAcres: 150.5,
  skippedAcres: 6.25,
  sliverAcres: 1.25,
  workedTwiceAcres: 3.5,
  skipCount: 2,
  trackLengthM: 12000,
  widthM: 18.288,
  skips: [
    { acres: 5, centroid: [-99.9, 47.6] },
    { acres: 1.25, centroid: [-99.91, 47.61] },
  ],
  skipGeometry: square(2),
  coveredGeometry: square(0),
  twiceGeometry: square(1),
  sourceName: 'seeding.gpx',
  sourceFormat: 'gpx',
  computedAt: '2026-05-10T18:00:00.000Z',
};

describe('coverage layers', () => {
  it.each([
    ['light', '#ecebe3'],
    ['dark', '#23231e'],
  ])('when drawn on the %s map background, then every coverage colour has at least 3:1 contrast (WCAG 2.1, 1.4.11)', (_, bg) => {
    for (const colour of [...Object.values(COVERAGE_COLOURS), PLANNED_PASS_COLOUR]) expect(contrast(colour, bg)).toBeGreaterThanOrEqual(3);
  });

  it('when the job has a saved plan, then its passes are one line layer; without a plan, none', () => {
    const passes = { type: 'FeatureCollection' as const, features: [] };
    expect(plannedPassLayers(passes).map((l) => [l.id, l.data])).toEqual([['planned-passes', passes]]);
    expect(plannedPassLayers(null)).toEqual([]);
  });

  it('when the contrast helper is checked, then black on white is 21:1 and a colour on itself 1:1 (WCAG 2.1 definition)', () => {
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 6);
    expect(contrast('#2b7bb9', '#2b7bb9')).toBe(1);
  });

  it('when a coverage is drawn, then covered comes first, twice over it and the dashed skips on top', () => {
    const layers = coverageLayers(coverage, (acres) => `Skipped ${acres} ac`);
    expect(layers.map((l) => l.id)).toEqual(['coverage-covered', 'coverage-twice', 'coverage-skipped']);
    expect(layers.map((l) => l.data)).toEqual([coverage.coveredGeometry, coverage.twiceGeometry, coverage.skipGeometry]);
    expect(layers[2].style).toBe(COVERAGE_STYLES.skipped);
    expect(COVERAGE_STYLES.skipped.dashArray).toBeTruthy();
    expect(layers[2].tooltip!({ type: 'Feature', properties: {}, geometry: coverage.skipGeometry! })).toBe('Skipped 6.25 ac');
  });

  it('when nothing was worked twice and nothing skipped, then only the covered layer is drawn', () => {
    expect(coverageLayers({ ...coverage, twiceGeometry: null, skipGeometry: null }).map((l) => l.id)).toEqual(['coverage-covered']);
  });

  it("when the key is made, then it lists each kind with its colour and the coverage's acres", () => {
    expect(coverageKey(coverage)).toEqual([
      { kind: 'covered', label: 'Covered', colour: COVERAGE_COLOURS.covered, acres: 150.5 },
      { kind: 'twice', label: 'Worked twice', colour: COVERAGE_COLOURS.twice, acres: 3.5 },
      { kind: 'skipped', label: 'Skipped', colour: COVERAGE_COLOURS.skipped, acres: 6.25 },
    ]);
  });
});
