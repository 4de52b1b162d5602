import { isRole } from '../lib/roles';
import { auth } from './auth';
import { apiError } from './errors';
import { admitFor, apiPolicyFor, decide, pagePolicyFor } from './policy';
import { resolveApiToken } from './tokens';

interface GuardContext {
  request: Request;
  url: URL;
  locals: App.Locals;
  redirect: (path: string, status?: 301 | 302 | 303 | 307 | 308) => Response;
}

/**
 * The role guard, separate from src/middleware.ts so tests can call it without Astro's runtime.
 * API routes: 401 anonymous, 403 wrong role, 500 NO_POLICY for a route missing from the table.
 * Pages: anonymous people go to the sign-in page; a wrong role sees 403.
 */
export async function guard(ctx: GuardContext, next: () => Promise<Response>): Promise<Response> {
  ctx.locals.user = null;
  ctx.locals.session = null;
  ctx.locals.apiToken = null;
  const path = ctx.url.pathname;

  // Static assets need nothing.
  if (path.startsWith('/_astro/') || path.startsWith('/fonts/') || path === '/favicon.svg') return next();

  const isApi = path === '/api' || path.startsWith('/api/');
  if (isApi && path.startsWith('/api/auth/')) return next();

  const found = await auth().api.getSession({ headers: ctx.request.headers }).catch(() => null);
  if (found?.user && !(found.user as { deactivated?: boolean }).deactivated) {
    const role = (found.user as { role?: unknown }).role;
    ctx.locals.user = {
      id: found.user.id,
      name: found.user.name,
      email: found.user.email,
      role: isRole(role) ? role : 'operator',
    };
    ctx.locals.session = { id: found.session.id, expiresAt: found.session.expiresAt };
  }

  if (isApi) {
    const hit = apiPolicyFor(path);
    if (!hit) return apiError('NO_POLICY', `No access policy is declared for ${path}; add it to src/server/policy.ts.`);
    const admit = admitFor(hit.policy, ctx.request.method);
    let role = ctx.locals.user?.role ?? null;
    if (!role && hit.policy.apiToken) {
      const token = await resolveApiToken(ctx.request.headers.get('authorization'));
      if (token) {
        ctx.locals.apiToken = token;
        role = token.role;
      }
    }
    const verdict = decide(admit, role);
    if (verdict === 401) return apiError('UNAUTHENTICATED', 'Sign in first (or send a site API token where the endpoint takes one).');
    if (verdict === 403) return apiError('FORBIDDEN', `Your role (${role}) may not ${ctx.request.method} ${path}.`);
    if (verdict === 405) return apiError('METHOD_NOT_ALLOWED', `${ctx.request.method} is not offered on ${path}.`);
    return next();
  }

  const admit = pagePolicyFor(path);
  const verdict = decide(admit, ctx.locals.user?.role ?? null);
  if (verdict === 401) return ctx.redirect(`/sign-in?next=${encodeURIComponent(path + ctx.url.search)}`, 302);
  if (verdict === 403) {
    return new Response('This page is not open to your role. Ask an admin if you need it.', {
      status: 403,
      headers: { 'content-type': 'text/plain; charset=utf-8' },
    });
  }
  return next();
}
