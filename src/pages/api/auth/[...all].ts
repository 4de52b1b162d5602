import type { APIRoute } from 'astro';
import { authHandler } from '../../../server/auth';

/**
 * better-auth's routes, through Lossline's own limits (src/server/auth.ts). The client address
 * (which the per-address sign-in limit keys on) is the connection's, as settled by scripts/serve.ts:
 * X-Forwarded-For counts only from the proxy TRUST_PROXY names.
 */
export const ALL: APIRoute = (ctx) => authHandler(ctx.request, ctx.clientAddress);
