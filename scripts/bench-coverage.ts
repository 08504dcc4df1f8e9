// Benchmark of coverage from a logged track (not a test): node --import tsx scripts/bench-coverage.ts
// Field: the fictional "Draw Section" fixture (≈ 655 acres, irregular, one slough, three hazards).
// Track: a made-up 10-hour log at one fix per second (36,000 fixes) of a 60 ft implement driven
// back and forth at a slant, with steering wander, receiver noise, a few passes spaced too wide or
// too close, and the implement lifted in the end turns. Targets (2-core machine): coverage < 1 s
// median; its covered acres within 0.5 % of the exact overlay (the whole unsimplified track
// buffered by JTS and clipped to the work region) in the same run. Exits 1 when a target is missed.
import type { FeatureCollection, Polygon } from 'geojson';
import BufferOp from 'jsts/org/locationtech/jts/operation/buffer/BufferOp.js';
import BufferParameters from 'jsts/org/locationtech/jts/operation/buffer/BufferParameters.js';
import OverlayOp from 'jsts/org/locationtech/jts/operation/overlay/OverlayOp.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { computeCoverage, type TrackPoint } from '../shared/track-coverage/coverage';
import { geodesicAreaM2 } from '../shared/geo/geodesic-area';
import { projectionForField } from '../shared/geo/local-projection';
import { difference, hazardZones, readJsts } from '../shared/plan/jsts-ops';
import { ftToM, m2ToAcres } from '../shared/units';

const dir = join(__dirname, '../tests/fixtures/geo');
const boundary = JSON.parse(readFileSync(join(dir, 'draw-section.geojson'), 'utf8')).features[0].geometry as Polygon;
const hazards = JSON.parse(readFileSync(join(dir, 'draw-section-hazards.geojson'), 'utf8')) as FeatureCollection;
const widthM = ftToM(60);
const FIXES = 36_000;

/** A seeded generator (mulberry32), so every run drives the same track. */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const rnd = random(7);
const gauss = () => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());

const proj = projectionForField(boundary);
const fieldJ = readJsts(proj.forwardGeometry(boundary));
const env = fieldJ.getEnvelopeInternal();

/** The driven path in a frame turned 20° from north: passes along v, stepping across in u. */
function drivenPath(): Array<{ x: number; y: number; working: boolean }> {
  const a = (20 * Math.PI) / 180;
  const cx = (env.getMinX() + env.getMaxX()) / 2,
    cy = (env.getMinY() + env.getMaxY()) / 2;
  const half = Math.hypot(env.getWidth(), env.getHeight()) / 2;
  const toXY = (u: number, v: number) => ({ x: cx + u * Math.cos(a) + v * Math.sin(a), y: cy - u * Math.sin(a) + v * Math.cos(a) });
  const path: Array<{ u: number; v: number; working: boolean }> = [];
  let u = -half + widthM / 2;
  let dir = 1;
  let k = 0;
  while (u < half) {
    // Along the pass, 2 m apart before resampling: steering wander of ±0.3 m over ~200 m.
    const phase = rnd() * 6.28;
    for (let v = -half; v <= half; v += 2) path.push({ u: u + 0.3 * Math.sin(v / 32 + phase), v: dir * v, working: true });
    // End turn (implement lifted): a half circle to the next pass.
    const spacing = widthM * (k % 17 === 5 ? 1.15 : k % 13 === 7 ? 0.85 : 1.0);
    for (let s = 1; s < 12; s++) {
      const th = (Math.PI * s) / 12;
      path.push({ u: u + (spacing / 2) * (1 - Math.cos(th)), v: dir * (half + (spacing / 2) * Math.sin(th)), working: false });
    }
    u += spacing;
    dir = -dir;
    k++;
  }
  return path.map((p) => ({ ...toXY(p.u, p.v), working: p.working }));
}

/** Resampled to FIXES fixes one second apart along the path, with 2 cm receiver noise. */
function track(): TrackPoint[] {
  const path = drivenPath();
  const cum = [0];
  for (let i = 1; i < path.length; i++) cum.push(cum[i - 1] + Math.hypot(path[i].x - path[i - 1].x, path[i].y - path[i - 1].y));
  const total = cum[cum.length - 1];
  const out: TrackPoint[] = [];
  let j = 0;
  for (let i = 0; i < FIXES; i++) {
    const s = (total * i) / (FIXES - 1);
    while (j < path.length - 2 && cum[j + 1] < s) j++;
    const f = (s - cum[j]) / (cum[j + 1] - cum[j] || 1);
    const x = path[j].x + f * (path[j + 1].x - path[j].x) + 0.02 * gauss();
    const y = path[j].y + f * (path[j + 1].y - path[j].y) + 0.02 * gauss();
    const [lon, lat] = proj.inverse([x, y]);
    out.push({ lon, lat, t: Date.UTC(2026, 4, 10, 7) + i * 1000, working: path[j].working && path[j + 1].working });
  }
  return out;
}

const points = track();
const input = { boundary, hazards, track: [points], widthM };

/** The exact overlay: every working run, unsimplified, buffered by JTS and clipped to the region. */
function exactCoveredAcres(): number {
  const p = new BufferParameters();
  p.setQuadrantSegments(16);
  p.setJoinStyle(BufferParameters.JOIN_ROUND);
  p.setEndCapStyle(BufferParameters.CAP_FLAT);
  const runs: number[][][] = [];
  let run: number[][] = [];
  for (let i = 0; i < points.length; i++) {
    const xy = proj.forward([points[i].lon, points[i].lat]);
    if (run.length) run.push(xy);
    if (points[i].working !== false) {
      if (!run.length) run.push(xy);
    } else {
      if (run.length >= 2) runs.push(run);
      run = [];
    }
  }
  if (run.length >= 2) runs.push(run);
  const swath = BufferOp.bufferOp(readJsts({ type: 'MultiLineString', coordinates: runs }), widthM / 2, p);
  const zones = hazardZones({ ...hazards, features: hazards.features.map((f) => ({ ...f, geometry: proj.forwardGeometry(f.geometry!) })) });
  const region = zones ? difference(fieldJ, zones) : fieldJ;
  const scale = geodesicAreaM2(boundary) / fieldJ.getArea();
  return m2ToAcres(OverlayOp.intersection(region, swath).getArea()) * scale;
}

/** Wall-clock median and p95, and the median CPU time of this thread (which load on a shared machine does not inflate as much). */
function time(runs: number, warmup: number, fn: () => void): { median: number; p95: number; cpu: number } {
  for (let i = 0; i < warmup; i++) fn();
  const ts: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    const c = process.cpuUsage().user;
    fn();
    ts.push(performance.now() - t);
    cpu.push((process.cpuUsage().user - c) / 1000);
  }
  ts.sort((a, b) => a - b);
  cpu.sort((a, b) => a - b);
  return { median: ts[Math.floor(runs / 2)], p95: ts[Math.min(runs - 1, Math.ceil(runs * 0.95) - 1)], cpu: cpu[Math.floor(runs / 2)] };
}

const result = computeCoverage(input);
const t = time(9, 2, () => computeCoverage(input));
const t0 = performance.now();
const exact = exactCoveredAcres();
const exactMs = performance.now() - t0;
const diffPct = (100 * Math.abs(result.coveredAcres - exact)) / exact;

const rows = [
  {
    name: `coverage, ${FIXES.toLocaleString('en-US')} fixes, 60 ft, ${result.fieldAcres.toFixed(0)} ac`,
    value: `${t.median.toFixed(0)} ms median (p95 ${t.p95.toFixed(0)} ms; CPU ${t.cpu.toFixed(0)} ms median)`,
    target: '< 1000 ms median',
    pass: t.median < 1000,
  },
  {
    name: 'covered acres: ours vs exact overlay',
    value: `${result.coveredAcres.toFixed(2)} vs ${exact.toFixed(2)} ac (${diffPct.toFixed(3)} %; overlay took ${exactMs.toFixed(0)} ms)`,
    target: 'within 0.5 %',
    pass: diffPct <= 0.5,
  },
];
console.log(
  `work region ${result.workRegionAcres.toFixed(2)} ac; skipped ${result.skippedAcres.toFixed(2)} ac in ${result.skipCount} skips; ` +
    `worked twice ${result.workedTwiceAcres.toFixed(2)} ac; slivers ${result.sliverAcres.toFixed(3)} ac; ${result.passCount} passes; ` +
    `track ${(result.trackLengthM / 1000).toFixed(1)} km`,
);
console.table(rows);
process.exit(rows.every((r) => r.pass) ? 0 : 1);
