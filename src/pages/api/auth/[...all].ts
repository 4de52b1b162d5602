import type { APIRoute } from 'astro';
import { authHandler } from '~/server/auth';

let warned = false;

/**
 * better-auth's routes, through Lossline's own limits (src/server/auth.ts). The client address
 * (which the per-address sign-in limit keys on) is the connection's, as settled by scripts/serve.ts:
 * X-Forwarded-For counts only from the proxy TRUST_PROXY names.
 */
export const ALL: APIRoute = (ctx) => {
  if (import.meta.env.PROD && !warned && !(globalThis as { __losslineServe?: boolean }).__losslineServe) {
    warned = true;
    console.warn('[web] started without scripts/serve.ts (npm start): client addresses come from X-Forwarded-For as sent, so the per-address sign-in limit can be dodged.');
  }
  return authHandler(ctx.request, ctx.clientAddress);
};
