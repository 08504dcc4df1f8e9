import { execFileSync, spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Geodesic } from 'geographiclib-geodesic';
import { parsePlanArgs } from './plan';

const root = join(__dirname, '..');
const fixture = (name: string): string => join('tests/fixtures/geo', name);
const run = (args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'scripts/plan.ts', ...args], { cwd: root, encoding: 'utf8' });

describe('plan CLI arguments', () => {
  it('when the width is given in feet, then it is converted with 1 ft = 0.3048 m (85 FR 62698)', () => {
    const o = parsePlanArgs(['--boundary', 'f.geojson', '--width-ft', '60', '--heading', '37.5', '--coverage', 'full']);
    expect(o.input.widthM).toBeCloseTo(18.288, 12);
    expect(o.input.headingDeg).toBe(37.5);
    expect(o.input.coverage).toBe('full');
  });

  it('when both or neither width is given, or a number is not a number, then it says so', () => {
    expect(() => parsePlanArgs(['--boundary', 'f', '--width-ft', '60', '--width-m', '18'])).toThrow(/give the working width once/);
    expect(() => parsePlanArgs(['--boundary', 'f'])).toThrow(/give the working width once/);
    expect(() => parsePlanArgs(['--boundary', 'f', '--width-ft', 'sixty'])).toThrow("--width-ft must be a number (got 'sixty')");
    expect(() => parsePlanArgs(['--width-ft', '60'])).toThrow(/--boundary is required/);
  });
});

describe('plan CLI', () => {
  it('when run on the fixture field, then it prints one JSON object whose field acres match GeographicLib', () => {
    const out = execFileSync(
      process.execPath,
      [
        '--import',
        'tsx',
        'scripts/plan.ts',
        '--boundary',
        fixture('slough-quarter.geojson'),
        '--width-ft',
        '30',
        '--hazards',
        fixture('slough-quarter-hazards.geojson'),
      ],
      { cwd: root, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] },
    );
    const r = JSON.parse(out) as Record<string, unknown>;
    for (const k of [
      'fieldAcres',
      'headlandAcres',
      'interiorAcres',
      'workRegionAcres',
      'workedAcres',
      'unworkedAcres',
      'overlapAcres',
      'headingDeg',
      'passCount',
      'segmentCount',
      'turns',
      'passLengthM',
      'hours',
      'capacityAcresPerHour',
    ])
      expect(Number.isFinite(r[k])).toBe(true);
    expect(r).not.toHaveProperty('passes');
    // Reference: GeographicLib PolygonArea (WGS84) on the outer ring less each slough; 1 acre = 4046.8564224 m².
    const rings = JSON.parse(readFileSync(join(root, fixture('slough-quarter.geojson')), 'utf8')).features[0].geometry
      .coordinates as number[][][];
    const m2 = rings.reduce((sum, ring, i) => {
      const p = Geodesic.WGS84.Polygon(false);
      ring.slice(0, -1).forEach(([lon, lat]) => p.AddPoint(lat, lon));
      const a = Math.abs(p.Compute(false, true).area!);
      return i === 0 ? sum + a : sum - a;
    }, 0);
    expect(Math.abs((r.fieldAcres as number) - m2 / 4046.8564224)).toBeLessThan(1e-9);
    // AEN-73: 30 ft × 5 mph × 0.75 / 8.25 (defaults: 5 mph, 0.75).
    expect(r.capacityAcresPerHour as number).toBeCloseTo((30 * 5 * 0.75) / 8.25, 9);
  });

  it('when the boundary crosses itself, then it exits 1 with one line on stderr and no stack trace', () => {
    const r = run(['--boundary', fixture('bowtie.geojson'), '--width-ft', '60']);
    expect(r.status).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe(
      "plan: Ring 1 of field 'Bow Tie (fictional)' crosses itself near 47.60500° N, 99.89500° W (between vertex 1 and vertex 3)\n",
    );
  });

  it('when an option is unknown, then it exits 1 with one line', () => {
    const r = run(['--boundary', fixture('bowtie.geojson'), '--width-ft', '60', '--wdith', '3']);
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
  });
});
