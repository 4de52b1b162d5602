/**
 * The OpenAPI 3.1 document of /api/v1, generated from the endpoints themselves: every route module
 * under src/pages/api/v1 with its exported handlers' specs (src/server/endpoint.ts: params, query,
 * body, answers, doc) and its entry in the policy table (who may call it, whether a site token may).
 * Served at /api/v1/openapi.json (src/server/openapi-routes.ts builds it once per process), drawn by
 * the reference page, checked against real answers by tests/api/contract.test.ts, and the source of
 * the typed client's types (npm run api:types).
 */
import { z } from 'zod';
import { createDocument, type ZodOpenApiOperationObject, type ZodOpenApiPathsObject } from 'zod-openapi';
import type { Answer, Endpoint, EndpointSpec } from './endpoint';
import { ERROR_CODES, ERROR_STATUS, type ErrorCode } from './errors';
import { API_POLICY, type Admit } from './policy';

export const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;

/** The one shape of every error (src/server/errors.ts). */
export const ErrorBody = z
  .object({
    error: z.object({
      code: z.enum(ERROR_CODES).meta({ description: 'A stable code; it never changes once published.' }),
      message: z.string().meta({ description: 'What happened, why, and what to do, in words.' }),
      issues: z
        .array(z.object({ path: z.string().meta({ description: 'Where, e.g. query.from or $.units[0].name.' }), message: z.string() }))
        .optional()
        .meta({ description: 'Each problem of the input, naming its field.' }),
    }),
  })
  .meta({ id: 'Error', description: 'Every error answer: { error: { code, message, issues? } }.' });

/** A route module: its exported handlers by method. */
export type RouteModule = Record<string, unknown>;

/** '/api/v1/units/[unitId]/hours' from 'src/pages/api/v1/units/[unitId]/hours/index.ts' (any prefix up to pages/). */
export function routeOfFile(file: string): string {
  return '/' + file.replace(/^.*?pages\//, '').replace(/\.(ts|js)$/, '').replace(/\/index$/, '');
}

/** The OpenAPI path of an Astro route: [siteId] becomes {siteId}. */
export const openApiPath = (route: string) => route.replace(/\[([^\]./]+)\]/g, '{$1}');

const pathParamNames = (route: string) => [...route.matchAll(/\[([^\]./]+)\]/g)].map((m) => m[1]!);

const isEndpoint = (v: unknown): v is Endpoint => typeof v === 'function' && typeof (v as Endpoint).spec === 'object';

function shapeOf(schema: z.ZodType | undefined): Record<string, z.ZodType> {
  return schema instanceof z.ZodObject ? (schema.shape as Record<string, z.ZodType>) : {};
}

/** Path parameters: row ids are UUIDs (the wrapper answers 404 for anything else); others as the spec says. */
function pathParams(route: string, spec: EndpointSpec): z.ZodObject | undefined {
  const names = pathParamNames(route);
  if (!names.length) return undefined;
  const given = shapeOf(spec.params);
  return z.object(Object.fromEntries(names.map((n) => [n, given[n] ?? z.uuid().meta({ description: `The ${n.replace(/Id$/, '')}'s id.` })])));
}

function content(answer: Answer) {
  if (typeof answer === 'string') return { [answer]: { schema: { type: 'string' as const, ...(answer === 'application/pdf' ? { format: 'binary' } : {}) } } };
  return { 'application/json': { schema: answer } };
}

function successes(spec: EndpointSpec) {
  const out: Record<string, { description: string; content?: Record<string, unknown> }> = {};
  for (const [status, given] of Object.entries(spec.answers ?? {})) {
    if (given === undefined) continue;
    const list = given === null ? [] : Array.isArray(given) ? given : [given as Answer];
    out[status] = { description: status === '202' ? 'Accepted' : status === '204' ? 'No content' : 'OK', ...(list.length ? { content: Object.assign({}, ...list.map(content)) } : {}) };
  }
  return out;
}

const ERROR_WORDS: Partial<Record<ErrorCode, string>> = {
  VALIDATION_FAILED: 'The request is not valid: issues name each field.',
  UNAUTHENTICATED: 'No valid site token or session.',
  FORBIDDEN: "The token or person may not do this, or it is another site's.",
  NOT_FOUND: 'Nothing has the id given (or it is not a UUID).',
  CONFLICT: 'The request does not fit the current state.',
  PAYLOAD_TOO_LARGE: 'The body is larger than allowed.',
  UNPROCESSABLE: 'The input is well-formed but cannot be worked with.',
  INTERNAL: 'A fault on the server; it is logged.',
};

/** The error statuses an operation can answer, each with the codes it carries. */
export function errorStatuses(route: string, method: string, spec: EndpointSpec, admit: Admit | null): number[] {
  const codes = new Set<ErrorCode>(['INTERNAL', 'UNPROCESSABLE']);
  if (admit !== 'public') codes.add('UNAUTHENTICATED').add('FORBIDDEN');
  if (pathParamNames(route).length) codes.add('NOT_FOUND');
  if (spec.params || spec.query || spec.body || method !== 'GET') codes.add('VALIDATION_FAILED');
  if (method !== 'GET') codes.add('CONFLICT');
  if (spec.doc?.upload || spec.body) codes.add('PAYLOAD_TOO_LARGE');
  // Codes added later (e.g. a rate limit's) apply to every operation that is not public.
  for (const code of ERROR_CODES) if (!(code in ERROR_WORDS) && code !== 'METHOD_NOT_ALLOWED' && admit !== 'public') codes.add(code);
  return [...new Set([...codes].map((c) => ERROR_STATUS[c]))].sort();
}

function errorResponses(statuses: number[]) {
  const out: Record<string, unknown> = {};
  for (const status of statuses) {
    const codes = ERROR_CODES.filter((c) => ERROR_STATUS[c] === status);
    const words = codes.map((c) => `${c}: ${ERROR_WORDS[c] ?? 'see the message.'}`).join(' ');
    out[String(status)] = {
      description: words,
      ...(status === 429 ? { headers: { 'Retry-After': { description: 'Seconds to wait before trying again.', schema: { type: 'integer' } } } } : {}),
      content: { 'application/json': { schema: ErrorBody } },
    };
  }
  return out;
}

function security(admit: Admit | null, apiToken: boolean): Record<string, string[]>[] {
  if (admit === 'public') return [];
  return apiToken ? [{ siteToken: [] }, { session: [] }] : [{ session: [] }];
}

function operation(route: string, method: string, handler: Endpoint): ZodOpenApiOperationObject {
  const spec = handler.spec;
  const policy = API_POLICY[route];
  const admit = policy ? (policy.methods[method as keyof typeof policy.methods] ?? policy.methods['*'] ?? null) : null;
  const who = admit === 'public' ? 'Anyone, no token needed.' : `Site token${policy?.apiToken ? '' : ' not accepted'}; signed-in roles: ${admit?.join(', ') ?? 'none'}.`;
  const path = pathParams(route, spec);
  const query = spec.query instanceof z.ZodObject ? spec.query : undefined;
  return {
    operationId: `${method.toLowerCase()}${route.replace(/^\/api\/v1/, '').replace(/[^A-Za-z0-9]+(.)?/g, (_, c: string | undefined) => (c ? c.toUpperCase() : ''))}`,
    summary: spec.doc?.summary ?? `${method} ${route}`,
    description: [spec.doc?.description, `Who: ${who}`].filter(Boolean).join('\n\n'),
    tags: [spec.doc?.group ?? 'Other'],
    security: security(admit, !!policy?.apiToken),
    ...(path || query ? { requestParams: { ...(path ? { path } : {}), ...(query ? { query } : {}) } } : {}),
    ...(spec.body ? { requestBody: { required: true, content: { 'application/json': { schema: spec.body } } } } : {}),
    ...(spec.doc?.upload ? { requestBody: { required: true, content: Object.fromEntries(spec.doc.upload.map((t) => [t, { schema: { type: 'string', format: 'binary' } }])) } } : {}),
    responses: { ...successes(spec), ...errorResponses(errorStatuses(route, method, spec, admit)) },
  } as ZodOpenApiOperationObject;
}

/** Every endpoint of the modules as [route, method, handler]; a module that exports none is left out. */
export function endpointsOf(modules: Record<string, RouteModule>): [string, string, Endpoint][] {
  const out: [string, string, Endpoint][] = [];
  for (const [file, mod] of Object.entries(modules).sort(([a], [b]) => a.localeCompare(b))) {
    for (const method of METHODS) if (isEndpoint(mod[method])) out.push([routeOfFile(file), method, mod[method] as Endpoint]);
  }
  return out;
}

/** The document of the given route modules (keyed by file path under src/pages). */
export function buildDocument(modules: Record<string, RouteModule>, version = '1') {
  const paths: ZodOpenApiPathsObject = {};
  for (const [route, method, handler] of endpointsOf(modules)) {
    const key = openApiPath(route) as `/${string}`;
    paths[key] = { ...paths[key], [method.toLowerCase()]: operation(route, method, handler) };
  }
  return createDocument(
    {
      openapi: '3.1.0',
      info: {
        title: 'Lossline API',
        version,
        description:
          "The machine API of a site: send historian files, replace the plant model, read tag hours and unit hours. Call it with a site API token (Authorization: Bearer llt_..., made by an admin on the API tokens page) or a signed-in session. Every error answers { error: { code, message, issues? } }.",
      },
      servers: [{ url: '/' }],
      paths,
      components: {
        securitySchemes: {
          siteToken: { type: 'http', scheme: 'bearer', description: "A site API token (llt_...): acts on its own site only, with its role's rights (operator: files; admin: files and model)." },
          session: { type: 'apiKey', in: 'cookie', name: 'better-auth.session_token', description: 'The session of a signed-in person (the web app); __Secure- prefixed over https.' },
        },
      },
    },
  );
}

export type OpenApiDocument = ReturnType<typeof buildDocument>;
