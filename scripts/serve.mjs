/**
 * The web server: Astro's production build behind a thin Node listener that settles who the client
 * is before the app sees the request. Astro takes the client's address from X-Forwarded-For as sent,
 * so anyone could claim any address and slip past the per-address sign-in limit; here forwarded
 * headers count only from the proxy named by TRUST_PROXY and are dropped from everyone else.
 * It also sets the headers every answer carries (the app adds the full policy to its pages).
 *
 *   npm start   (node scripts/serve.mjs; PORT and HOST as for the standalone server)
 *
 * Plain JavaScript, started without `--import tsx`: with tsx's ESM hooks registered, every dynamic
 * import() Astro makes per request (the page's module, twice) went through the hooks' thread, which
 * cost about a third of a request's CPU (README, "Many users at once"). Its two TypeScript helpers
 * are loaded through tsx's CommonJS require, which registers no ESM hooks. NODE_ENV defaults to
 * production, so React renders the islands' HTML with its production build.
 *
 * WEB_PROCESSES (default 1) runs that many copies under node:cluster, sharing the port (the primary
 * hands out connections in turn), so that more than one core serves pages. Each copy keeps its own
 * read and sign-in caches, each emptied by the database's notifications on its own listening
 * connection (src/server/hours-cache.ts), and its own /api/v1 rate count (docs/api.md: up to n times
 * the limit with n processes); sign-in limits and pauses live in the database. A copy that dies is
 * started again; SIGTERM or SIGINT to the primary stops them all.
 */
import cluster from 'node:cluster';
import http from 'node:http';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import compression from 'compression';
import { require as tsxRequire } from 'tsx/cjs/api';

process.env.NODE_ENV ??= 'production';
const processes = Math.max(1, Math.floor(Number(process.env.WEB_PROCESSES ?? 1)) || 1);
if (processes > 1 && cluster.isPrimary) {
  let stopping = false;
  const listened = new WeakSet();
  for (let i = 0; i < processes; i++) cluster.fork();
  cluster.on('listening', (worker) => listened.add(worker));
  cluster.on('exit', (worker, code, signal) => {
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(process.exitCode ?? 0);
      return;
    }
    // One that never got to listen (a broken build, the port taken) would fail again: stop, as one process would.
    if (!listened.has(worker)) {
      console.error(`[web] process ${worker.process.pid} ended before listening (${signal ?? `exit ${code}`}); stopping`);
      stopping = true;
      for (const w of Object.values(cluster.workers ?? {})) w?.process.kill('SIGTERM');
      process.exitCode = 1;
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(1);
      return;
    }
    console.error(`[web] process ${worker.process.pid} ended (${signal ?? `exit ${code}`}); starting another`);
    cluster.fork();
  });
  const stopAll = () => {
    stopping = true;
    const left = Object.values(cluster.workers ?? {});
    if (left.length === 0) process.exit(0);
    for (const w of left) w?.process.kill('SIGTERM');
  };
  process.on('SIGTERM', stopAll);
  process.on('SIGINT', stopAll);
} else {
  await serve();
}

async function serve() {
  process.env.ASTRO_NODE_AUTOSTART = 'disabled';
  const { parseTrustProxy, settleForwardedHeaders } = tsxRequire('../src/server/client-ip.ts', import.meta.url);
  const { BASELINE_HEADERS } = tsxRequire('../src/server/security-headers.ts', import.meta.url);

  const proxies = parseTrustProxy(process.env.TRUST_PROXY);
  const entry = resolve(process.env.LOSSLINE_ENTRY ?? 'dist/server/entry.mjs');
  const { handler, options } = await import(pathToFileURL(entry).href);
  globalThis.__losslineServe = true;

  const port = Number(process.env.PORT ?? options.port ?? 4321);
  const host = process.env.HOST ?? (typeof options.host === 'string' ? options.host : '127.0.0.1');

  // Pages, scripts and JSON go out gzip-compressed when the browser accepts it (every page stays
  // under 300 KB transferred: e2e/periods.spec.ts).
  const compress = compression();
  const server = http.createServer((req, res) => {
    settleForwardedHeaders(req.headers, req.socket.remoteAddress, proxies);
    for (const [k, v] of Object.entries(BASELINE_HEADERS)) res.setHeader(k, v);
    compress(req, res, () => handler(req, res));
  });
  server.listen(port, host, () => console.log(`[web] listening on http://${host}:${port}${cluster.isWorker ? ` (process ${process.pid})` : ''}`));
  const stop = () => server.close(() => process.exit(0));
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}
