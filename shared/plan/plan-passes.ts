import type { Feature, LineString, MultiPolygon, Polygon } from 'geojson';
import { fieldArea } from '../geo/geodesic-area';
import { projectionForField } from '../geo/local-projection';
import { MAX_PASSES } from '../limits';
import { HOUR_S, m2ToAcres } from '../units';
import { chooseHeading, longStraightEdges, turnsOf, type HeadingChoice } from './auto-heading';
import { fieldCapacityAcPerH, fieldCapacityHaPerH } from './field-capacity';
import { formatAcres, formatHeading } from '../figures';
import { fieldName, lengthText, widthText } from './format';
import { difference, hazardZones, offset, readJsts, writePolygonal } from './jsts-ops';
import { createPassClipper } from './pass-clipper';
import { packRegion, regionAreaM2 } from './planar-region';
import { bandPolygons } from './band-polygons';
import { headlandLapsM } from './headland-laps';
import { resolvePlanInput } from './resolve-plan-input';
import { swathCoverage } from './swath-coverage';
import type { PassProperties, PlanInput, PlanResult } from './types';

/**
 * Below this many acres a gap is not worth a warning: what would read "0.0 ac" at the one decimal
 * every acre figure has (shared/figures.ts).
 */
const WARN_ACRES = 0.05;

/**
 * Plans straight back-and-forth passes over a field: headland laps around the edge, parallel passes
 * over the interior minus hazard clearances, worked / unworked / overlap acres, turns and hours.
 *
 * Method: the field is projected once to a transverse Mercator plane centred on it (metres). The
 * interior is the boundary offset inward by headlandPasses × width (JTS buffer, round joins);
 * hazards are offset by their clearance and taken out of it to give the work region. Passes are
 * clipped to the work region by a scanline clipper; swath areas come from half-plane clips. Plane
 * areas are scaled by geodesic ÷ plane area of the whole field (a correction of order 1e-8 at field
 * size) so headland + interior = field acres on the WGS84 ellipsoid.
 *
 * Headland laps are driven at width/2, 1.5 × width, … in from the boundary; their lengths are
 * interpolated between the boundary's and the interior's perimeter (see headlandLapsM).
 *
 * Hours = (pass length + headland laps) ÷ speed + turns × turn time. Field efficiency is not
 * applied to it (turn time is already counted); `capacityHours` gives the AEN-73 rule-of-thumb twin.
 * Auto heading takes the least of these hours, preferring a heading along a long straight edge of
 * the field within `edgeMarginPct` (see chooseHeading); the best few headings come back as
 * `headingCandidates`.
 *
 * @param input field, implement and way of working (see PlanInput)
 * @returns numbers and lon/lat geometries for the map
 * @throws Error with a plain message when the input cannot be planned
 * @example
 * const plan = planPasses({ boundary, fieldName: 'North Quarter', widthM: ftToM(60) });
 * plan.passCount; plan.turns; plan.hours;
 */
export function planPasses(input: PlanInput): PlanResult {
  const p = resolvePlanInput(input);
  const field = fieldName(p.label);
  const w = p.widthM;
  const proj = projectionForField(p.boundary);
  const boundaryXY = proj.forwardGeometry(p.boundary);
  const fieldJ = readJsts(boundaryXY);
  const env = fieldJ.getEnvelopeInternal();
  const span = Math.hypot(env.getWidth(), env.getHeight());
  if (w >= span) throw new Error(`The working width (${widthText(w)}) is wider than ${field} (at most ${lengthText(span)} across)`);
  // Budget, before any heavy work: no heading needs more lines than the field's diagonal ÷ width.
  const mostPasses = Math.ceil(span / w);
  if (mostPasses > MAX_PASSES)
    throw new Error(
      `At a working width of ${widthText(w)}, ${field} could need up to ${mostPasses.toLocaleString('en-US')} passes; Furlong plans at most ${MAX_PASSES.toLocaleString('en-US')} passes per field (enough for a two-mile field at a 10 ft implement). Check the working width.`,
    );

  // The field's area on the ellipsoid, from the one place a boundary's acres come from.
  const { areaM2: fieldM2, acres: fieldAcresValue } = fieldArea(p.boundary);
  const scale = fieldM2 / fieldJ.getArea();
  const headlandM = p.headlandPasses * w;
  const interiorJ = headlandM > 0 ? offset(fieldJ, -headlandM) : fieldJ;
  if (interiorJ.isEmpty() || interiorJ.getArea() <= 0)
    throw new Error(
      `The headland (${p.headlandPasses} passes × ${widthText(w)} = ${widthText(headlandM)}) leaves nothing of ${field} to work`,
    );

  const hazardsXY = p.hazards && {
    ...p.hazards,
    features: p.hazards.features.map((f) => ({ ...f, geometry: proj.forwardGeometry(f.geometry) })),
  };
  const zonesJ = hazardZones(hazardsXY);
  const workJ = zonesJ ? difference(interiorJ, zonesJ) : interiorJ;
  const workXY = writePolygonal(workJ);
  if (!workXY) throw new Error(`Hazard clearances cover all of ${field} inside the headland; nothing is left to work`);
  const region = packRegion(workXY);
  const clipper = createPassClipper(region, w);

  const speedMps = p.speedMps;
  const headlandLengthM = headlandLapsM(fieldJ.getLength(), interiorJ.getLength(), p.headlandPasses);
  // The headings weighed for auto are offered to the owner whatever the heading in use, so a
  // heading chosen by hand can be compared with them; with a hand-set heading a scan that cannot
  // be done (every heading over budget) only leaves the list empty.
  const weigh = (): HeadingChoice =>
    chooseHeading(clipper, region, longStraightEdges(boundaryXY), {
      speedMps,
      turnSeconds: p.turnSeconds,
      fixedDistanceM: headlandLengthM,
      widthM: w,
      coverage: p.coverage,
      edgeMarginPct: p.edgeMarginPct,
    });
  let choice: HeadingChoice | null;
  if (p.heading === 'auto') choice = weigh();
  else {
    try {
      choice = weigh();
    } catch {
      choice = null;
    }
  }
  const heading = p.heading === 'auto' ? choice!.chosen.headingDeg : p.heading;
  let clipped = clipper.clip(heading);
  const warnings: string[] = [];
  if (p.coverage === 'full') {
    const coveredTo = clipped.uMin + clipped.us.length * w;
    if (coveredTo < clipped.uMax - 1e-9) clipped = clipper.clip(heading, [clipped.uMax - w / 2]);
  }
  if (clipped.passCount === 0)
    throw new Error(
      `No pass fits in ${field} at heading ${formatHeading(heading, 180)}: what is left to work is narrower than half the working width (${widthText(w / 2)})`,
    );
  const cover = swathCoverage(region, clipped, w);

  const interiorM2 = interiorJ.getArea() * scale;
  const workM2 = regionAreaM2(region) * scale;
  const turns = turnsOf(clipped);
  const hours = (clipped.passLengthM + headlandLengthM) / speedMps / HOUR_S + (turns * p.turnSeconds) / HOUR_S;
  const capacityAcresPerHour = fieldCapacityAcPerH(w, speedMps, p.efficiency);

  const unworkedAcres = m2ToAcres(cover.unworkedM2 * scale);
  const overlapAcres = m2ToAcres(cover.overlapM2 * scale);
  if (p.coverage === 'gaps-ok' && unworkedAcres >= WARN_ACRES)
    warnings.push(`${formatAcres(unworkedAcres)} of ${field} stay unworked at even spacing; choose full coverage to add a last pass`);
  if (p.coverage === 'full' && unworkedAcres >= WARN_ACRES)
    warnings.push(`${formatAcres(unworkedAcres)} of ${field} stay unworked where holes or hazard clearances break up the passes`);

  const toLonLat = <G extends Polygon | MultiPolygon>(g: G | null): G | null => (g ? proj.inverseGeometry(g) : null);
  const features = <G extends Polygon | MultiPolygon>(gs: (G | null)[]): Feature<G>[] =>
    gs.filter((g): g is G => !!g).map((g) => ({ type: 'Feature', properties: {}, geometry: proj.inverseGeometry(g) }));
  const c = clipped;
  const passes: Feature<LineString, PassProperties>[] = [];
  const passNo = new Map<number, number>();
  for (let s = 0; s < c.segmentCount; s++) {
    const k = c.segLine[s];
    if (!passNo.has(k)) passNo.set(k, passNo.size + 1);
    const [t0, t1] = [c.segT[2 * s], c.segT[2 * s + 1]];
    const segment = s > 0 && c.segLine[s - 1] === k ? passes[passes.length - 1].properties.segment + 1 : 1;
    const at = (t: number): number[] => proj.inverse([c.us[k] * c.cos + t * c.sin, -c.us[k] * c.sin + t * c.cos]);
    passes.push({
      type: 'Feature',
      properties: { pass: passNo.get(k)!, segment, headingDeg: heading, lengthM: t1 - t0 },
      geometry: { type: 'LineString', coordinates: [at(t0), at(t1)] },
    });
  }

  return {
    fieldAcres: fieldAcresValue,
    headlandAcres: Math.max(0, m2ToAcres(fieldM2 - interiorM2)),
    interiorAcres: m2ToAcres(interiorM2),
    workRegionAcres: m2ToAcres(workM2),
    workedAcres: m2ToAcres(cover.workedM2 * scale),
    unworkedAcres,
    overlapAcres,
    headingDeg: heading,
    headingCandidates: choice?.candidates ?? [],
    edgeMarginPct: p.edgeMarginPct,
    passCount: c.passCount,
    segmentCount: c.segmentCount,
    turns,
    passLengthM: c.passLengthM,
    headlandLengthM,
    totalDistanceM: c.passLengthM + headlandLengthM,
    hours,
    capacityHours: fieldAcresValue / capacityAcresPerHour,
    capacityAcresPerHour,
    capacityHaPerHour: fieldCapacityHaPerH(w, speedMps, p.efficiency),
    widthM: w,
    speedMps,
    efficiency: p.efficiency,
    turnSeconds: p.turnSeconds,
    headlandPasses: p.headlandPasses,
    coverage: p.coverage,
    headland: headlandM > 0 ? toLonLat(writePolygonal(difference(fieldJ, interiorJ))) : null,
    workRegion: proj.inverseGeometry(region.geometry),
    hazardZones: toLonLat(zonesJ ? writePolygonal(zonesJ) : null),
    passes: { type: 'FeatureCollection', features: passes },
    unworked: { type: 'FeatureCollection', features: features(bandPolygons(workJ, c, cover.gapBands).map(writePolygonal)) },
    overlap: { type: 'FeatureCollection', features: features(bandPolygons(workJ, c, cover.overlapBands).map(writePolygonal)) },
    warnings,
  };
}
