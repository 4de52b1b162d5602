/**
 * The web server: Astro's production build behind a thin Node listener that settles who the client
 * is before the app sees the request. Astro takes the client's address from X-Forwarded-For as sent,
 * so anyone could claim any address and slip past the per-address sign-in limit; here forwarded
 * headers count only from the proxy named by TRUST_PROXY and are dropped from everyone else.
 * It also sets the headers every answer carries (the app adds the full policy to its pages).
 *
 *   npm start   (node --import tsx scripts/serve.ts; PORT and HOST as for the standalone server)
 */
import http from 'node:http';
import compression from 'compression';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { parseTrustProxy, settleForwardedHeaders } from '~/server/client-ip';
import { BASELINE_HEADERS } from '~/server/security-headers';

process.env.ASTRO_NODE_AUTOSTART = 'disabled';
const proxies = parseTrustProxy(process.env.TRUST_PROXY);
const entry = resolve(process.env.LOSSLINE_ENTRY ?? 'dist/server/entry.mjs');
const { handler, options } = (await import(pathToFileURL(entry).href)) as {
  handler: (req: http.IncomingMessage, res: http.ServerResponse) => void;
  options: { host?: string | boolean; port?: number };
};
(globalThis as { __losslineServe?: boolean }).__losslineServe = true;

const port = Number(process.env.PORT ?? options.port ?? 4321);
const host = process.env.HOST ?? (typeof options.host === 'string' ? options.host : '127.0.0.1');

// Pages, scripts and JSON go out gzip-compressed when the browser accepts it (every page stays
// under 300 KB transferred: e2e/periods.spec.ts).
const compress = compression();
const server = http.createServer((req, res) => {
  settleForwardedHeaders(req.headers, req.socket.remoteAddress, proxies);
  for (const [k, v] of Object.entries(BASELINE_HEADERS)) res.setHeader(k, v);
  compress(req as Parameters<typeof compress>[0], res as Parameters<typeof compress>[1], () => handler(req, res));
});
server.listen(port, host, () => console.log(`[web] listening on http://${host}:${port}`));
const stop = () => server.close(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
