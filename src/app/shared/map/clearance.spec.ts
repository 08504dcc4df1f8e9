import { clearanceStrokePx, metresPerPixel } from './clearance';

describe('clearance bands', () => {
  it('when at the equator and zoom 0, then one pixel is the Web Mercator ground resolution', () => {
    expect(metresPerPixel(0, 0)).toBeCloseTo(156_543.03, 1);
  });

  it('when zooming in one level, then a pixel covers half the ground', () => {
    expect(metresPerPixel(47.6, 16) / metresPerPixel(47.6, 17)).toBeCloseTo(2, 10);
  });

  it('when a line has 30 m clearance at 47.6° N, zoom 16, then the band is about 36 px wide', () => {
    // 2.387 m/px at 0°, × cos 47.6° = 1.610 m/px; 60 m / 1.610 = 37.3 px.
    expect(clearanceStrokePx(30, 47.6, 16)).toBeCloseTo(37.3, 1);
  });
});
