import { z } from 'zod';
import { ApiErrorBodySchema } from '../../../shared/api/errors.ts';
import type { RouteSpec } from '../../lib/api-router.ts';

type JsonSchema = Record<string, unknown>;

function toJsonSchema(schema: z.ZodType, io: 'input' | 'output'): JsonSchema {
  const { $schema: _dialect, ...rest } = z.toJSONSchema(schema, { io, unrepresentable: 'any' }) as JsonSchema;
  return rest;
}

/** `/admin/users/:id` → `/api/admin/users/{id}` */
function openApiPath(expressPath: string): string {
  return '/api' + expressPath.replace(/:(\w+)/g, '{$1}');
}

/** A route's query schema as OpenAPI query parameters (input side: a field with a default is optional). */
function queryParameters(schema: z.ZodType): JsonSchema[] {
  const json = toJsonSchema(schema, 'input') as { properties?: Record<string, JsonSchema>; required?: string[] };
  return Object.entries(json.properties ?? {}).map(([name, property]) => ({
    name,
    in: 'query',
    required: json.required?.includes(name) ?? false,
    // OpenAPI marks a deprecated parameter on the parameter itself, not only in its schema.
    ...(property.deprecated === true ? { deprecated: true } : {}),
    ...(typeof property.description === 'string' ? { description: property.description } : {}),
    schema: property,
  }));
}

const ERROR_RESPONSES = {
  400: 'Bad input; `details` lists the fields',
  401: 'Not signed in',
  403: 'Signed in but not allowed, or a cookie-authenticated write without its CSRF token',
  404: 'Not found (also for other people’s private data)',
  409: 'Conflict',
  413: 'Too large',
  429: 'Too many attempts',
} as const;

/** The success answer: a JSON schema, a file's media types, or no content (204). */
function successResponse(spec: RouteSpec): JsonSchema {
  if (spec.response)
    return { description: 'Success', content: { 'application/json': { schema: toJsonSchema(spec.response, 'output') } } };
  if (spec.file)
    return {
      description: 'A file',
      content: Object.fromEntries(spec.file.map((type) => [type, { schema: { type: 'string', format: 'binary' } }])),
    };
  return { description: 'No content' };
}

/** Builds the OpenAPI 3.1 document from the routes' own zod schemas, so it cannot drift from validation. */
export function buildOpenApiDocument(specs: RouteSpec[], version: string): JsonSchema {
  const paths: Record<string, Record<string, unknown>> = {};
  const errorSchema = toJsonSchema(ApiErrorBodySchema, 'output');
  for (const spec of specs) {
    const path = openApiPath(spec.path);
    const parameters = [
      ...[...spec.path.matchAll(/:(\w+)/g)].map((m) => ({
        name: m[1],
        in: 'path',
        required: true,
        schema: { type: 'string' },
      })),
      ...(spec.query ? queryParameters(spec.query) : []),
    ];
    const status = String(spec.status ?? 200);
    const responses: Record<string, unknown> = { [status]: successResponse(spec) };
    for (const [code, description] of Object.entries(ERROR_RESPONSES)) {
      responses[code] = { description, content: { 'application/json': { schema: errorSchema } } };
    }
    paths[path] ??= {};
    paths[path][spec.method] = {
      summary: spec.summary,
      tags: [spec.tag],
      'x-access': spec.access,
      security: spec.access === 'public' ? [] : [{ session: [] }, { bearer: [] }],
      ...(parameters.length ? { parameters } : {}),
      ...(spec.body
        ? { requestBody: { required: true, content: { 'application/json': { schema: toJsonSchema(spec.body, 'input') } } } }
        : {}),
      responses,
    };
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Pacewright API',
      version,
      description:
        'Training log for distance runners and coaches. Browser writes need the X-CSRF-Token header (double-submit of the pw_csrf cookie); scripts use Authorization: Bearer <token> from POST /api/auth/token.',
    },
    components: {
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'pw_session' },
        bearer: { type: 'http', scheme: 'bearer' },
      },
    },
    paths,
  };
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** A plain, readable HTML page of the OpenAPI document (no CDN, no script). */
export function renderApiPage(doc: JsonSchema): string {
  const paths = doc.paths as Record<
    string,
    Record<string, { summary: string; 'x-access': string; requestBody?: unknown; responses: Record<string, unknown> }>
  >;
  const rows = Object.entries(paths)
    .flatMap(([path, ops]) =>
      Object.entries(ops).map(([method, op]) => {
        const body = op.requestBody
          ? `<details><summary>Request body</summary><pre>${escapeHtml(JSON.stringify((op.requestBody as { content: { 'application/json': { schema: unknown } } }).content['application/json'].schema, null, 2))}</pre></details>`
          : '';
        const success = Object.entries(op.responses).find(([code]) => code.startsWith('2'));
        const response = success
          ? `<details><summary>Response ${success[0]}</summary><pre>${escapeHtml(JSON.stringify(success[1], null, 2))}</pre></details>`
          : '';
        return `<section><h2><span class="m">${method.toUpperCase()}</span> <code>${escapeHtml(path)}</code></h2><p>${escapeHtml(op.summary)} <em>(${escapeHtml(op['x-access'])})</em></p>${body}${response}</section>`;
      }),
    )
    .join('\n');
  const info = doc.info as { title: string; version: string; description: string };
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(info.title)}</title>
<style>body{font-family:"Source Sans 3",system-ui,sans-serif;background:#f6f4ef;color:#1d2330;max-width:60rem;margin:2rem auto;padding:0 1rem}
h1{color:#0f5c5c}section{background:#fff;border:1px solid #e2ded4;border-radius:6px;padding:.5rem 1rem;margin:.75rem 0}
h2{font-size:1.05rem;margin:.3rem 0}.m{display:inline-block;min-width:4.5rem;color:#0f5c5c}pre{overflow:auto;font-size:.8rem;background:#f6f4ef;padding:.5rem}</style>
</head><body><h1>${escapeHtml(info.title)} ${escapeHtml(info.version)}</h1><p>${escapeHtml(info.description)}</p>
<p>Machine-readable: <a href="/api/openapi.json">/api/openapi.json</a></p>${rows}</body></html>`;
}
