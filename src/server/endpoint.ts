/**
 * The one wrapper of every endpoint under src/pages/api (better-auth's catch-all excepted): it
 * validates the route parameters, the query and the JSON body with zod, runs the endpoint, and
 * answers every error in the one shape { error: { code, message, issues? } } with words a person can
 * act on (src/server/issues.ts).
 *
 *   export const GET = endpoint({ query: PeriodQuery }, async ({ params, query }) => Response.json(...));
 *
 * Route parameters that name a row (siteId, unitId ... the names of UUID_PARAMS in access.ts) must be
 * UUIDs; anything else answers 404, as for an id nobody has. Other parameters (hour, month, userId)
 * are checked by `params` when given. An error a service throws (AppError, or a domain error of
 * src/lib) becomes its code's status; anything else goes on to the guard, which logs it and answers 500.
 */
import type { APIContext, APIRoute } from 'astro';
import { z } from 'zod';
import { UUID_PARAMS, canUseSite, isId } from './access';
import { answer } from './answer';
import { AppError, apiError, fromDomainError } from './errors';
import { humanErrorMap, humanIssues, summary, type Where } from '~/lib/zod-words';

/** One success answer: the zod schema of its JSON, or the media type of a file. */
export type Answer = z.ZodType | 'text/csv' | 'application/pdf';

export interface EndpointSpec {
  /** Parameters of the path other than row ids, e.g. { hour } or { month }. */
  params?: z.ZodType<Record<string, unknown>>;
  /** The query string (empty values count as absent; unknown keys are ignored). */
  query?: z.ZodType;
  /** The JSON body; z.unknown() for any JSON that the service checks itself. */
  body?: z.ZodType;
  /**
   * What the endpoint answers when it succeeds, by HTTP status: a zod schema of the JSON, or the media
   * type of a file it sends (text/csv, application/pdf). Errors need no entry: every route answers them
   * in the one shape of errors.ts. Routes under /api/v1 must say this; the OpenAPI document of
   * /api/v1/openapi.json is generated from it, and the contract test checks the answers against it.
   * A list gives the alternatives one status may answer with (JSON or CSV, chosen by the request).
   */
  answers?: Partial<Record<200 | 201 | 202 | 204, Answer | readonly Answer[] | null>>;
  /** Words for the API reference: a one-line summary, more text if needed, and the group it is listed in. */
  doc?: {
    summary: string;
    description?: string;
    group?: string;
    /** The request body is a file sent as is (not JSON), of these media types, e.g. ['text/csv']. */
    upload?: readonly string[];
  };
}

type Out<T, Fallback> = T extends z.ZodType ? z.output<T> : Fallback;

export interface Input<S extends EndpointSpec> {
  params: Record<string, string> & Out<S['params'], unknown>;
  query: Out<S['query'], Record<string, never>>;
  body: Out<S['body'], undefined>;
}

type Handler<S extends EndpointSpec> = (ctx: APIContext, input: Input<S>) => Response | Promise<Response>;

/** An endpoint as Astro calls it, with its spec for the tests that walk every route. */
export type Endpoint = APIRoute & { spec: EndpointSpec };

/** The answer for a schema's findings. */
function invalid(error: z.ZodError, where: Where): AppError {
  const issues = humanIssues(error, where);
  return new AppError('VALIDATION_FAILED', summary(issues), issues);
}

function check<T extends z.ZodType>(schema: T, value: unknown, where: Where): z.output<T> {
  const parsed = schema.safeParse(value, { error: humanErrorMap });
  if (!parsed.success) throw invalid(parsed.error, where);
  return parsed.data;
}

function routeParams(ctx: Partial<APIContext>, spec: EndpointSpec): Record<string, string> {
  const raw = Object.fromEntries(Object.entries(ctx.params ?? {}).filter((e): e is [string, string] => typeof e[1] === 'string'));
  for (const [name, value] of Object.entries(raw)) {
    if (UUID_PARAMS.has(name) && !isId(value)) throw new AppError('NOT_FOUND', `${name} must be an id (a UUID); nothing has the id given.`);
  }
  return spec.params ? ({ ...raw, ...check(spec.params, raw, 'params') } as Record<string, string>) : raw;
}

/** The query string as an object: the last value of each key, empty values left out. */
export function queryObject(ctx: Partial<APIContext>): Record<string, string> {
  const url = ctx.url ?? (ctx.request ? new URL(ctx.request.url) : null);
  const out: Record<string, string> = {};
  if (url) for (const [k, v] of url.searchParams) if (v !== '') out[k] = v;
  return out;
}

async function jsonBody(request: Request | undefined): Promise<unknown> {
  const body = request ? await request.json().catch(() => undefined) : undefined;
  if (body === undefined) throw new AppError('VALIDATION_FAILED', 'The request body is not JSON.', [{ path: '$', message: 'Send a JSON body.' }]);
  return body;
}

/** An error as the API's answer, or null for an error the guard should log as a fault. */
export function errorAnswer(err: unknown): Response | null {
  const known = fromDomainError(err);
  return known ? apiError(known.code, known.message, known.issues) : null;
}

export function endpoint<S extends EndpointSpec>(spec: S, run: Handler<S>): Endpoint {
  const route = async (ctx: APIContext): Promise<Response> => {
    try {
      const params = routeParams(ctx, spec);
      const query = spec.query ? check(spec.query, queryObject(ctx), 'query') : {};
      const body = spec.body ? check(spec.body, await jsonBody(ctx.request), 'body') : undefined;
      return await run(ctx, { params, query, body } as Input<S>);
    } catch (err) {
      const answer = errorAnswer(err);
      if (answer) return answer;
      throw err;
    }
  };
  return Object.assign(route, { spec });
}

/** A site API token may only act on its own site; a person only on the sites of their scope (403). */
export function requireSite(locals: App.Locals, siteId: string): void {
  if (canUseSite(locals, siteId)) return;
  throw new AppError('FORBIDDEN', locals.apiToken ? 'This API token belongs to another site.' : 'You have no access to this site. Ask an admin to add it to your sites.');
}

/**
 * A read of one site under /api/v1/sites/{siteId}: the wrapper's checks, then the caller must be
 * allowed the site (requireSite), then the service's value is the 200 answer of the route's schema.
 *
 *   export const GET = siteRead({ query: PageQuery, answers: { 200: UnitsPage }, doc }, (siteId, { query }) => unitsPage(siteId, query));
 */
export function siteRead<A extends z.ZodType, S extends EndpointSpec>(
  spec: S & { answers: { 200: A } },
  read: (siteId: string, input: Input<S>) => Promise<z.input<A>>,
): Endpoint {
  return endpoint(spec, async ({ locals }, input) => {
    const siteId = input.params.siteId!;
    requireSite(locals, siteId);
    return answer(spec.answers[200], await read(siteId, input));
  });
}

const toDate = (v: string) => new Date(/^\d+$/.test(v) ? Number(v) : v);

/** An instant in a query or path: ISO 8601 (with Z or an offset) or epoch milliseconds, as a Date. */
export const InstantText = z
  .string()
  .max(64)
  .refine((v) => !Number.isNaN(toDate(v).getTime()), 'must be an instant like 2025-05-12T06:00Z, or epoch milliseconds')
  .transform(toDate);
