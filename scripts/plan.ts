// Command-line pass plan: node --import tsx scripts/plan.ts --boundary FIELD.geojson --width-ft 60
// Prints one JSON object of numbers; with --geometry also the map geometries. Bad input exits 1
// with a one-line message on stderr.
import type { FeatureCollection, Geometry, MultiPolygon, Polygon } from 'geojson';
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { planPasses } from '../shared/plan/plan-passes';
import type { PlanInput } from '../shared/plan/types';
import { ftToM, mphToMps } from '../shared/units';

const USAGE =
  'usage: plan --boundary FILE.geojson (--width-ft N | --width-m N) [--headland-passes N] [--heading DEG|auto] ' +
  '[--hazards FILE.geojson] [--speed-mph N] [--efficiency F] [--turn-seconds N] [--coverage gaps-ok|full] [--name NAME] [--geometry]';

export interface PlanCliOptions {
  boundaryFile: string;
  hazardsFile?: string;
  input: Omit<PlanInput, 'boundary' | 'hazards'>;
  geometry: boolean;
}

function num(flag: string, v: string | undefined): number | undefined {
  if (v === undefined) return undefined;
  const n = Number(v);
  if (v.trim() === '' || !Number.isFinite(n)) throw new Error(`--${flag} must be a number (got '${v}')`);
  return n;
}

/**
 * Parses the command line of the plan CLI.
 *
 * @param argv arguments after the script name
 * @example parsePlanArgs(['--boundary', 'f.geojson', '--width-ft', '60']).input.widthM // 18.288
 */
export function parsePlanArgs(argv: string[]): PlanCliOptions {
  const { values: v } = parseArgs({
    args: argv,
    strict: true,
    options: {
      boundary: { type: 'string' },
      'width-ft': { type: 'string' },
      'width-m': { type: 'string' },
      'headland-passes': { type: 'string' },
      heading: { type: 'string' },
      hazards: { type: 'string' },
      'speed-mph': { type: 'string' },
      efficiency: { type: 'string' },
      'turn-seconds': { type: 'string' },
      coverage: { type: 'string' },
      name: { type: 'string' },
      geometry: { type: 'boolean', default: false },
    },
  });
  if (!v.boundary) throw new Error(`--boundary is required; ${USAGE}`);
  const ft = num('width-ft', v['width-ft']);
  const m = num('width-m', v['width-m']);
  if ((ft === undefined) === (m === undefined)) throw new Error(`give the working width once, as --width-ft or --width-m; ${USAGE}`);
  // The command takes mph, as a farmer says it; the planner works in m/s.
  const speedMph = num('speed-mph', v['speed-mph']);
  const heading = v.heading === undefined || v.heading === 'auto' ? 'auto' : num('heading', v.heading);
  return {
    boundaryFile: v.boundary,
    hazardsFile: v.hazards,
    geometry: v.geometry ?? false,
    input: {
      fieldName: v.name,
      widthM: ft !== undefined ? ftToM(ft) : m!,
      headlandPasses: num('headland-passes', v['headland-passes']),
      headingDeg: heading,
      speedMps: speedMph === undefined ? undefined : mphToMps(speedMph),
      efficiency: num('efficiency', v.efficiency),
      turnSeconds: num('turn-seconds', v['turn-seconds']),
      coverage: v.coverage as PlanInput['coverage'],
    },
  };
}

function readJson(file: string, what: string): unknown {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch {
    throw new Error(`cannot read the ${what} file '${file}'`);
  }
  try {
    return JSON.parse(text);
  } catch {
    throw new Error(`the ${what} file '${file}' is not valid JSON`);
  }
}

/** The polygon in a Geometry, a Feature or a FeatureCollection with one polygon feature. */
export function boundaryOf(json: unknown, file: string): { geometry: Polygon | MultiPolygon; name?: string } {
  type F = { type?: string; geometry?: Geometry; properties?: { name?: unknown } | null };
  const named = (f: F) => ({
    geometry: f.geometry as Polygon,
    name: typeof f.properties?.name === 'string' ? f.properties.name : undefined,
  });
  const g = json as F & { features?: F[] };
  if (g?.type === 'Feature') return named(g);
  if (g?.type === 'FeatureCollection') {
    const polys = (g.features ?? []).filter((f) => f.geometry?.type === 'Polygon' || f.geometry?.type === 'MultiPolygon');
    if (polys.length !== 1) throw new Error(`the boundary file '${file}' must hold exactly one polygon feature (it has ${polys.length})`);
    return named(polys[0]);
  }
  return { geometry: g as Polygon };
}

function hazardsOf(json: unknown): FeatureCollection {
  const g = json as { type?: string };
  if (g?.type === 'FeatureCollection') return json as FeatureCollection;
  if (g?.type === 'Feature') return { type: 'FeatureCollection', features: [json as FeatureCollection['features'][number]] };
  return { type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: json as Geometry }] };
}

/** Runs the CLI; returns the exit code. */
export function main(argv: string[]): number {
  try {
    const opts = parsePlanArgs(argv);
    const { geometry: boundary, name } = boundaryOf(readJson(opts.boundaryFile, 'boundary'), opts.boundaryFile);
    const hazards = opts.hazardsFile ? hazardsOf(readJson(opts.hazardsFile, 'hazards')) : undefined;
    const plan = planPasses({ ...opts.input, fieldName: opts.input.fieldName ?? name, boundary, hazards });
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(plan))
      if (typeof v === 'number' || (opts.geometry && typeof v === 'object' && k !== 'warnings')) out[k] = v;
    process.stdout.write(JSON.stringify(out, null, opts.geometry ? 0 : 2) + '\n');
    for (const w of plan.warnings) process.stderr.write(`warning: ${w}\n`);
    return 0;
  } catch (e) {
    process.stderr.write(`plan: ${(e as Error).message.replace(/\s+/g, ' ')}\n`);
    return 1;
  }
}

if (require.main === module) process.exitCode = main(process.argv.slice(2));
