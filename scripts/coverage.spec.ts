import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { geodesicAreaM2 } from '../shared/geo/geodesic-area';
import { localProjection, projectionForField } from '../shared/geo/local-projection';
import { ftToM, m2ToAcres } from '../shared/units';

const root = join(__dirname, '..');
const run = (args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'scripts/coverage.ts', ...args], { cwd: root, encoding: 'utf8' });

// A 4 × 60 ft wide, 300 m long rectangle at 47.6° N, 99.9° W, and a GPX of four passes one width apart.
const W = ftToM(60);
const centre = localProjection([-99.9, 47.6]);
const ring = [
  [-2 * W, -150],
  [2 * W, -150],
  [2 * W, 150],
  [-2 * W, 150],
  [-2 * W, -150],
].map((p) => centre.inverse(p));
const boundary = { type: 'Polygon' as const, coordinates: [ring] };
const proj = projectionForField(boundary);
const dir = mkdtempSync(join(tmpdir(), 'coverage-cli-'));
const file = (name: string, text: string) => {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
};
const fieldFile = file('field.geojson', JSON.stringify({ type: 'Feature', properties: { name: 'Coulee Strip' }, geometry: boundary }));
function gpx(): string {
  const segs = [0, 1, 2, 3].map((k) => {
    const x = -1.5 * W + k * W;
    const [a, b] = k % 2 ? [180, -180] : [-180, 180];
    const pts = [a, b].map((y) => proj.inverse([x, y])).map(([lon, lat]) => `<trkpt lat="${lat}" lon="${lon}"/>`);
    return `<trkseg>${pts.join('')}</trkseg>`;
  });
  return `<?xml version="1.0"?><gpx version="1.1" creator="test" xmlns="http://www.topografix.com/GPX/1/1"><trk>${segs.join('')}</trk></gpx>`;
}
const trackFile = file('track.gpx', gpx());

describe('coverage command', () => {
  it('when run on a field and a GPX of passes one width apart, then it prints one JSON object with the whole field covered', () => {
    const res = run(['--boundary', fieldFile, '--track', trackFile, '--width-ft', '60']);
    expect(res.status).toBe(0);
    const out = JSON.parse(res.stdout);
    // Source: GeographicLib (geodesicAreaM2) for the field; hand: 4 passes × 360 m of track, nothing skipped.
    expect(out.fieldAcres).toBeCloseTo(m2ToAcres(geodesicAreaM2(boundary)), 6);
    expect(out.coveredAcres).toBeCloseTo(m2ToAcres(4 * W * 300), 3);
    expect(out.skippedAcres).toBe(0);
    expect(out.skipCount).toBe(0);
    expect(out.workedTwiceAcres).toBeCloseTo(0, 4);
    expect(out.trackLengthM).toBeCloseTo(4 * 360, 3);
    for (const k of ['fieldAcres', 'workRegionAcres', 'coveredAcres', 'skippedAcres', 'workedTwiceAcres', 'skipCount', 'trackLengthM'])
      expect(typeof out[k]).toBe('number');
  });

  it('when the width is given in metres, then the same track at half the width leaves skips between the passes', () => {
    const res = run(['--boundary', fieldFile, '--track', trackFile, '--width-m', String(W / 2)]);
    expect(res.status).toBe(0);
    const out = JSON.parse(res.stdout);
    // Hand: each pass covers W/2 × 300 m; the skips are 3 strips W/2 wide plus W/4 at each side.
    expect(out.coveredAcres).toBeCloseTo(m2ToAcres(4 * (W / 2) * 300), 3);
    expect(out.skippedAcres).toBeCloseTo(m2ToAcres(2 * W * 300), 3);
    expect(out.skipCount).toBe(5);
  });

  it.each([
    [['--track', 'x.gpx', '--width-ft', '60'], /--boundary is required/],
    [['--boundary', 'f.geojson', '--width-ft', '60'], /--track is required/],
    [['--boundary', 'f.geojson', '--track', 't.gpx'], /give the working width once/],
    [['--boundary', 'f.geojson', '--track', 't.gpx', '--width-ft', 'sixty'], /--width-ft must be a number/],
    [['--boundary', join(dir, 'missing.geojson'), '--track', trackFile, '--width-ft', '60'], /cannot read the boundary file/],
    [['--boundary', file('bad.geojson', '{oops'), '--track', trackFile, '--width-ft', '60'], /not valid JSON/],
    [['--boundary', fieldFile, '--track', file('t.gpx', '<gpx><trk>'), '--width-ft', '60'], /GPX file is damaged/],
    [['--boundary', fieldFile, '--track', file('t.txt', 'hello'), '--width-ft', '60'], /GPX .* GeoJSON/],
    [['--boundary', fieldFile, '--track', trackFile, '--width-ft', '0'], /working width must be more than 0/],
  ])('when the input is bad (%j), then it exits 1 with a one-line message', (args, message) => {
    const res = run(args as string[]);
    expect(res.status).toBe(1);
    expect(res.stdout).toBe('');
    expect(res.stderr).toMatch(message);
    expect(res.stderr.trim().split('\n')).toHaveLength(1);
  });
});
