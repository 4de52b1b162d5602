import { UUID_PARAMS, UUID_RE, canUseSite, siteOfParam } from './access';
import { signedIn } from './session-lookup';
import { env } from './env';
import { apiError } from './errors';
import { redact } from './log';
import { admitFor, apiPolicyFor, decide, pagePolicyFor, pageSiteParam } from './policy';
import { withSecurityHeaders } from './security-headers';
import { checkApiRate, rateKey } from './rate-limit';
import { resolveApiToken, tokenRefusal } from './tokens';

interface GuardContext {
  request: Request;
  url: URL;
  locals: App.Locals;
  redirect: (path: string, status?: 301 | 302 | 303 | 307 | 308) => Response;
}

/** The rest of the request's handling; a path instead renders that page in place (a rewrite). */
type GuardNext = (rewrite?: string) => Promise<Response>;

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** Browsers upload files straight to the object store (presigned URLs): pages may connect there. */
function uploadOrigins(): string[] {
  try {
    const e = env();
    const u = new URL(e.S3_ENDPOINT);
    return e.S3_FORCE_PATH_STYLE ? [u.origin] : [u.origin, `${u.protocol}//${e.S3_BUCKET}.${u.host}`];
  } catch {
    return [];
  }
}

/**
 * True when a state-changing request may come from where it came from: a browser names its page's
 * origin (Origin, or at least Sec-Fetch-Site), and it must be Lossline's own, PUBLIC_BASE_URL.
 * A client that sends neither (a script with a cookie) is not a browser another site could steer.
 */
export function fromOwnOrigin(request: Request, baseOrigin = new URL(env().PUBLIC_BASE_URL).origin): boolean {
  const origin = request.headers.get('origin');
  if (origin) return origin === baseOrigin;
  const site = request.headers.get('sec-fetch-site');
  return !site || site === 'same-origin' || site === 'none';
}

const crossOrigin = (request: Request) =>
  apiError('FORBIDDEN', `This request came from another origin (${request.headers.get('origin') ?? 'a cross-site page'}); Lossline takes changes only from its own pages.`);

/** Postgres refusals caused by the input, not by the server: answered 400 with the error shape. */
const INPUT_SQLSTATES = new Set(['22P02', '22021', '22001', '22003', '22007', '22008', '22023', '54000']);

function sqlState(err: unknown): string | undefined {
  const e = err as { code?: unknown; cause?: { code?: unknown } };
  if (typeof e?.cause?.code === 'string') return e.cause.code;
  return typeof e?.code === 'string' ? e.code : undefined;
}

/** An error no endpoint answered: a clear answer in the API's shape, a log line without secrets. */
function unexpected(err: unknown, isApi: boolean, method: string, path: string): Response {
  const state = sqlState(err);
  if (state && INPUT_SQLSTATES.has(state)) {
    const msg = 'A value in the request cannot be stored (a malformed id, a number out of range, or a character such as NUL that text may not hold).';
    return isApi ? apiError('VALIDATION_FAILED', msg) : new Response(msg, { status: 400, headers: { 'content-type': 'text/plain; charset=utf-8' } });
  }
  if (state === '23505') return apiError('CONFLICT', 'That conflicts with something already stored (a name or key that must be unique).');
  console.error(`[web] ${method} ${redact(path)} failed: ${redact(err instanceof Error ? (err.stack ?? err.message) : String(err))}`);
  const msg = 'Something went wrong on our side; it is logged. Try again in a moment.';
  return isApi ? apiError('INTERNAL', msg) : new Response(msg, { status: 500, headers: { 'content-type': 'text/plain; charset=utf-8' } });
}

/**
 * The guard, separate from src/middleware.ts so tests can call it without Astro's runtime.
 * API routes: 404 for a path nobody declared or a malformed id, 401 anonymous, 403 wrong role, a
 * site the caller may not use, or a change from another origin. Pages: anonymous people go to the
 * sign-in page; a wrong role or site sees 403. Every answer carries the security headers.
 */
export async function guard(ctx: GuardContext, next: GuardNext): Promise<Response> {
  ctx.locals.user = null;
  ctx.locals.session = null;
  ctx.locals.apiToken = null;
  ctx.locals.sites = [];
  const path = ctx.url.pathname;

  // Static assets need nothing.
  if (path.startsWith('/_astro/') || path.startsWith('/fonts/') || path === '/favicon.svg') return next();

  const isApi = path === '/api' || path.startsWith('/api/');
  try {
    return await withSecurityHeaders(await decideAndRun(ctx, next, isApi), uploadOrigins());
  } catch (err) {
    return withSecurityHeaders(unexpected(err, isApi, ctx.request.method, path));
  }
}

async function decideAndRun(ctx: GuardContext, next: GuardNext, isApi: boolean): Promise<Response> {
  const path = ctx.url.pathname;
  const method = ctx.request.method.toUpperCase();
  if (isApi && path.startsWith('/api/auth/')) return next(); // better-auth checks origins itself

  const found = await signedIn(ctx.request.headers);
  if (found) {
    ctx.locals.user = found.user;
    ctx.locals.session = found.session;
    ctx.locals.sites = found.sites;
  }

  if (isApi) {
    const hit = apiPolicyFor(path);
    if (!hit) return apiError('NOT_FOUND', `There is no API at ${path}.`);
    for (const [name, value] of Object.entries(hit.params)) {
      if (UUID_PARAMS.has(name) && !UUID_RE.test(value)) return apiError('NOT_FOUND', `${name} must be an id (a UUID); nothing has the id given.`);
    }
    const admit = admitFor(hit.policy, method);
    let role = ctx.locals.user?.role ?? null;
    if (!role && hit.policy.apiToken) {
      const token = await resolveApiToken(ctx.request.headers.get('authorization'));
      if (token) {
        ctx.locals.apiToken = token;
        role = token.role;
      }
    }
    const verdict = decide(admit, role);
    if (verdict === 401) {
      const refused = hit.policy.apiToken ? await tokenRefusal(ctx.request.headers.get('authorization')) : null;
      return apiError('UNAUTHENTICATED', refused ?? 'Sign in first (or send a site API token where the endpoint takes one).');
    }
    if (verdict === 403) return apiError('FORBIDDEN', `Your role (${role}) may not ${method} ${path}.`);
    if (verdict === 405) return apiError('METHOD_NOT_ALLOWED', `${method} is not offered on ${path}.`);
    // A bearer token is not sent by a browser on its own: no cross-site forgery to guard against.
    if (UNSAFE.has(method) && !ctx.locals.apiToken && !fromOwnOrigin(ctx.request)) return crossOrigin(ctx.request);
    if (ctx.locals.user || ctx.locals.apiToken) {
      for (const [name, value] of Object.entries(hit.params)) {
        const siteId = await siteOfParam(name, value);
        if (siteId && !canUseSite(ctx.locals, siteId)) {
          return apiError('FORBIDDEN', ctx.locals.apiToken ? 'This API token belongs to another site.' : 'You have no access to this site. Ask an admin to add it to your sites.');
        }
      }
    }
    const key = path.startsWith('/api/v1/') ? rateKey(ctx.locals) : null;
    if (key) {
      const limited = await checkApiRate(key);
      if (limited) return limited;
    }
    return next();
  }

  const admit = pagePolicyFor(path);
  const verdict = decide(admit, ctx.locals.user?.role ?? null);
  if (verdict === 401) return ctx.redirect(`/sign-in?next=${encodeURIComponent(path + ctx.url.search)}`, 302);
  if (verdict === 403) return refusePage(ctx, next, 'This page is not open to your role. Ask an admin if you need it.');
  if (UNSAFE.has(method) && !fromOwnOrigin(ctx.request)) return plain(403, 'This form was sent from another site; Lossline takes forms only from its own pages.');
  const bound = pageSiteParam(path);
  if (bound && ctx.locals.user) {
    const siteId = await siteOfParam(bound.name, bound.value);
    if (siteId && !canUseSite(ctx.locals, siteId)) return refusePage(ctx, next, 'This belongs to a site you have no access to. Ask an admin to add it to your sites.');
  }
  return next();
}

/** A refused page is drawn inside the app's frame with the way back (src/pages/403.astro), status 403. */
function refusePage(ctx: GuardContext, next: GuardNext, reason: string) {
  ctx.locals.denied = reason;
  return next('/403');
}

function plain(status: number, text: string): Response {
  return new Response(text, { status, headers: { 'content-type': 'text/plain; charset=utf-8' } });
}
