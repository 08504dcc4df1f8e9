// The OpenAPI document stays true: it lists exactly the registered routes, and the schemas it
// names are the very objects the handlers validate with (recorded while every matrix case runs
// as the owner). Structure is checked against the OpenAPI Specification 3.1.0 (spec.openapis.org/oas/v3.1.0).
import type * as z from 'zod';
import type { RouteEntry } from '../../server/http/routes';
import { recordValidators, type Slot } from '../../server/http/validate';
import { CONTRACT, routeKey, type RouteContract } from '../../server/openapi/contract';
import { buildOpenApiDocument, openApiPath, pathNames, type OpenApiDocument } from '../../server/openapi/document';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { MATRIX } from './matrix';
import { matrixContext } from './matrix/context';
import { MATRIX_WALK_MS } from './matrix/types';

const SLOTS: Slot[] = ['params', 'query', 'body'];
type Recorded = Map<string, Map<Slot, Set<z.ZodType>>>;

/** What the contract gets wrong about the recorded validators: a missing route or slot, or another schema object. */
function contractMismatches(recorded: Recorded, contract: Record<string, RouteContract>): string[] {
  const out: string[] = [];
  for (const [key, slots] of recorded) {
    const row = contract[key];
    if (!row) {
      out.push(`${key}: validators ran, but the contract has no row`);
      continue;
    }
    for (const [slot, schemas] of slots) {
      const named = row[slot];
      if (!named) out.push(`${key}: the handler validates ${slot}, the contract names no ${slot} schema`);
      // Object.is is what toBe compares with: the very same schema object, not an equal one.
      else
        for (const s of schemas)
          if (!Object.is(s, named)) out.push(`${key}: the handler validates ${slot} with another schema object than the contract's`);
    }
  }
  return out;
}

/** Every `$ref` string in the document, with where it was found. */
function refsOf(v: unknown, at = '#'): Array<{ ref: string; at: string }> {
  if (Array.isArray(v)) return v.flatMap((x, i) => refsOf(x, `${at}/${i}`));
  if (!v || typeof v !== 'object') return [];
  return Object.entries(v).flatMap(([k, x]) => (k === '$ref' && typeof x === 'string' ? [{ ref: x, at }] : refsOf(x, `${at}/${k}`)));
}

/** Resolves a same-document JSON Pointer (RFC 6901: `~1` is `/`, `~0` is `~`). */
function resolvePointer(doc: unknown, ref: string): unknown {
  if (!ref.startsWith('#/')) return undefined;
  let at: unknown = doc;
  for (const raw of ref.slice(2).split('/')) {
    const key = raw.replaceAll('~1', '/').replaceAll('~0', '~');
    if (!at || typeof at !== 'object' || !(key in at)) return undefined;
    at = (at as Record<string, unknown>)[key];
  }
  return at;
}

describe('OpenAPI document', () => {
  let t: TestApp;
  let farm: TestFarm;
  let routes: RouteEntry[];
  let doc: OpenApiDocument;

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Contract');
    routes = t.app.locals.routes as RouteEntry[];
    doc = buildOpenApiDocument(routes);
  });
  afterAll(async () => {
    recordValidators(null);
    await t.close();
  });

  it('when the app registers its routes, then the document has each one and no other, and the contract no stale row', () => {
    const registered = routes.map((r) => `${r.method} ${openApiPath(r.path)}`).sort();
    const documented = Object.entries(doc.paths)
      .flatMap(([path, item]) => Object.keys(item).map((method) => `${method} ${path}`))
      .sort();
    expect(documented).toEqual(registered);
    expect(Object.keys(CONTRACT).sort()).toEqual(routes.map((r) => routeKey(r.method, r.path)).sort());
  });

  it(
    'when every matrix case runs as the owner, then each validator used the very schema object the contract names',
    async () => {
      const recorded: Recorded = new Map();
      recordValidators((route, slot, schema) => {
        const [method, path] = route.split(' ');
        const key = routeKey(method, path);
        const slots = recorded.get(key) ?? new Map<Slot, Set<z.ZodType>>();
        recorded.set(key, slots);
        const set = slots.get(slot) ?? new Set<z.ZodType>();
        slots.set(slot, set);
        set.add(schema);
      });
      const owner = new Client(t.app);
      await owner.signIn(farm.owner.email, farm.owner.password);
      const ctx = matrixContext(t, farm);
      const statuses: string[] = [];
      try {
        for (const route of routes) {
          const key = routeKey(route.method, route.path);
          const c = MATRIX[key];
          let client = owner;
          if (c.fresh) {
            client = new Client(t.app);
            await client.signIn(farm.owner.email, farm.owner.password);
          }
          const res = await client[route.method](c.path ? await c.path(ctx) : route.path, c.body);
          if (res.status !== c.expect.owner) statuses.push(`${key}: got ${res.status}, expected ${c.expect.owner}`);
        }
      } finally {
        recordValidators(null);
      }
      // The owner's calls went as the matrix says, so the validators recorded are the ones a real call reaches.
      expect(statuses).toEqual([]);
      expect(contractMismatches(recorded, CONTRACT)).toEqual([]);
      // Every route whose contract names an input had a validator run, so the check above covered it.
      const unexercised = Object.entries(CONTRACT)
        .filter(([key, row]) => SLOTS.some((s) => row[s]) && !recorded.has(key))
        .map(([key]) => key);
      expect(unexercised).toEqual([]);

      // The check can fail: the same recording against a contract naming an equal but other schema object.
      const [someKey, someSlots] = [...recorded][0];
      const [someSlot] = [...someSlots.keys()];
      const doctored = { ...CONTRACT, [someKey]: { ...CONTRACT[someKey], [someSlot]: CONTRACT[someKey][someSlot]!.clone() } };
      expect(contractMismatches(recorded, doctored)).toEqual([
        expect.stringContaining(`${someKey}: the handler validates ${someSlot} with another schema object`),
      ]);
      const dropped = { ...CONTRACT, [someKey]: { ...CONTRACT[someKey], [someSlot]: undefined } };
      expect(contractMismatches(recorded, dropped)).toEqual([
        expect.stringContaining(`${someKey}: the handler validates ${someSlot}, the contract names no`),
      ]);
    },
    MATRIX_WALK_MS,
  );

  it('when the document is read, then it has the shape of an OpenAPI 3.1 document', () => {
    // OAS 3.1.0 §4.8.1: `openapi` is the version; §4.8.2 info needs title and version.
    expect(doc.openapi).toBe('3.1.0');
    expect(doc.info.title).toEqual(expect.any(String));
    expect(doc.info.version).toEqual(expect.any(String));
    const operationIds = new Set<string>();
    for (const [path, item] of Object.entries(doc.paths)) {
      // §4.8.8: a path starts with a slash.
      expect(path.startsWith('/')).toBe(true);
      const names = pathNames(path);
      for (const [method, op] of Object.entries(item)) {
        const where = `${method} ${path}`;
        // §4.8.10: operationId is unique among all operations.
        expect(operationIds.has(op.operationId)).toBe(false);
        operationIds.add(op.operationId);
        // §4.8.16: responses hold at least one response code.
        expect([where, Object.keys(op.responses).length > 0]).toEqual([where, true]);
        for (const status of Object.keys(op.responses))
          expect([where, /^([1-5]\d\d|[1-5]XX|default)$/.test(status)]).toEqual([where, true]);
        const params = op.parameters ?? [];
        // §4.8.12: a parameter is unique by name and location; a path parameter is required and
        // its name matches a template expression in the path (§4.8.8.1 Path Templating).
        const pathParams = params.filter((p) => p.in === 'path');
        expect([where, pathParams.map((p) => p.name).sort()]).toEqual([where, [...names].sort()]);
        for (const p of pathParams) expect([where, p.name, p.required]).toEqual([where, p.name, true]);
        const ids = params.map((p) => `${String(p.in)}:${String(p.name)}`);
        expect([where, new Set(ids).size]).toEqual([where, ids.length]);
        for (const p of params)
          expect([where, ['path', 'query', 'header', 'cookie'].includes(String(p.in)), 'schema' in p]).toEqual([where, true, true]);
        expect(['public', 'member'].includes(op['x-access'] as string) || Array.isArray(op['x-access'])).toBe(true);
      }
    }
    // §4.8.23 Reference Object: every $ref resolves inside this document.
    const refs = refsOf(doc);
    expect(refs.length).toBeGreaterThan(0);
    const broken = refs.filter((r) => resolvePointer(doc, r.ref) === undefined).map((r) => `${r.at}: ${r.ref}`);
    expect(broken).toEqual([]);
    // §4.8.27 Security Requirement Object: names a scheme declared in components.securitySchemes.
    for (const item of Object.values(doc.paths)) {
      for (const op of Object.values(item))
        for (const req of op.security) for (const name of Object.keys(req)) expect(doc.components.securitySchemes).toHaveProperty(name);
    }
  });

  it('when a state-changing route is documented, then it asks for the XSRF header; the upload is multipart', () => {
    const login = doc.paths['/api/auth/login']?.post;
    expect(login?.security).toEqual([{ xsrf: [] }]);
    expect(doc.paths['/api/fields/{id}']?.get?.security).toEqual([{ session: [] }]);
    expect(doc.paths['/api/fields/{id}']?.patch?.security).toEqual([{ session: [], xsrf: [] }]);
    expect(doc.paths['/api/fields/{id}']?.patch?.['x-access']).toEqual(['owner']);
    expect(Object.keys((doc.paths['/api/fields/import']?.post?.requestBody?.content ?? {}) as object)).toEqual(['multipart/form-data']);
    expect(doc.paths['/api/season/{year}/export/{table}.csv']?.get).toBeDefined();
  });

  it('when /api/openapi.json and /api/docs are fetched, then they answer the document and a page listing every path', async () => {
    const anon = new Client(t.app);
    const json = await anon.get('/api/openapi.json');
    expect(json.status).toBe(200);
    expect(json.headers['content-type']).toMatch(/^application\/json/);
    expect(json.body).toEqual(JSON.parse(JSON.stringify(doc)));

    const page = await anon.get('/api/docs');
    expect(page.status).toBe(200);
    expect(page.headers['content-type']).toMatch(/^text\/html/);
    for (const [path, item] of Object.entries(doc.paths)) {
      for (const method of Object.keys(item))
        expect([path, page.text.includes(`<code>${method.toUpperCase()} ${path}</code>`)]).toEqual([path, true]);
    }
    // The API's CSP (default-src 'none') forbids scripts and styles; the page uses neither.
    expect(page.headers['content-security-policy']).toContain("default-src 'none'");
    expect(page.text).not.toMatch(/<script|<style|style=|<link/i);
  });
});
