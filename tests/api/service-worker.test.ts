// The service worker's files as the server sends them. The app is "built" here in small: a page,
// a script, styles, a font and an icon, with ngsw.json made from the project's ngsw-config.json by
// Angular's own generator (the code `ng build` runs) and the worker script copied from its package,
// so this runs without a full build (the API tests run before it); the browser test
// (tests/browser/offline-shell.test.ts) runs the real build in a real browser.
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { startTestApp, type TestApp } from '../support/test-app';

const root = path.resolve(__dirname, '..', '..');
const swPackage = path.join(root, 'node_modules', '@angular', 'service-worker');

interface Manifest {
  index: string;
  assetGroups: Array<{ name: string; installMode: string; urls: string[] }>;
  dataGroups: Array<{ name: string; patterns: string[] }>;
  hashTable: Record<string, string>;
  navigationUrls: Array<{ positive: boolean; regex: string }>;
}

function buildSmallApp(): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'furlong-sw-'));
  fs.mkdirSync(path.join(dir, 'media'));
  fs.mkdirSync(path.join(dir, 'leaflet'));
  fs.copyFileSync(path.join(root, 'src', 'index.html'), path.join(dir, 'index.html'));
  fs.writeFileSync(path.join(dir, 'main-TESTHASH.js'), 'document.title = "Furlong";\n');
  fs.writeFileSync(path.join(dir, 'chunk-LAZYRUN.js'), 'export const runSheet = 1;\n');
  fs.writeFileSync(path.join(dir, 'styles-TESTHASH.css'), 'body { margin: 0; }\n');
  fs.copyFileSync(path.join(root, 'src', 'public', 'favicon.svg'), path.join(dir, 'favicon.svg'));
  const roboto = path.join(root, 'node_modules', '@fontsource', 'roboto', 'files');
  fs.copyFileSync(path.join(roboto, 'roboto-latin-400-normal.woff2'), path.join(dir, 'media', 'roboto-latin-400-normal-TEST.woff2'));
  fs.copyFileSync(path.join(roboto, 'roboto-latin-400-normal.woff'), path.join(dir, 'media', 'roboto-latin-400-normal-TEST.woff'));
  fs.copyFileSync(
    path.join(root, 'node_modules', 'leaflet', 'dist', 'images', 'marker-icon.png'),
    path.join(dir, 'leaflet', 'marker-icon.png'),
  );
  fs.copyFileSync(path.join(root, 'src', 'public', 'furlong-sw.js'), path.join(dir, 'furlong-sw.js'));
  // Angular's generator takes both paths relative to its working folder.
  execFileSync(process.execPath, [path.join(swPackage, 'ngsw-config.js'), '.', path.relative(dir, path.join(root, 'ngsw-config.json'))], {
    cwd: dir,
  });
  for (const f of ['ngsw-worker.js', 'safety-worker.js']) fs.copyFileSync(path.join(swPackage, f), path.join(dir, f));
  return dir;
}

const directives = (csp: string | undefined): Map<string, string[]> =>
  new Map(
    (csp ?? '')
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .filter((d) => d[0])
      .map(([name, ...values]) => [name, values]),
  );

describe('The service worker files of the built app', () => {
  let t: TestApp;
  let dir: string;
  let manifest: Manifest;
  const before = process.env.FURLONG_STATIC_DIR;

  beforeAll(async () => {
    dir = buildSmallApp();
    manifest = JSON.parse(fs.readFileSync(path.join(dir, 'ngsw.json'), 'utf8')) as Manifest;
    process.env.FURLONG_STATIC_DIR = dir;
    t = await startTestApp({ MAP_TILE_URL: 'https://{s}.tiles.example/{z}/{x}/{y}.png' });
  });
  afterAll(async () => {
    if (before === undefined) delete process.env.FURLONG_STATIC_DIR;
    else process.env.FURLONG_STATIC_DIR = before;
    await t.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('when the browser asks for /ngsw-worker.js, then it gets the worker as JavaScript, to be checked again on every start, under a policy that lets it fetch the map tiles', async () => {
    const res = await request(t.app).get('/ngsw-worker.js');
    expect(res.status).toBe(200);
    // W3C Service Workers, Update algorithm: a script not served with a JavaScript MIME type is refused.
    expect(res.headers['content-type']).toMatch(/^(text|application)\/javascript\b/);
    // RFC 9111 §5.2.2.4: no-cache = a stored copy must be checked with the server before use, so a
    // new version of the app is found on the next start (the worker also asks with its own cache-busting query).
    expect(res.headers['cache-control']).toBe('no-cache');
    expect(res.text).toBe(fs.readFileSync(path.join(swPackage, 'ngsw-worker.js'), 'utf8'));
    const csp = directives(res.headers['content-security-policy']);
    // A worker runs under the policy its own script came with (CSP Level 3, §4.2.5): the page's
    // images from the tile server are fetched there.
    expect(csp.get('connect-src')).toEqual(["'self'", 'https://*.tiles.example']);
    expect(csp.get('default-src')).toEqual(["'none'"]);
  });

  it("when the browser asks for /furlong-sw.js (the worker the app registers), then it gets JavaScript, checked again on every start, that imports Angular's worker from this origin and adds the outbox's Background Sync", async () => {
    const res = await request(t.app).get('/furlong-sw.js');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^(text|application)\/javascript\b/);
    expect(res.headers['cache-control']).toBe('no-cache');
    // importScripts() in a worker is checked against script-src (CSP Level 3): the policy allows this origin only.
    const csp = directives(res.headers['content-security-policy']);
    expect(csp.get('script-src')).toEqual(["'self'"]);
    expect(res.text).toMatch(/importScripts\('\.\/ngsw-worker\.js'\)/);
    expect(res.text).toMatch(/addEventListener\('sync'/);
    // The worker it imports is still served as before (public contract).
    expect((await request(t.app).get('/ngsw-worker.js')).status).toBe(200);
  });

  it('when the worker asks for /ngsw.json with its cache-busting query, then it gets JSON, never cached, listing the app files with the hashes the files served have', async () => {
    const res = await request(t.app).get('/ngsw.json?ngsw-cache-bust=0.123');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json\b/);
    expect(res.headers['cache-control']).toBe('no-cache');
    expect(res.body).toEqual(manifest);
    const prefetched = manifest.assetGroups.filter((g) => g.installMode === 'prefetch').flatMap((g) => g.urls);
    // The shell, the lazy chunks, the font and the icons are fetched when the worker installs.
    expect(prefetched).toEqual(
      expect.arrayContaining([
        '/main-TESTHASH.js',
        '/chunk-LAZYRUN.js',
        '/styles-TESTHASH.css',
        '/favicon.svg',
        '/media/roboto-latin-400-normal-TEST.woff2',
        '/leaflet/marker-icon.png',
      ]),
    );
    // The worker refuses a version whose file does not hash as listed (SHA-1, Angular's ngsw
    // generator and worker): each file must be served byte for byte.
    for (const [url, sha1] of Object.entries(manifest.hashTable)) {
      const file = await request(t.app)
        .get(url)
        .buffer(true)
        .parse((r, cb) => {
          const chunks: Buffer[] = [];
          r.on('data', (c: Buffer) => chunks.push(c));
          r.on('end', () => cb(null, Buffer.concat(chunks)));
        });
      expect(file.status).toBe(200);
      expect(
        createHash('sha1')
          .update(file.body as Buffer)
          .digest('hex'),
      ).toBe(sha1);
    }
  });

  it('when the worker keeps the page, then the copy it gets carries the nonce of its own policy, and the page is no fixed file with a fixed hash', async () => {
    expect(manifest.hashTable['/index.html']).toBeUndefined();
    const res = await request(t.app).get('/index.html');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/html\b/);
    expect(res.headers['cache-control']).toBe('no-cache');
    const nonce = /ngCspNonce="([^"]+)"/.exec(res.text)?.[1];
    expect(nonce).toBeDefined();
    expect(nonce).not.toBe('CSP_NONCE');
    expect(directives(res.headers['content-security-policy']).get('style-src')).toContain(`'nonce-${nonce}'`);
    const again = await request(t.app).get('/index.html');
    expect(/ngCspNonce="([^"]+)"/.exec(again.text)?.[1]).not.toBe(nonce);
  });

  it('when the worker is asked for an API path, then no rule of it keeps the answer or answers with the page', () => {
    const api = ['/api/run-sheet', '/api/auth/me', '/api/assignments/12/taskdata.zip', '/api/season/2026/fields.csv', '/api/docs'];
    for (const group of manifest.dataGroups)
      for (const pattern of group.patterns)
        for (const url of api) expect(new RegExp(pattern).test(`http://127.0.0.1:4000${url}`)).toBe(false);
    for (const group of manifest.assetGroups) for (const url of api) expect(group.urls).not.toContain(url);
    // A navigation the worker takes is answered with the page: an API path opened as a page (the API
    // reference, a download) must reach the server.
    const navigation = (url: string) =>
      manifest.navigationUrls.some((n) => n.positive && new RegExp(n.regex).test(url)) &&
      !manifest.navigationUrls.some((n) => !n.positive && new RegExp(n.regex).test(url));
    for (const url of api) expect(navigation(url)).toBe(false);
    expect(navigation('/run-sheet')).toBe(true);
    expect(navigation('/board/2026-05-01')).toBe(true);
  });
});
