// Benchmark of the task-data export (not a test): node --import tsx scripts/bench-taskdata.ts
// A day of 40 jobs on a generated farm of 200 fields (irregular boundaries of 48 vertices, 80 to
// 640 acres, every fifth with a hole, two to three hazards each, every job's field with a saved
// plan: two headland passes at 60 ft): the task data built as the export route builds it (every
// partfield, obstacle, clearance zone, headland, AB line, worker and task, zipped). Target (2-core
// machine): median < 300 ms. Exits 1 when the target is missed.
import type { Polygon, Position } from 'geojson';
import { fieldArea } from '../shared/geo/geodesic-area';
import { localProjection } from '../shared/geo/local-projection';
import { ftToM } from '../shared/units';
import { buildTaskData, type TaskDataField, type TaskDataInput } from '../server/taskdata/build-taskdata';

const TARGET_MS = 300;
const FIELDS = 200;
const JOBS = 40;
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 15);
const ACRE_M2 = 4046.8564224;

/** A deterministic pseudo-random sequence (mulberry32), so every run builds the same farm. */
function random(seed: number): () => number {
  let a = seed;
  return () => {
    a |= 0;
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A field of about `acres` on the plane of its own centre: a wobbly ring, a hole in every fifth. */
function field(i: number, rnd: () => number): TaskDataField {
  const centre: [number, number] = [-99.95 + (i % 20) * 0.035, 47.55 + Math.floor(i / 20) * 0.025];
  const proj = localProjection(centre);
  const acres = 80 + rnd() * 560;
  const r = Math.sqrt((acres * ACRE_M2) / Math.PI);
  const ring = (radius: number, n: number, wobble: number, reverse = false): Position[] => {
    const pts: Position[] = [];
    for (let k = 0; k < n; k++) {
      const a = (2 * Math.PI * k) / n;
      const rr = radius * (1 + wobble * (rnd() - 0.5));
      pts.push(proj.inverse([rr * Math.sin(a), rr * Math.cos(a)]));
    }
    pts.push(pts[0]);
    return reverse ? pts : pts.reverse();
  };
  const rings = [ring(r, 48, 0.15)];
  if (i % 5 === 0) rings.push(ring(r * 0.15, 12, 0.1, true));
  const boundary: Polygon = { type: 'Polygon', coordinates: rings };
  const hazards = [
    {
      id: i * 10 + 1,
      label: 'Grain bins',
      geometry: { type: 'Point' as const, coordinates: proj.inverse([r * 0.5, r * 0.4]) },
      clearanceM: 15,
    },
    {
      id: i * 10 + 2,
      label: 'Power line',
      geometry: { type: 'LineString' as const, coordinates: [proj.inverse([-r * 0.6, -r * 0.3]), proj.inverse([r * 0.2, -r * 0.5])] },
      clearanceM: 6,
    },
  ];
  if (i % 2 === 0)
    hazards.push({
      id: i * 10 + 3,
      label: 'Rock pile',
      geometry: { type: 'Point' as const, coordinates: proj.inverse([-r * 0.3, r * 0.5]) },
      clearanceM: 4,
    });
  return {
    id: i + 1,
    name: `Field ${i + 1}`,
    boundary,
    areaM2: fieldArea(boundary).areaM2,
    hazards,
    plans: { seeding: { label: 'Seeding', widthM: ftToM(60), headlandPasses: 2, headingDeg: (i * 17) % 180 } },
  };
}

function dayOf(): TaskDataInput {
  const rnd = random(20261202);
  const fields = Array.from({ length: FIELDS }, (_, i) => field(i, rnd));
  // The day's jobs: 40 fields of the 200, spread over the farm, eight operators.
  const chosen = fields.filter((_, i) => i % (FIELDS / JOBS) === 0);
  return {
    farm: { name: 'Tamarack Ridge Farm' },
    customer: { name: 'Owner of the bench farm' },
    fields: chosen,
    workers: Array.from({ length: 8 }, (_, k) => ({ id: k + 1, name: `Operator ${k + 1}` })),
    jobs: chosen.map((f, k) => ({
      id: k + 1,
      fieldId: f.id,
      operation: 'seeding',
      label: `Seeding, ${f.name}`,
      workerId: (k % 8) + 1,
      state: 'planned' as const,
    })),
  };
}

async function main(): Promise<void> {
  const day = dayOf();
  let bytes = 0;
  const times: number[] = [];
  for (let i = 0; i < ROUNDS + 3; i++) {
    const t = performance.now();
    bytes = (await buildTaskData(day)).length;
    if (i >= 3) times.push(performance.now() - t); // the first rounds warm the JIT
  }
  const sorted = [...times].sort((a, b) => a - b);
  const median = sorted[Math.floor(sorted.length / 2)];
  const pass = median < TARGET_MS;
  console.table([
    {
      what: `task data: ${JOBS} jobs of a ${FIELDS}-field farm (${(bytes / 1024).toFixed(0)} kB zip)`,
      target: `< ${TARGET_MS} ms median`,
      measured: `${median.toFixed(0)} ms median (min ${sorted[0].toFixed(0)}, max ${sorted[sorted.length - 1].toFixed(0)}, ${ROUNDS} rounds)`,
      pass,
    },
  ]);
  process.exit(pass ? 0 : 1);
}

void main();
