// Command-line coverage of a logged track:
// node --import tsx scripts/coverage.ts --boundary FIELD.geojson --track TRACK.gpx --width-ft 60
// Prints one JSON object of numbers (and the skips); bad input exits 1 with a one-line message on
// stderr.
import type { FeatureCollection, Geometry } from 'geojson';
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { computeCoverage } from '../shared/track-coverage/coverage';
import { ftToM } from '../shared/units';
import { readTrackFile } from '../server/track-coverage/read-track';
import { boundaryOf } from './plan';

const USAGE = 'usage: coverage --boundary FILE.geojson --track FILE.gpx|FILE.geojson (--width-ft N | --width-m N) [--hazards FILE.geojson]';

function num(flag: string, v: string | undefined): number | undefined {
  if (v === undefined) return undefined;
  const n = Number(v);
  if (v.trim() === '' || !Number.isFinite(n)) throw new Error(`--${flag} must be a number (got '${v}')`);
  return n;
}

function read(file: string, what: string): Buffer {
  try {
    return readFileSync(file);
  } catch {
    throw new Error(`cannot read the ${what} file '${file}'`);
  }
}

function json(file: string, what: string): unknown {
  try {
    return JSON.parse(read(file, what).toString('utf8'));
  } catch (e) {
    if ((e as Error).message.startsWith('cannot read')) throw e;
    throw new Error(`the ${what} file '${file}' is not valid JSON`, { cause: e });
  }
}

function hazardsOf(data: unknown): FeatureCollection {
  const g = data as { type?: string };
  if (g?.type === 'FeatureCollection') return data as FeatureCollection;
  if (g?.type === 'Feature') return { type: 'FeatureCollection', features: [data as FeatureCollection['features'][number]] };
  return { type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: data as Geometry }] };
}

/** Runs the CLI; returns the exit code. */
export function main(argv: string[]): number {
  try {
    const { values: v } = parseArgs({
      args: argv,
      strict: true,
      options: {
        boundary: { type: 'string' },
        track: { type: 'string' },
        'width-ft': { type: 'string' },
        'width-m': { type: 'string' },
        hazards: { type: 'string' },
      },
    });
    if (!v.boundary) throw new Error(`--boundary is required; ${USAGE}`);
    if (!v.track) throw new Error(`--track is required; ${USAGE}`);
    const ft = num('width-ft', v['width-ft']);
    const m = num('width-m', v['width-m']);
    if ((ft === undefined) === (m === undefined)) throw new Error(`give the working width once, as --width-ft or --width-m; ${USAGE}`);
    const { geometry: boundary } = boundaryOf(json(v.boundary, 'boundary'), v.boundary);
    const hazards = v.hazards ? hazardsOf(json(v.hazards, 'hazards')) : undefined;
    const track = readTrackFile(v.track, read(v.track, 'track'));
    const r = computeCoverage({ boundary, hazards, track: track.lines, widthM: ft !== undefined ? ftToM(ft) : m! });
    const out = {
      fieldAcres: r.fieldAcres,
      workRegionAcres: r.workRegionAcres,
      coveredAcres: r.coveredAcres,
      skippedAcres: r.skippedAcres,
      sliverAcres: r.sliverAcres,
      workedTwiceAcres: r.workedTwiceAcres,
      skipCount: r.skipCount,
      trackLengthM: r.trackLengthM,
      workingLengthM: r.workingLengthM,
      passCount: r.passCount,
      trackPoints: r.trackPoints,
      widthM: r.widthM,
      skips: r.skips,
    };
    process.stdout.write(JSON.stringify(out, null, 2) + '\n');
    return 0;
  } catch (e) {
    process.stderr.write(`coverage: ${(e as Error).message.replace(/\s+/g, ' ')}\n`);
    return 1;
  }
}

if (require.main === module) process.exitCode = main(process.argv.slice(2));
