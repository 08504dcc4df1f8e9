// Hostile boundary files: zip bombs (honest and lying sizes), too many files, XML entity bombs,
// external entities, deep nesting in XML and JSON, too many shapes or points, and a coordinate
// system for another body. Each is made here (nothing big is stored) and must be refused with a
// plain 4xx, save nothing, and leave the server answering.
import shpwrite from '@mapbox/shp-write';
import type { Feature, FeatureCollection, Position } from 'geojson';
import JSZip from 'jszip';
import zlib from 'node:zlib';
import type { Response } from 'supertest';
import { MAX_ARCHIVE_ENTRIES, MAX_FILE_FEATURES, MAX_FILE_VERTICES, MAX_NESTING_DEPTH, MAX_UNPACKED_BYTES } from '../../shared/limits';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect, rectRing } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';

const MiB = 1024 * 1024;

/** Raw deflate (RFC 1951) of `repeat` copies of `chunk` between `head` and `tail`, made in pieces. */
async function deflated(head: Buffer, chunk: Buffer, repeat: number, tail: Buffer): Promise<{ data: Buffer; crc: number; size: number }> {
  const deflate = zlib.createDeflateRaw({ level: 9 });
  const out: Buffer[] = [];
  deflate.on('data', (b: Buffer) => out.push(b));
  const done = new Promise((resolve) => deflate.on('end', resolve));
  let crc = zlib.crc32(head);
  deflate.write(head);
  for (let i = 0; i < repeat; i++) {
    crc = zlib.crc32(chunk, crc);
    if (!deflate.write(chunk)) await new Promise((r) => deflate.once('drain', r));
  }
  crc = zlib.crc32(tail, crc);
  deflate.end(tail);
  await done;
  return { data: Buffer.concat(out), crc, size: head.length + chunk.length * repeat + tail.length };
}

interface RawEntry {
  name: string;
  method: 0 | 8;
  data: Buffer;
  crc: number;
  /** The uncompressed size written in the headers: the real one, or a lie. */
  listedSize: number;
}

const stored = (name: string, content: Buffer | string): RawEntry => {
  const data = Buffer.isBuffer(content) ? content : Buffer.from(content);
  return { name, method: 0, data, crc: zlib.crc32(data), listedSize: data.length };
};

/**
 * A zip written byte by byte (PKWARE APPNOTE.TXT 4.3.7 local header, 4.3.12 central directory
 * header, 4.3.16 end of central directory; layout recalled from memory and checked below by
 * reading an honest one back with JSZip, an independent reader), so a size can be made to lie.
 */
function writeZip(entries: RawEntry[]): Buffer {
  const locals: Buffer[] = [];
  const centrals: Buffer[] = [];
  let offset = 0;
  for (const e of entries) {
    const name = Buffer.from(e.name);
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(20, 4);
    local.writeUInt16LE(e.method, 8);
    local.writeUInt16LE(0x21, 12); // 1980-01-01
    local.writeUInt32LE(e.crc >>> 0, 14);
    local.writeUInt32LE(e.data.length, 18);
    local.writeUInt32LE(e.listedSize, 22);
    local.writeUInt16LE(name.length, 26);
    const central = Buffer.alloc(46);
    central.writeUInt32LE(0x02014b50, 0);
    central.writeUInt16LE(20, 4);
    central.writeUInt16LE(20, 6);
    central.writeUInt16LE(e.method, 10);
    central.writeUInt16LE(0x21, 14);
    central.writeUInt32LE(e.crc >>> 0, 16);
    central.writeUInt32LE(e.data.length, 20);
    central.writeUInt32LE(e.listedSize, 24);
    central.writeUInt16LE(name.length, 28);
    central.writeUInt32LE(offset, 42);
    locals.push(local, name, e.data);
    centrals.push(central, name);
    offset += 30 + name.length + e.data.length;
  }
  const cd = Buffer.concat(centrals);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(entries.length, 8);
  end.writeUInt16LE(entries.length, 10);
  end.writeUInt32LE(cd.length, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...locals, cd, end]);
}

// WGS 84 in ESRI WKT (EPSG:4326; a = 6,378,137 m, EPSG:7030).
const WGS84_PRJ =
  'GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,298.257223563]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]]';
// Mars: equatorial radius 3,396.19 km (JPL HORIZONS physical data for Mars, 499); ESRI WKT layout from memory.
const MARS_PRJ =
  'GEOGCS["GCS_Mars_2000",DATUM["D_Mars_2000",SPHEROID["Mars_2000_IAU_IAG",3396190.0,169.8944472236118]],PRIMEM["Reference_Meridian",0.0],UNIT["Degree",0.0174532925199433]]';

const field = (name: string, i: number): Feature => ({
  type: 'Feature',
  properties: { name },
  geometry: rect(-99.9 + (i % 100) * 0.02, 47.6 + Math.floor(i / 100) * 0.02, 0.01, 0.007),
});

async function shapefileZip(fc: FeatureCollection): Promise<Buffer> {
  const multi: FeatureCollection = {
    type: 'FeatureCollection',
    features: fc.features.map((f) =>
      f.geometry.type === 'Polygon' ? { ...f, geometry: { type: 'MultiPolygon', coordinates: [f.geometry.coordinates] } } : f,
    ),
  };
  return (await shpwrite.zip(multi, { outputType: 'nodebuffer' } as never)) as unknown as Buffer;
}

async function rezip(zipBuf: Buffer, edit: (zip: JSZip) => Promise<void> | void): Promise<Buffer> {
  const zip = await JSZip.loadAsync(zipBuf);
  await edit(zip);
  return zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' });
}

const rssMb = () => Math.round(process.memoryUsage().rss / MiB);

describe('hostile boundary files', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let rssBefore = 0;
  const count = async () => Number((await t.db('fields').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);
  const upload = (name: string, data: Buffer | string) =>
    owner.agent
      .post('/api/fields/import?dryRun=false')
      .set('X-XSRF-TOKEN', owner.xsrf)
      .attach('file', Buffer.isBuffer(data) ? data : Buffer.from(data), name);

  /** Refused with a plain message, nothing saved, and the server still answers a normal request. */
  async function refused(send: () => Promise<Response>, code: string, message: RegExp): Promise<Response> {
    const before = await count();
    const res = await send();
    expect(res.status).toBeGreaterThanOrEqual(400);
    expect(res.status).toBeLessThan(500);
    expect(res.body.error.code).toBe(code);
    expect(res.body.error.message).toMatch(message);
    // A plain sentence: no stack trace, no library internals.
    expect(res.body.error.message).not.toMatch(/\n|\bat \w+ \(|RangeError|TypeError|node_modules/);
    expect(await count()).toBe(before);
    const list = await owner.get('/api/fields');
    expect(list.status).toBe(200);
    return res;
  }

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Bombs');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    // One ordinary import first, so the workers and parsers are loaded before the baseline.
    const ok = await upload('warm.geojson', JSON.stringify({ type: 'FeatureCollection', features: [field('Warm-up', 0)] }));
    expect(`${ok.status} ${JSON.stringify(ok.body)}`).toMatch(/^201 /);
    rssBefore = rssMb();
  });

  afterAll(async () => {
    await t.close();
  });

  describe('zips', () => {
    it('when the hand-written zip is honest, then an independent reader (JSZip) reads it back', async () => {
      const z = await deflated(Buffer.from('head'), Buffer.alloc(1024), 3, Buffer.from('tail'));
      const buf = writeZip([{ name: 'a.bin', method: 8, data: z.data, crc: z.crc, listedSize: z.size }, stored('b.txt', 'hello')]);
      const zip = await JSZip.loadAsync(buf, { checkCRC32: true });
      expect((await zip.file('a.bin')!.async('nodebuffer')).length).toBe(8 + 3072);
      expect(await zip.file('b.txt')!.async('string')).toBe('hello');
    });

    it('when a zip lists a .shp that unpacks to 200 MB (honestly), then 413 before anything is inflated', async () => {
      const shp = await deflated(Buffer.alloc(0), Buffer.alloc(MiB), 200, Buffer.alloc(0));
      expect(shp.data.length).toBeLessThan(MiB); // a few hundred kB on the wire
      const buf = writeZip([
        { name: 'bomb.shp', method: 8, data: shp.data, crc: shp.crc, listedSize: shp.size },
        stored('bomb.dbf', 'x'),
        stored('bomb.prj', WGS84_PRJ),
      ]);
      await refused(
        () => upload('bomb.zip', buf),
        'too_large',
        /^The zip unpacks to 200 MB; Furlong reads at most 64 MB of unpacked files per upload$/,
      );
    });

    it('when a zip lists 1.2 GB, then the message says 1.2 GB', async () => {
      const shp = await deflated(Buffer.alloc(0), Buffer.alloc(MiB), 4, Buffer.alloc(0));
      const listed = Math.round(1.2 * 1024 ** 3);
      const buf = writeZip([
        { name: 'bomb.shp', method: 8, data: shp.data, crc: shp.crc, listedSize: listed },
        stored('bomb.dbf', 'x'),
        stored('bomb.prj', WGS84_PRJ),
      ]);
      await refused(() => upload('bomb.zip', buf), 'too_large', /^The zip unpacks to 1\.2 GB; Furlong reads at most 64 MB/);
    });

    it('when a zip lies (lists 1 kB, holds 200 MB of zeros), then inflating stops early and 422 says it is damaged', async () => {
      const shp = await deflated(Buffer.alloc(0), Buffer.alloc(MiB), 200, Buffer.alloc(0));
      const buf = writeZip([
        stored('liar.dbf', 'x'),
        stored('liar.prj', WGS84_PRJ),
        { name: 'liar.shp', method: 8, data: shp.data, crc: shp.crc, listedSize: 1024 },
      ]);
      await refused(
        () => upload('liar.zip', buf),
        'bad_file',
        /^The zip is damaged: liar\.shp unpacks to a different size than the zip lists for it$/,
      );
    });

    it(`when a KMZ's doc.kml unpacks to more than ${MAX_UNPACKED_BYTES / MiB} MB, then 413`, async () => {
      const kml = await deflated(
        Buffer.from('<kml xmlns="http://www.opengis.net/kml/2.2"><Document>'),
        Buffer.alloc(MiB, 0x20),
        70,
        Buffer.from('</Document></kml>'),
      );
      const buf = writeZip([{ name: 'doc.kml', method: 8, data: kml.data, crc: kml.crc, listedSize: kml.size }]);
      await refused(() => upload('big.kmz', buf), 'too_large', /^The KMZ unpacks to 70 MB; Furlong reads at most 64 MB/);
    });

    it(`when a KMZ holds more than ${MAX_ARCHIVE_ENTRIES} files, then 422 before any is read`, async () => {
      const zip = new JSZip();
      zip.file('doc.kml', '<kml xmlns="http://www.opengis.net/kml/2.2"><Document/></kml>');
      for (let i = 0; i < MAX_ARCHIVE_ENTRIES + 1; i++) zip.file(`icon-${i}.txt`, 'x');
      const buf = await zip.generateAsync({ type: 'nodebuffer' });
      await refused(
        () => upload('many.kmz', buf),
        'file_too_complex',
        /^The KMZ holds 502 files; Furlong reads at most 500 files in one upload$/,
      );
    });
  });

  describe('XML', () => {
    it('when a KML is a billion-laughs entity bomb, then 422 before it is parsed', async () => {
      const lol = ['<!ENTITY lol0 "lol">'];
      for (let i = 1; i <= 9; i++) lol.push(`<!ENTITY lol${i} "${`&lol${i - 1};`.repeat(10)}">`);
      const kml = `<?xml version="1.0"?><!DOCTYPE kml [${lol.join('')}]><kml xmlns="http://www.opengis.net/kml/2.2"><Document><name>&lol9;</name></Document></kml>`;
      await refused(() => upload('laughs.kml', kml), 'bad_file', /declares a document type or entities/);
    });

    it('when a KML names an external entity (a file on the server), then 422 and nothing of the file comes back', async () => {
      const kml =
        '<?xml version="1.0"?><!DOCTYPE kml [<!ENTITY xxe SYSTEM "file:///etc/passwd">]>' +
        `<kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><name>&xxe;</name><Polygon><outerBoundaryIs><LinearRing><coordinates>${rectRing(-99.9, 47.6, 0.01, 0.007).join(' ')}</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark></kml>`;
      const res = await refused(() => upload('xxe.kml', kml), 'bad_file', /declares a document type or entities/);
      expect(JSON.stringify(res.body)).not.toMatch(/root:/);
    });

    it('when a KML nests folders 10,000 deep, then 422 names the limit', async () => {
      const kml = `<kml xmlns="http://www.opengis.net/kml/2.2">${'<Folder>'.repeat(10_000)}${'</Folder>'.repeat(10_000)}</kml>`;
      await refused(() => upload('deep.kml', kml), 'file_too_complex', new RegExp(`more than ${MAX_NESTING_DEPTH} deep`));
    });
  });

  describe('JSON', () => {
    it('when a GeoJSON nests lists 100,000 deep, then 422 before it is parsed', async () => {
      const text = '['.repeat(100_000) + ']'.repeat(100_000);
      await refused(() => upload('deep.geojson', text), 'file_too_complex', new RegExp(`more than ${MAX_NESTING_DEPTH} deep`));
    });

    it('when a GeoJSON nests inside strings only, then the strings do not count as depth', async () => {
      const fc = {
        type: 'FeatureCollection',
        features: [{ ...field('Brackets', 3), properties: { name: 'Brackets', note: '[[[[{{{{'.repeat(100) } }],
      };
      const res = await owner.agent
        .post('/api/fields/import?dryRun=true')
        .set('X-XSRF-TOKEN', owner.xsrf)
        .attach('file', Buffer.from(JSON.stringify(fc)), 'ok.geojson');
      expect(res.status).toBe(200);
      expect(res.body.features).toHaveLength(1);
    });

    it(`when a GeoJSON holds 3,000 shapes (more than ${MAX_FILE_FEATURES}), then 422 names both counts`, async () => {
      const fc = { type: 'FeatureCollection', features: Array.from({ length: 3000 }, (_, i) => field(`F${i}`, i)) };
      await refused(
        () => upload('many.geojson', JSON.stringify(fc)),
        'file_too_complex',
        /^The GeoJSON file holds 3,000 shapes; Furlong reads at most 2,000 shapes from one file$/,
      );
    });

    it(`when a GeoJSON holds 600,000 points (more than ${MAX_FILE_VERTICES}), then 422 names both counts`, async () => {
      // Ten shapes of 60,000 points each. Their shape does not matter (the count is checked before
      // any shape is), so the points are short to keep the file under the 10 MB upload limit.
      const ring = (): Position[] => Array.from({ length: 60_000 }, (_, i) => [-99 - (i % 10) / 10, 47 + (Math.floor(i / 10) % 10) / 10]);
      const fc = {
        type: 'FeatureCollection',
        features: Array.from({ length: 10 }, (_, k) => ({
          type: 'Feature',
          properties: { name: `Big ${k}` },
          geometry: { type: 'Polygon', coordinates: [ring()] },
        })),
      };
      const text = JSON.stringify(fc);
      expect(text.length).toBeLessThan(10 * MiB); // within the upload limit, so this check is the one that refuses it
      await refused(
        () => upload('points.geojson', text),
        'file_too_complex',
        /^The GeoJSON file holds 600,000 points in its shapes; Furlong reads at most 500,000 points from one file$/,
      );
    });
  });

  describe('shapefiles', () => {
    it('when the .prj is for Mars, then 422 says it is for another body', async () => {
      const buf = await rezip(await shapefileZip({ type: 'FeatureCollection', features: [field('Red', 0)] }), (z) => {
        z.file('POLYGON.prj', MARS_PRJ);
      });
      await refused(
        () => upload('mars.zip', buf),
        'bad_file',
        /^The coordinate system in POLYGON\.prj is for another body \(semi-major axis 3,396,190 m\); Furlong maps fields on Earth$/,
      );
    });

    it(`when a .shp holds more than ${MAX_FILE_FEATURES} shapes, then 422 from its record headers`, async () => {
      const fc = {
        type: 'FeatureCollection' as const,
        features: Array.from({ length: MAX_FILE_FEATURES + 5 }, (_, i) => field(`S${i}`, i)),
      };
      await refused(
        async () => upload('many.zip', await shapefileZip(fc)),
        'file_too_complex',
        /^POLYGON\.shp holds more than 2,000 shapes/,
      );
    });

    it('when the .dbf header claims four billion rows, then 422 before its rows are read', async () => {
      const buf = await rezip(await shapefileZip({ type: 'FeatureCollection', features: [field('Rows', 0)] }), async (z) => {
        const dbf = await z.file('POLYGON.dbf')!.async('nodebuffer');
        dbf.writeUInt32LE(4_000_000_000, 4); // dBASE header: record count at byte 4
        z.file('POLYGON.dbf', dbf);
      });
      await refused(
        () => upload('rows.zip', buf),
        'file_too_complex',
        /^POLYGON\.dbf lists 4,000,000,000 rows; Furlong reads at most 2,000/,
      );
    });
  });

  it('when every hostile file has been refused, then an ordinary file still imports and memory has not grown by more than 300 MB', async () => {
    const res = await upload('after.geojson', JSON.stringify({ type: 'FeatureCollection', features: [field('After', 1)] }));
    expect(res.status).toBe(201);
    const after = rssMb();
    // Printed for the reader; the bound is generous (common practice, no published source).
    console.log(`import bombs: RSS ${rssBefore} MB before, ${after} MB after`);
    expect(after - rssBefore).toBeLessThan(300);
  });
});
