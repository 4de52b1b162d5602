/**
 * The demo loader's /api/v1 client: openapi-fetch with the document's generated types
 * (src/lib/api/v1-types.ts, `npm run api:types`), so the loader's calls are checked against the
 * document the server describes itself with. Its requests go through the guard and the route
 * modules in this process (the demo loads before, or without, a listening server; the tests load it
 * too), with a site API token the loader issues for the run and revokes after.
 */
import createClient, { type Client } from 'openapi-fetch';
import type { paths } from '~/lib/api/v1-types';
import { guard } from '~/server/guard';
import { openApiPath, routeOfFile, type RouteModule } from '~/server/openapi';
import { issueApiToken, revokeApiToken } from '~/server/tokens';
import { routeModulesFromFiles } from '../api-types';

export type V1Client = Client<paths>;

type Route = { pattern: RegExp; names: string[]; mod: RouteModule };

function routesOf(modules: Record<string, RouteModule>): Route[] {
  return Object.entries(modules).map(([file, mod]) => {
    const template = openApiPath(routeOfFile(file));
    const names = [...template.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]!);
    const pattern = new RegExp(`^${template.replace(/\./g, '\\.').replace(/\{[^}]+\}/g, '([^/]+)')}$`);
    return { pattern, names, mod };
  });
}

/** A fetch that answers from the route modules through the guard, as the server would. */
export function inProcessFetch(modules: Record<string, RouteModule>): typeof fetch {
  const routes = routesOf(modules);
  return async (input, init) => {
    const request = new Request(input as Request | string, init);
    const url = new URL(request.url);
    const route = routes.find((r) => r.pattern.test(url.pathname));
    const values = route ? url.pathname.match(route.pattern)!.slice(1) : [];
    const params = Object.fromEntries((route?.names ?? []).map((n, i) => [n, decodeURIComponent(values[i]!)]));
    const ctx = { request, url, params, locals: {} as App.Locals, redirect: (p: string, s = 302) => new Response(null, { status: s, headers: { location: p } }) };
    const handler = route?.mod[request.method] as ((c: never) => Promise<Response>) | undefined;
    return guard(ctx, async () => (handler ? handler(ctx as never) : Response.json({ error: { code: 'NOT_FOUND', message: 'No such route.' } }, { status: 404 })));
  };
}

/** A client of the site's API with a fresh admin token of the site; close() revokes the token. */
export async function demoApiClient(siteId: string): Promise<{ api: V1Client; close: () => Promise<void> }> {
  const origin = process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4321';
  const token = await issueApiToken({ siteId, name: 'demo loader (revoked after the load)', role: 'admin', createdBy: null });
  const api = createClient<paths>({
    baseUrl: origin,
    fetch: inProcessFetch(await routeModulesFromFiles()),
    headers: { authorization: `Bearer ${token.secret}`, origin },
  });
  return { api, close: async () => void (await revokeApiToken(token.id)) };
}

/** The message of an /api/v1 error answer. */
export function apiFailure(what: string, error: unknown, status: number): Error {
  const e = (error as { error?: { code?: string; message?: string } } | undefined)?.error;
  return new Error(`${what}: ${status} ${e?.code ?? ''} ${e?.message ?? ''}`.trim());
}
