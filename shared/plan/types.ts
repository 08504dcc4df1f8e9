import type { FeatureCollection, LineString, MultiPolygon, Polygon } from 'geojson';
import type { HeadingCandidate } from './auto-heading';
import type { ImplementKind } from './implement-defaults';

/** What to plan: one field, one implement, one way of working it. */
export interface PlanInput {
  /** Field boundary, GeoJSON lon/lat (RFC 7946), holes allowed. */
  boundary: Polygon | MultiPolygon;
  /** Field name for messages. */
  fieldName?: string;
  /** Hazards (Point / LineString / Polygon, Multi* ok); properties.clearanceM in metres, default 0. */
  hazards?: FeatureCollection;
  /** Implement working width, metres. */
  widthM: number;
  /** Laps around the edge before the passes; integer ≥ 0, default 2. */
  headlandPasses?: number;
  /** Degrees clockwise from true north, 0 ≤ h < 180, or 'auto' (least field time); default 'auto'. */
  headingDeg?: number | 'auto';
  /**
   * Auto heading takes a heading along one of the field's long straight edges when its field time
   * is at most this many per cent above the fastest heading's; 0 to 25, default 3 (common practice:
   * passes along the fence line; no published source).
   */
  edgeMarginPct?: number;
  /** Implement kind; gives default speed and field efficiency. */
  implementKind?: ImplementKind;
  /** Working speed, metres per second; default from the implement kind, else 5 mph (2.2352 m/s). */
  speedMps?: number;
  /** Field efficiency, 0 < e ≤ 1; default from the implement kind, else 0.75. */
  efficiency?: number;
  /** Seconds per end turn; default 20 (common practice, no published source). */
  turnSeconds?: number;
  /** 'gaps-ok' keeps even spacing and reports the strip left; 'full' adds a last pass. Default 'gaps-ok'. */
  coverage?: 'gaps-ok' | 'full';
}

/** Properties of each pass segment in {@link PlanResult.passes}. */
export interface PassProperties {
  /** Pass number, 1-based from the left-hand edge looking along the heading. */
  pass: number;
  /** Segment number within the pass, 1-based along the heading. */
  segment: number;
  headingDeg: number;
  lengthM: number;
}

/** A pass plan: numbers for people, geometries (lon/lat) for the map. */
export interface PlanResult {
  fieldAcres: number;
  headlandAcres: number;
  interiorAcres: number;
  workRegionAcres: number;
  workedAcres: number;
  unworkedAcres: number;
  overlapAcres: number;
  headingDeg: number;
  /**
   * The best few headings by field time (the one auto chooses first), each with its hours, passes
   * and turns, so the owner can pick another; empty when no heading could be weighed.
   */
  headingCandidates: HeadingCandidate[];
  /** The margin auto heading used to prefer a heading along a long straight edge, per cent. */
  edgeMarginPct: number;
  passCount: number;
  segmentCount: number;
  turns: number;
  /** Σ pass segment lengths, m. */
  passLengthM: number;
  /** Σ headland lap lengths, m. */
  headlandLengthM: number;
  /** passLengthM + headlandLengthM, m. */
  totalDistanceM: number;
  /** Driving time at speed plus turns × turnSeconds (efficiency not applied), h. */
  hours: number;
  /** Field acres ÷ effective field capacity (AEN-73 rule), h; the rule-of-thumb twin of `hours`. */
  capacityHours: number;
  /** Effective field capacity, ac/h: width × speed × efficiency (AEN-73: ft × mph × efficiency / 8.25). */
  capacityAcresPerHour: number;
  /** Effective field capacity, ha/h: width × speed × efficiency (GRDC: km/h × m × efficiency / 10). */
  capacityHaPerHour: number;
  /** Working width, metres. */
  widthM: number;
  /** Working speed, metres per second. */
  speedMps: number;
  efficiency: number;
  turnSeconds: number;
  headlandPasses: number;
  coverage: 'gaps-ok' | 'full';
  headland: Polygon | MultiPolygon | null;
  workRegion: Polygon | MultiPolygon;
  hazardZones: Polygon | MultiPolygon | null;
  passes: FeatureCollection<LineString, PassProperties>;
  unworked: FeatureCollection<Polygon | MultiPolygon>;
  overlap: FeatureCollection<Polygon | MultiPolygon>;
  warnings: string[];
}
