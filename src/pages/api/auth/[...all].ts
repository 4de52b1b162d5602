import type { APIRoute } from 'astro';
import { auth } from '../../../server/auth';
import { CLIENT_IP_HEADER } from '../../../server/client-ip';

/**
 * better-auth's routes. The client address (which its per-address sign-in limit keys on) is taken
 * from the connection, never from a header the client could set; behind a proxy, set TRUST_PROXY=true
 * to take the proxy's X-Forwarded-For instead.
 */
export const ALL: APIRoute = (ctx) => {
  const headers = new Headers(ctx.request.headers);
  const forwarded = process.env.TRUST_PROXY === 'true' ? headers.get('x-forwarded-for')?.split(',')[0]?.trim() : undefined;
  headers.set(CLIENT_IP_HEADER, forwarded || ctx.clientAddress);
  const method = ctx.request.method;
  const init: RequestInit & { duplex?: 'half' } = { method, headers };
  if (method !== 'GET' && method !== 'HEAD') {
    init.body = ctx.request.body;
    init.duplex = 'half';
  }
  return auth().handler(new Request(ctx.request.url, init));
};
