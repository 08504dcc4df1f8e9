// Benchmark of the pass plan (not a test): node --import tsx scripts/bench-plan.ts
// Field: the fictional "Draw Section" fixture (≈ 655 acres, irregular, one slough, three hazards).
// Targets (2-core machine): full auto plan < 40 ms median; 180-heading scan < 25 ms median; scan at
// least 50× faster than the same scan by JTS generic overlay. Exits 1 when a target is missed.
import type { FeatureCollection, Polygon } from 'geojson';
import OverlayOp from 'jsts/org/locationtech/jts/operation/overlay/OverlayOp.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { projectionForField } from '../shared/geo/local-projection';
import { scanHeadings } from '../shared/plan/auto-heading';
import { difference, hazardZones, offset, readJsts, writePolygonal } from '../shared/plan/jsts-ops';
import { createPassClipper } from '../shared/plan/pass-clipper';
import { packRegion } from '../shared/plan/planar-region';
import { planPasses } from '../shared/plan/plan-passes';
import { ftToM } from '../shared/units';

const dir = join(__dirname, '../tests/fixtures/geo');
const boundary = JSON.parse(readFileSync(join(dir, 'draw-section.geojson'), 'utf8')).features[0].geometry as Polygon;
const hazards = JSON.parse(readFileSync(join(dir, 'draw-section-hazards.geojson'), 'utf8')) as FeatureCollection;
const HEADINGS = Array.from({ length: 180 }, (_, i) => i);

function time(runs: number, warmup: number, fn: () => void): { median: number; p95: number } {
  for (let i = 0; i < warmup; i++) fn();
  const ts: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    fn();
    ts.push(performance.now() - t);
  }
  ts.sort((a, b) => a - b);
  return { median: ts[Math.floor(runs / 2)], p95: ts[Math.min(runs - 1, Math.ceil(runs * 0.95) - 1)] };
}

// The work region at 30 ft with 2 headland passes, built once, as the plan builds it.
const widthM = ftToM(30);
const proj = projectionForField(boundary);
const interior = offset(readJsts(proj.forwardGeometry(boundary)), -2 * widthM);
const zones = hazardZones({ ...hazards, features: hazards.features.map((f) => ({ ...f, geometry: proj.forwardGeometry(f.geometry!) })) });
const regionJ = difference(interior, zones);
const region = packRegion(writePolygonal(regionJ)!);

/**
 * The scan by generic overlay: all lines of a heading as one MultiLineString ∩ region (JTS
 * OverlayOp). It takes ~0.2 s per heading here, so it runs on every 10th heading and is compared
 * per heading with our scan of the same headings.
 */
const REF_HEADINGS = HEADINGS.filter((h) => h % 10 === 0);
function overlayScan(headings: number[]): { segments: number; lengthM: number } {
  const layoutOf = createPassClipper(region, widthM).layout;
  let segments = 0,
    lengthM = 0;
  for (const h of headings) {
    const c = layoutOf(h);
    const xy = (u: number, t: number): number[] => [u * c.cos + t * c.sin, -u * c.sin + t * c.cos];
    const lines = Array.from(c.us, (u) => [xy(u, c.tMin - 10), xy(u, c.tMax + 10)]);
    const cut = OverlayOp.intersection(regionJ, readJsts({ type: 'MultiLineString', coordinates: lines }));
    for (let i = 0; i < cut.getNumGeometries(); i++) {
      const g = cut.getGeometryN(i);
      if (g.getGeometryType() === 'LineString' && g.getLength() > 1e-6) {
        segments++;
        lengthM += g.getLength();
      }
    }
  }
  return { segments, lengthM };
}
const sum = (s: { segmentCount: number; passLengthM: number }[]) => ({
  segments: s.reduce((a, x) => a + x.segmentCount, 0),
  lengthM: s.reduce((a, x) => a + x.passLengthM, 0),
});

const rows: { name: string; median: number; p95: number; target: string; pass: boolean }[] = [];
for (const ft of [30, 70]) {
  const t = time(40, 10, () => planPasses({ boundary, hazards, widthM: ftToM(ft), headingDeg: 'auto' }));
  rows.push({ name: `auto plan, full result, ${ft} ft`, ...t, target: '< 40 ms median', pass: t.median < 40 });
}
const scan = time(40, 10, () => scanHeadings(createPassClipper(region, widthM), HEADINGS));
rows.push({ name: '180-heading scan, 30 ft', ...scan, target: '< 25 ms median', pass: scan.median < 25 });
const ourSub = time(40, 10, () => scanHeadings(createPassClipper(region, widthM), REF_HEADINGS));
const ours = sum(scanHeadings(createPassClipper(region, widthM), REF_HEADINGS));
let ref = { segments: 0, lengthM: 0 };
const overlay = time(1, 1, () => (ref = overlayScan(REF_HEADINGS)));
const perHeading = (t: { median: number; p95: number }) => ({
  median: (t.median / REF_HEADINGS.length) * 180,
  p95: (t.p95 / REF_HEADINGS.length) * 180,
});
rows.push({ name: 'same scan by JTS overlay (×180/18)', ...perHeading(overlay), target: '(reference)', pass: true });
const ratio = overlay.median / ourSub.median;
rows.push({ name: `speed-up ${ratio.toFixed(0)}×`, median: NaN, p95: NaN, target: '≥ 50×', pass: ratio >= 50 });

const pad = (s: string, n: number): string => s.padEnd(n);
const ms = (v: number): string => (Number.isFinite(v) ? v.toFixed(2).padStart(9) : ''.padStart(9));
console.log(`${pad('case', 34)} ${'median ms'.padStart(9)} ${'p95 ms'.padStart(9)}  ${pad('target', 16)} result`);
for (const r of rows) console.log(`${pad(r.name, 34)} ${ms(r.median)} ${ms(r.p95)}  ${pad(r.target, 16)} ${r.pass ? 'PASS' : 'FAIL'}`);
const agree = ours.segments === ref.segments && Math.abs(ours.lengthM - ref.lengthM) < 1e-3 * ref.segments;
console.log(
  `scan check on ${REF_HEADINGS.length} headings: ${ours.segments} segments, ${ours.lengthM.toFixed(3)} m (overlay: ${ref.segments}, ${ref.lengthM.toFixed(3)} m) ${agree ? 'agree' : 'DIFFER'}`,
);
if (!agree || rows.some((r) => !r.pass)) process.exitCode = 1;
