import { EARTH_SEMI_MAJOR_M, prjNotOnEarth, readBody } from './prj-check';

// Earth ellipsoids, each as its registry publishes it.
// WGS 84: a = 6,378,137 m, 1/f = 298.257223563 (EPSG:7030; also NIMA TR8350.2 table 3.1, recalled from memory).
const WGS84_GEOG =
  'GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,298.257223563]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]]';
// Clarke 1866: a = 6,378,206.4 m, 1/f = 294.978698213898 (EPSG:7008, ESRI WKT as epsg.io prints it).
const NAD27 =
  'GEOGCS["GCS_North_American_1927",DATUM["D_North_American_1927",SPHEROID["Clarke_1866",6378206.4,294.978698213898]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]]';
// GRS 1980: a = 6,378,137 m (EPSG:7019), 1/f = 298.257222101 (recalled from memory), in WKT 2 with its LENGTHUNIT.
const NAD83_WKT2 =
  'GEOGCRS["NAD83",DATUM["North American Datum 1983",ELLIPSOID["GRS 1980",6378137,298.257222101,LENGTHUNIT["metre",1]]],PRIMEM["Greenwich",0,ANGLEUNIT["degree",0.0174532925199433]],CS[ellipsoidal,2],AXIS["latitude",north,ORDER[1]],AXIS["longitude",east,ORDER[2]],ID["EPSG",4269]]';
// Bessel 1841: a = 6,377,397.155 m (EPSG:7004; PROJ's ellipsoid table), 1/f = 299.1528128 (recalled from memory).
const BESSEL =
  'geogcs["GCS_Bessel_1841",datum["D_Bessel_1841",spheroid["Bessel_1841",6377397.155,299.1528128]],primem["Greenwich",0],unit["Degree",0.0174532925199433]]';
// Clarke 1858 given in Clarke's feet: 20,926,348 ft × 0.3047972654 m/ft = 6,378,293.645 m (EPSG:7007 WKT 2 on epsg.io).
const CLARKE_1858_FEET =
  'GEOGCRS["Unknown datum based upon the Clarke 1858 ellipsoid",DATUM["Not specified (based on Clarke 1858 ellipsoid)",ELLIPSOID["Clarke 1858",20926348,294.260676369261,LENGTHUNIT["Clarke\'s foot",0.3047972654]]],PRIMEM["Greenwich",0]]';
// WGS 84 / UTM zone 14N, projected (EPSG:32614), as GIS programs write it.
const UTM14N =
  'PROJCS["WGS_1984_UTM_Zone_14N",GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,298.257223563]],' +
  'PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Transverse_Mercator"],PARAMETER["False_Easting",500000.0],' +
  'PARAMETER["False_Northing",0.0],PARAMETER["Central_Meridian",-99.0],PARAMETER["Scale_Factor",0.9996],PARAMETER["Latitude_Of_Origin",0.0],UNIT["Meter",1.0]]';

// Other bodies. Mars equatorial radius 3,396.19 km (JPL HORIZONS physical data for Mars, 499);
// the ESRI-style WKT layout around it is written from memory.
const MARS =
  'GEOGCS["GCS_Mars_2000",DATUM["D_Mars_2000",SPHEROID["Mars_2000_IAU_IAG",3396190.0,169.8944472236118]],PRIMEM["Reference_Meridian",0.0],UNIT["Degree",0.0174532925199433]]';
// The Moon's mean radius 1,737.4 km (IAU working group value, recalled from memory), as a sphere.
const MOON_WKT2 =
  'GEOGCRS["Moon 2000",DATUM["Moon 2000",ELLIPSOID["Moon 2000 (IAU)",1737400,0,LENGTHUNIT["metre",1]]],PRIMEM["Reference Meridian",0]]';

describe('prjNotOnEarth', () => {
  it('when the .prj is on a published Earth ellipsoid (WGS 84, Clarke 1866, GRS 1980, Bessel 1841, UTM 14N), then it is accepted', () => {
    for (const wkt of [WGS84_GEOG, NAD27, NAD83_WKT2, BESSEL, UTM14N]) expect(prjNotOnEarth(wkt, 'f.prj')).toBeNull();
  });

  it('when the axes are read, then they are the published values (EPSG:7030, 7008, 7019, 7004)', () => {
    expect(readBody(WGS84_GEOG).semiMajorM).toEqual([6378137]);
    expect(readBody(NAD27).semiMajorM).toEqual([6378206.4]);
    expect(readBody(NAD83_WKT2).semiMajorM).toEqual([6378137]);
    expect(readBody(BESSEL).semiMajorM).toEqual([6377397.155]);
    expect(readBody(BESSEL).names).toEqual(['GCS_Bessel_1841', 'D_Bessel_1841', 'Bessel_1841']);
  });

  it('when WKT 2 gives the axis in another length unit, then it is converted to metres (Clarke 1858 in Clarke feet, EPSG:7007)', () => {
    const [a] = readBody(CLARKE_1858_FEET).semiMajorM;
    // EPSG's ESRI WKT for the same ellipsoid gives 6,378,293.64520876 m.
    expect(a).toBeCloseTo(6378293.64520876, 3);
    expect(prjNotOnEarth(CLARKE_1858_FEET, 'f.prj')).toBeNull();
  });

  it('when the .prj is on Mars, then it is refused naming the axis in plain words', () => {
    expect(prjNotOnEarth(MARS, 'mars.prj')).toBe(
      'The coordinate system in mars.prj is for another body (semi-major axis 3,396,190 m); Furlong maps fields on Earth',
    );
  });

  it('when the .prj is on the Moon (WKT 2), then it is refused', () => {
    expect(prjNotOnEarth(MOON_WKT2, 'moon.prj')).toContain('(semi-major axis 1,737,400 m)');
  });

  it('when the .prj has only a Martian datum name and no readable ellipsoid, then the name refuses it', () => {
    expect(prjNotOnEarth('GEOGCS["GCS_Mars_2000",DATUM["D_Mars_2000"],UNIT["Degree",0.0174532925199433]]', 'x.prj')).toContain(
      '(datum GCS_Mars_2000)',
    );
  });

  it('when an Earth ellipsoid has a name that shares a word with a planet, then the axis decides and it is accepted', () => {
    // Fischer 1960 (Mercury): a = 6,378,166 m (recalled from memory).
    expect(prjNotOnEarth('GEOGCS["Mercury",DATUM["D_Fischer_1960",SPHEROID["Fischer 1960 (Mercury)",6378166,298.3]]]', 'x.prj')).toBeNull();
  });

  it('when a PROJ string gives a Mars radius, then it is refused; an Earth one is accepted', () => {
    expect(prjNotOnEarth('+proj=eqc +lat_ts=0 +lon_0=0 +a=3396190 +b=3396190 +units=m +no_defs', 'p.prj')).toContain('3,396,190 m');
    expect(prjNotOnEarth('+proj=longlat +datum=WGS84 +no_defs', 'p.prj')).toBeNull();
    expect(prjNotOnEarth('+proj=longlat +R=6371000 +no_defs', 'p.prj')).toBeNull();
  });

  it('when the axis is just outside the accepted band on either side, then it is refused', () => {
    const wkt = (a: number) => `GEOGCS["x",DATUM["x",SPHEROID["x",${a},0]]]`;
    expect(prjNotOnEarth(wkt(EARTH_SEMI_MAJOR_M.min - 1), 'x.prj')).not.toBeNull();
    expect(prjNotOnEarth(wkt(EARTH_SEMI_MAJOR_M.max + 1), 'x.prj')).not.toBeNull();
    expect(prjNotOnEarth(wkt(0), 'x.prj')).toContain('no usable size');
  });

  it('when the text is not well-formed WKT or is deeply nested, then it answers quickly without throwing', () => {
    expect(prjNotOnEarth('GEOGCS["x",DATUM["unterminated', 'x.prj')).toBeNull();
    expect(prjNotOnEarth('A['.repeat(100_000), 'x.prj')).toBeNull();
  });
});
