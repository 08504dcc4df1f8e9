import type { Request } from 'express';
import type { AppDeps } from '../app-deps';
import type { RouteEntry, Routes } from '../http/routes';
import { buildOpenApiDocument, type OpenApiDocument, type OpenApiOperation } from './document';

type Json = Record<string, unknown>;

const escape = (s: string): string =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
const pretty = (v: unknown): string => `<pre>${escape(JSON.stringify(v, null, 2))}</pre>`;
const anchor = (method: string, path: string): string => `${method}-${path}`.replace(/[^A-Za-z0-9]+/g, '-');

function accessText(access: OpenApiOperation['x-access']): string {
  if (access === 'public') return 'public (anyone)';
  if (access === 'member') return 'member (anyone signed in on the farm)';
  return `roles: ${access.join(', ')}`;
}

function operationHtml(method: string, path: string, op: OpenApiOperation): string {
  const parts = [
    `<section id="${anchor(method, path)}">`,
    `<h3><code>${method.toUpperCase()} ${escape(path)}</code></h3>`,
    `<p>${escape(op.summary)}</p>`,
    `<p><strong>Access:</strong> ${escape(accessText(op['x-access']))}</p>`,
  ];
  if (op.parameters?.length) {
    parts.push(
      '<table><caption>Parameters</caption><thead><tr><th scope="col">Name</th><th scope="col">In</th><th scope="col">Required</th><th scope="col">Schema</th></tr></thead><tbody>',
    );
    for (const p of op.parameters) {
      parts.push(
        `<tr><td><code>${escape(String(p.name))}</code></td><td>${escape(String(p.in))}</td><td>${p.required ? 'yes' : 'no'}</td><td><code>${escape(JSON.stringify(p.schema))}</code>${
          typeof p.description === 'string' ? ` ${escape(p.description)}` : ''
        }</td></tr>`,
      );
    }
    parts.push('</tbody></table>');
  }
  const content = (op.requestBody?.content ?? {}) as Record<string, { schema?: unknown }>;
  for (const [type, media] of Object.entries(content)) {
    parts.push(`<h4>Request body (${escape(type)}${op.requestBody?.required ? '' : ', optional'})</h4>`, pretty(media.schema));
  }
  parts.push('<h4>Responses</h4><ul>');
  for (const [status, r] of Object.entries(op.responses)) {
    const description =
      typeof r.description === 'string' ? r.description : typeof r.$ref === 'string' ? `error (${r.$ref.split('/').pop()})` : '';
    parts.push(`<li><code>${escape(status)}</code> ${escape(description)}</li>`);
  }
  parts.push('</ul>');
  for (const [type, media] of Object.entries(((Object.values(op.responses)[0] ?? {}).content ?? {}) as Record<string, { schema?: Json }>)) {
    if (media.schema && Object.keys(media.schema).length)
      parts.push(`<details><summary>Answer schema (${escape(type)})</summary>${pretty(media.schema)}</details>`);
  }
  parts.push('</section>');
  return parts.join('\n');
}

/** The document as a plain page: no scripts and no styles (API answers have CSP default-src 'none'). */
export function renderDocsPage(doc: OpenApiDocument): string {
  const ops = Object.entries(doc.paths).flatMap(([path, item]) => Object.entries(item).map(([method, op]) => ({ path, method, op: op! })));
  const toc = ops.map(
    ({ path, method, op }) =>
      `<li><a href="#${anchor(method, path)}"><code>${method.toUpperCase()} ${escape(path)}</code></a> ${escape(op.summary)}</li>`,
  );
  const errorShape = doc.components.schemas.ApiError;
  return [
    '<!doctype html>',
    '<html lang="en">',
    '<head><meta charset="utf-8"><title>Furlong API reference</title></head>',
    '<body>',
    '<header><h1>Furlong API reference</h1>',
    `<p>${escape(doc.info.description)}</p>`,
    '<p>The same description as an OpenAPI 3.1 document: <a href="openapi.json">openapi.json</a>.</p></header>',
    '<nav aria-labelledby="toc"><h2 id="toc">Operations</h2><ul>',
    ...toc,
    '</ul></nav>',
    '<main>',
    '<section><h2>Errors</h2><p>Every failure (4xx, 5xx) answers with this shape:</p>',
    pretty(errorShape),
    '</section>',
    ...doc.tags.map(
      (t) =>
        `<section><h2>${escape(t.name)}</h2>\n${ops
          .filter((o) => o.op.tags[0] === t.name)
          .map((o) => operationHtml(o.method, o.path, o.op))
          .join('\n')}</section>`,
    ),
    '</main>',
    '</body>',
    '</html>',
  ].join('\n');
}

/**
 * The API's own description: GET /api/openapi.json and the page GET /api/docs. Both are public:
 * they describe the routes and hold no farm data. The document is built once, on the first
 * request, when every route is registered (routes mounted after this one too).
 */
export function openapiRoutes(r: Routes, _deps: AppDeps): void {
  let built: { doc: OpenApiDocument; json: string; html: string } | undefined;
  const once = (req: Request) => {
    if (!built) {
      const doc = buildOpenApiDocument(req.app.locals.routes as RouteEntry[]);
      built = { doc, json: JSON.stringify(doc), html: renderDocsPage(doc) };
    }
    return built;
  };
  r.get('/openapi.json', 'public', (req, res) => {
    res.type('json').send(once(req).json);
  });
  r.get('/docs', 'public', (req, res) => {
    res.type('html').send(once(req).html);
  });
}
