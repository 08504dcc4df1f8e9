import { Geodesic } from 'geographiclib-geodesic';
import { THINNING, type RecordedFix, fixOf, keepFix } from './track-thinning';

// Points are placed with GeographicLib's direct geodesic problem on the WGS84 ellipsoid (Karney,
// "Algorithms for geodesics", J. Geodesy 2013), a general-purpose reference outside Furlong.
const WGS84 = Geodesic.WGS84;
const from: RecordedFix = { at: 1_000_000, lat: 47.6, lon: -99.9, accuracyM: 5, headingDeg: null, speedMps: null };
function moved(metres: number, azimuthDeg: number, afterMs: number, accuracyM: number | null = 5): RecordedFix {
  const r = WGS84.Direct(from.lat, from.lon, azimuthDeg, metres);
  return { ...from, at: from.at + afterMs, lat: r.lat2!, lon: r.lon2!, accuracyM };
}

describe('keepFix (the thinning rule: ≥ 1 s and ≥ 2 m apart, accuracy within 50 m)', () => {
  it('when no fix was kept yet, then the first is kept', () => {
    expect(keepFix(null, from)).toBe(true);
  });

  it.each([0, 45, 90, 180, 270])('when the phone moved 2.2 m (azimuth %i°) after 1 s, then the fix is kept', (az) => {
    expect(keepFix(from, moved(2.2, az, 1000))).toBe(true);
  });

  it.each([0, 90, 225])('when the phone moved only 1.8 m (azimuth %i°), then the fix is left out however long it stood', (az) => {
    expect(keepFix(from, moved(1.8, az, 60_000))).toBe(false);
  });

  it('when a fix comes 0.5 s after the last one kept, then it is left out even 10 m away', () => {
    expect(keepFix(from, moved(10, 0, 500))).toBe(false);
    expect(keepFix(from, moved(10, 0, THINNING.minIntervalMs))).toBe(true);
  });

  it('when a fix is less certain than 50 m, then it is left out, even as the first', () => {
    expect(keepFix(null, moved(0, 0, 0, 120))).toBe(false);
    expect(keepFix(from, moved(30, 0, 5000, 51))).toBe(false);
    expect(keepFix(from, moved(30, 0, 5000, 50))).toBe(true);
  });

  it('when a tractor drives 100 m at 5 m/s with a fix every 0.2 s, then one fix a second is kept, 5 m apart', () => {
    let last: RecordedFix | null = null;
    const kept: RecordedFix[] = [];
    for (let i = 0; i <= 100; i++) {
      const f = moved(i, 30, i * 200);
      if (keepFix(last, f)) kept.push((last = f));
    }
    expect(kept).toHaveLength(21);
    const gaps = kept.slice(1).map((f, i) => WGS84.Inverse(kept[i].lat, kept[i].lon, f.lat, f.lon).s12!);
    for (const g of gaps) expect(g).toBeCloseTo(5, 6);
  });
});

describe('fixOf', () => {
  it('when the phone gives no heading or speed (standing), then they are kept as null', () => {
    const pos = {
      timestamp: 5,
      coords: { latitude: 47.6, longitude: -99.9, accuracy: 4, heading: Number.NaN, speed: null, altitude: null, altitudeAccuracy: null },
    } as unknown as GeolocationPosition;
    expect(fixOf(pos)).toEqual({ at: 5, lat: 47.6, lon: -99.9, accuracyM: 4, headingDeg: null, speedMps: null });
  });
});
