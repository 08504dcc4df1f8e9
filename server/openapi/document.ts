// The OpenAPI 3.1 document of the API, built from the route registry (method, path, access) and
// the contract (server/openapi/contract.ts). OpenAPI 3.1 schemas are JSON Schema 2020-12, which
// is what zod's own toJSONSchema writes, so the schemas go in as zod makes them.
import * as z from 'zod';
import type { Access, RouteEntry } from '../http/routes';
import { CONTRACT, routeKey, type ResponseContract, type RouteContract } from './contract';

type Json = Record<string, unknown>;

export interface OpenApiOperation {
  operationId: string;
  summary: string;
  description: string;
  tags: string[];
  'x-access': Access;
  security: Array<Record<string, string[]>>;
  parameters?: Json[];
  requestBody?: Json;
  responses: Record<string, Json>;
}

export interface OpenApiDocument {
  openapi: '3.1.0';
  info: { title: string; version: string; description: string };
  jsonSchemaDialect: string;
  tags: Array<{ name: string }>;
  paths: Record<string, Partial<Record<RouteEntry['method'], OpenApiOperation>>>;
  components: { schemas: Record<string, Json>; responses: Record<string, Json>; securitySchemes: Record<string, Json> };
}

/** Where shared definitions go: components.schemas, each under a name no other takes. */
interface Hoist {
  reserve(name: string): string;
  set(name: string, def: Json): void;
}

const DIALECT = 'https://json-schema.org/draft/2020-12/schema';
const STATE_CHANGING = new Set(['post', 'put', 'patch', 'delete']);

/** Express `/api/fields/:id` (and `:table.csv`) → OpenAPI `/api/fields/{id}` (`{table}.csv`). */
export const openApiPath = (expressPath: string): string =>
  expressPath.replace(/(.)\/$/, '$1').replace(/:([A-Za-z_][A-Za-z0-9_]*)/g, '{$1}');

/** Names like `{id}` in an OpenAPI path, in order. */
export const pathNames = (openApi: string): string[] => [...openApi.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]);

/**
 * A zod schema as JSON Schema 2020-12: requests as they are sent (`io: 'input'`: a coerced
 * number in the address is still a number type there), answers as the server writes them.
 * Any `$defs` move to components.schemas, since `#/...` in the document means its root.
 */
function schemaOf(schema: z.ZodType, io: 'input' | 'output', hoist: Hoist): Json {
  const js = z.toJSONSchema(schema, { target: 'draft-2020-12', io, unrepresentable: 'any' }) as Json;
  delete js.$schema;
  const defs = js.$defs as Record<string, Json> | undefined;
  if (!defs) return js;
  delete js.$defs;
  const names = new Map(Object.keys(defs).map((name) => [name, hoist.reserve(name)]));
  const renamed = new Map([...names].map(([name, unique]) => [`#/$defs/${name}`, `#/components/schemas/${unique}`]));
  const rewrite = (v: unknown): unknown => {
    if (Array.isArray(v)) return v.map(rewrite);
    if (v && typeof v === 'object') {
      const out: Json = {};
      for (const [k, x] of Object.entries(v))
        out[k] = k === '$ref' && typeof x === 'string' && renamed.has(x) ? renamed.get(x) : rewrite(x);
      return out;
    }
    return v;
  };
  for (const [name, def] of Object.entries(defs)) hoist.set(names.get(name)!, rewrite(def) as Json);
  return rewrite(js) as Json;
}

const ERROR_SCHEMA: Json = {
  type: 'object',
  description: 'Every failure of the API has this shape; `message` is written for the person using the app.',
  properties: {
    error: {
      type: 'object',
      properties: {
        code: {
          type: 'string',
          description: 'A stable word for programs: invalid_input, signed_out, forbidden, not_found, rate_limited, db_unavailable, …',
        },
        message: { type: 'string', description: 'What went wrong and what to do, in plain words.' },
        fields: {
          type: 'object',
          additionalProperties: { type: 'string' },
          description: 'Per-field messages, keyed by the input path (email, boundary.coordinates.0).',
        },
        requestId: { type: 'string', description: 'The request id (X-Request-Id), to find its log lines.' },
      },
      required: ['code', 'message'],
    },
  },
  required: ['error'],
};

const errorResponse = (description: string): Json => ({
  description,
  content: { 'application/json': { schema: { $ref: '#/components/schemas/ApiError' } } },
});
const ERROR_RESPONSES: Record<string, Json> = {
  BadInput: errorResponse('The input was refused; `message` says why and `fields` which inputs. Nothing was changed.'),
  SignedOut: errorResponse('Not signed in (or the session ended).'),
  Forbidden: errorResponse('Signed in, but this role may not do that; or the XSRF header is missing or wrong.'),
  NotFound: errorResponse('No such item on this farm (an item of another farm also answers 404).'),
  ClientError: errorResponse('Refused for another reason (conflict, limit, rate limit…); `message` says which.'),
  ServerError: errorResponse('The server or its database failed; nothing was changed.'),
};
const ref = (name: string) => ({ $ref: `#/components/responses/${name}` });

function securityOf(method: RouteEntry['method'], access: Access): Array<Record<string, string[]>> {
  const xsrf = STATE_CHANGING.has(method);
  if (access === 'public') return xsrf ? [{ xsrf: [] }] : [];
  return [xsrf ? { session: [], xsrf: [] } : { session: [] }];
}

function accessText(access: Access): string {
  if (access === 'public') return 'Anyone, signed in or not.';
  if (access === 'member') return 'Any signed-in member of the farm.';
  return `Signed-in members with the role ${access.join(' or ')}.`;
}

function successResponse(r: ResponseContract, hoist: Hoist): Json {
  const description = r.type ? `${r.description} (${r.type})` : r.description;
  if (r.status === 204) return { description };
  const contentType = r.contentType ?? 'application/json';
  const schema = r.schema
    ? schemaOf(r.schema, 'output', hoist)
    : contentType === 'text/html' || contentType === 'text/csv'
      ? { type: 'string' }
      : {};
  return { description, content: { [contentType]: { schema } } };
}

function parametersOf(c: RouteContract, path: string, hoist: Hoist): Json[] {
  const out: Json[] = [];
  const fromObject = (schema: z.ZodType, where: 'path' | 'query') => {
    const js = schemaOf(schema, 'input', hoist);
    const props = (js.properties ?? {}) as Record<string, Json>;
    const required = new Set((js.required ?? []) as string[]);
    for (const [name, s] of Object.entries(props)) {
      out.push({
        name,
        in: where,
        required: where === 'path' || required.has(name),
        schema: s,
        ...(typeof s.description === 'string' ? { description: s.description } : {}),
      });
    }
  };
  if (c.params) fromObject(c.params, 'path');
  // A name in the path that no params schema covers still is a path parameter.
  for (const name of pathNames(path)) {
    if (!out.some((p) => p.in === 'path' && p.name === name)) out.push({ name, in: 'path', required: true, schema: { type: 'string' } });
  }
  if (c.query) fromObject(c.query, 'query');
  if (c.boardVersion) {
    out.push({
      name: 'If-Match',
      in: 'header',
      required: false,
      description:
        'The board version the change was made on ("7", W/"7" or 7), when the body has no version; a stale one gets 409 with the current board.',
      schema: { type: 'string' },
    });
  }
  if (c.boardVersion === 'header-or-query') {
    out.push({
      name: 'version',
      in: 'query',
      required: false,
      description: 'The board version, as for If-Match (a DELETE has no body).',
      schema: { type: 'string', pattern: '^\\d{1,9}$' },
    });
  }
  return out;
}

function requestBodyOf(c: RouteContract, hoist: Hoist): Json | undefined {
  if (c.upload) {
    const properties: Record<string, Json> = {
      [c.upload.file]: { type: 'string', contentMediaType: 'application/octet-stream', description: 'The file.' },
    };
    for (const [name, s] of Object.entries(c.upload.fields)) {
      properties[name] = { type: 'string', contentMediaType: 'application/json', contentSchema: schemaOf(s, 'input', hoist) };
    }
    return { required: true, content: { 'multipart/form-data': { schema: { type: 'object', properties, required: [c.upload.file] } } } };
  }
  if (!c.body) return undefined;
  // The handlers read a missing body as {}: the body is required only when {} is refused.
  return { required: !c.body.safeParse({}).success, content: { 'application/json': { schema: schemaOf(c.body, 'input', hoist) } } };
}

function operationOf(route: RouteEntry, c: RouteContract, hoist: Hoist): OpenApiOperation {
  const path = openApiPath(route.path);
  const tag = path.split('/')[2] ?? 'api';
  const parameters = parametersOf(c, path, hoist);
  const requestBody = requestBodyOf(c, hoist);
  const responses: Record<string, Json> = {};
  for (const r of c.responses) responses[String(r.status)] = successResponse(r, hoist);
  const hasInput = Boolean(c.params || c.query || c.body || c.upload || c.boardVersion);
  if (hasInput) responses['400'] ??= ref('BadInput');
  if (route.access !== 'public') responses['401'] ??= ref('SignedOut');
  if (Array.isArray(route.access) || STATE_CHANGING.has(route.method)) responses['403'] ??= ref('Forbidden');
  if (c.params) responses['404'] ??= ref('NotFound');
  responses['4XX'] = ref('ClientError');
  responses['5XX'] = ref('ServerError');
  return {
    operationId: `${route.method}${path.replace(/[^A-Za-z0-9]+(.)?/g, (_m, ch?: string) => (ch ? ch.toUpperCase() : ''))}`,
    summary: c.summary,
    description: `Who may call it: ${accessText(route.access)}`,
    tags: [tag],
    'x-access': route.access,
    security: securityOf(route.method, route.access),
    ...(parameters.length ? { parameters } : {}),
    ...(requestBody ? { requestBody } : {}),
    responses,
  };
}

/**
 * The document for the registered routes. A route without a contract row is left out (and
 * tests/api/openapi.test.ts fails on it); so is a contract row without a route.
 */
export function buildOpenApiDocument(
  routes: readonly RouteEntry[],
  contract: Record<string, RouteContract> = CONTRACT,
  version = '0.1.0',
): OpenApiDocument {
  const schemas: Record<string, Json> = { ApiError: ERROR_SCHEMA };
  const hoist: Hoist = {
    reserve: (name) => {
      const base = name.replace(/[^A-Za-z0-9._-]/g, '_');
      let unique = base;
      for (let n = 2; unique in schemas; n++) unique = `${base}_${n}`;
      schemas[unique] = {};
      return unique;
    },
    set: (name, def) => {
      schemas[name] = def;
    },
  };
  const paths: OpenApiDocument['paths'] = {};
  const tags = new Set<string>();
  for (const route of routes) {
    const c = contract[routeKey(route.method, route.path)];
    if (!c) continue;
    const op = operationOf(route, c, hoist);
    tags.add(op.tags[0]);
    (paths[openApiPath(route.path)] ??= {})[route.method] = op;
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Furlong API',
      version,
      description:
        'The API behind the Furlong app. Sign in with POST /api/auth/login: the session is a cookie (furlong.sid). ' +
        'Every request that changes something (POST, PUT, PATCH, DELETE) also sends the XSRF-TOKEN cookie back in the X-XSRF-TOKEN header. ' +
        'x-access on each operation says who may call it: public, any member of the farm, or the listed roles.',
    },
    jsonSchemaDialect: DIALECT,
    tags: [...tags].map((name) => ({ name })),
    paths,
    components: {
      schemas,
      responses: ERROR_RESPONSES,
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'furlong.sid', description: 'The session cookie set on sign-in.' },
        xsrf: {
          type: 'apiKey',
          in: 'header',
          name: 'X-XSRF-TOKEN',
          description: 'The value of the XSRF-TOKEN cookie, on every state-changing request.',
        },
      },
    },
  };
}
