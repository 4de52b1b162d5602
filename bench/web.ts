/**
 * Many people at once, run by `npm run bench:web` (./docker-free-start.sh bench-web starts the
 * production server on the demo year first). 50 energy leads sign in (created here, once, beside the
 * demo accounts), then for BENCH_WEB_SECONDS (default 60) each keeps one connection busy asking in
 * turn for the overview page, a week's trend of a unit and a week of a unit's hours, with autocannon.
 * Prints p50, p95 and p99 latency over all answers and per route, answers per second and errors
 * (any answer that is not 2xx, timeouts and broken connections), with the load average.
 */
import { randomUUID } from 'node:crypto';
import type { EventEmitter } from 'node:events';
import { loadavg } from 'node:os';
import autocannon from 'autocannon';
import { hashPassword } from 'better-auth/crypto';
import { asc, eq, like } from 'drizzle-orm';
import { closeDb, db } from '~/server/db/client';
import { account, plantUnits, sites, user } from '~/server/db/schema';

const USERS = Number(process.env.BENCH_WEB_USERS ?? 50);
const SECONDS = Number(process.env.BENCH_WEB_SECONDS ?? 60);
const BASE = process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4341';
const PASSWORD = 'lossline-bench-1';
const SITE = 'Harrowgate Mills Energy Centre';
/** A week in the middle of the demo year (docs/demo.md: it starts 2025-01-06). */
const WEEK = { anchor: '2025-06-18', from: '2025-06-16T00:00:00Z', to: '2025-06-23T00:00:00Z' };

const emailOf = (i: number) => `bench-${String(i).padStart(2, '0')}@bench.lossline.test`;

/** The bench's people: energy leads of every site, made once (kept for later runs). */
async function ensureUsers(): Promise<void> {
  const have = new Set((await db().select({ email: user.email }).from(user).where(like(user.email, '%@bench.lossline.test'))).map((u) => u.email));
  const password = await hashPassword(PASSWORD);
  for (let i = 0; i < USERS; i++) {
    if (have.has(emailOf(i))) continue;
    const id = randomUUID();
    await db().transaction(async (tx) => {
      await tx.insert(user).values({ id, email: emailOf(i), name: `Bench Lead ${i}`, role: 'energy-lead', emailVerified: true });
      await tx.insert(account).values({ id: randomUUID(), accountId: id, providerId: 'credential', userId: id, password });
    });
  }
}

/** Signs one person in; the session cookie to send. */
async function signIn(email: string): Promise<string> {
  const res = await fetch(`${BASE}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: new URL(BASE).origin },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (!res.ok) throw new Error(`sign-in of ${email} answered ${res.status}: ${(await res.text()).slice(0, 200)}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

const percentile = (sorted: number[], p: number) => (sorted.length ? sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]! : NaN);
const line = (name: string, ms: number[]) => {
  const s = [...ms].sort((a, b) => a - b);
  return `${name}: n ${s.length}, p50 ${percentile(s, 50).toFixed(0)} ms, p95 ${percentile(s, 95).toFixed(0)} ms, p99 ${percentile(s, 99).toFixed(0)} ms`;
};

async function main() {
  const [site] = await db().select().from(sites).where(eq(sites.name, SITE));
  if (!site) throw new Error(`no '${SITE}': load the demo first (./docker-free-start.sh bench-web does)`);
  const units = await db().select({ id: plantUnits.id, name: plantUnits.name }).from(plantUnits).where(eq(plantUnits.siteId, site.id)).orderBy(asc(plantUnits.name));
  await ensureUsers();
  const cookies: string[] = [];
  for (let i = 0; i < USERS; i++) cookies.push(await signIn(emailOf(i)));
  const routes = ['overview', 'trend week', 'unit hours'] as const;
  const latencies = new Map<string, number[]>(routes.map((r) => [r, []]));
  const failed = new Map<string, number>();
  type Client = { setHeaders: (h: Record<string, string>) => void; setRequests: (r: { method: string; path: string }[]) => void; benchAnswers?: number };
  let clients = 0;
  console.log(`load average before: ${loadavg().map((x) => x.toFixed(2)).join(' ')}`);
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon(
      {
        url: BASE,
        connections: USERS,
        duration: SECONDS,
        timeout: 10,
        // Each connection is one person: their cookie, and a unit of their own (the 7 demo units in turn).
        setupClient: (c: Client) => {
          const i = clients++;
          const unit = units[i % units.length]!;
          c.setHeaders({ cookie: cookies[i % cookies.length]! });
          c.setRequests([
            { method: 'GET', path: '/' },
            { method: 'GET', path: `/api/units/${unit.id}/trend?range=week&anchor=${WEEK.anchor}` },
            { method: 'GET', path: `/api/v1/units/${unit.id}/hours?from=${encodeURIComponent(WEEK.from)}&to=${encodeURIComponent(WEEK.to)}` },
          ]);
        },
      } as unknown as autocannon.Options,
      (err, res) => (err ? reject(err) : resolve(res)),
    );
    // A connection asks its three routes in turn, one at a time: the n-th answer is route n mod 3.
    (instance as unknown as EventEmitter).on('response', (c: Client, status: number, _bytes: number, ms: number) => {
      const n = (c.benchAnswers = (c.benchAnswers ?? 0) + 1) - 1;
      const route = routes[n % routes.length]!;
      latencies.get(route)!.push(ms);
      if (status < 200 || status > 299) failed.set(route, (failed.get(route) ?? 0) + 1);
    });
  });
  console.log(`load average after: ${loadavg().map((x) => x.toFixed(2)).join(' ')}`);
  const all = [...latencies.values()].flat();
  for (const r of routes) console.log(`  ${line(r, latencies.get(r)!)}, not 2xx ${failed.get(r) ?? 0}`);
  const sorted = [...all].sort((a, b) => a - b);
  console.log(`web processes ${process.env.WEB_PROCESSES ?? 1} (WEB_PROCESSES)`);
  console.log(`users ${USERS}, seconds ${SECONDS}, answers ${result.requests.total} (${result.requests.average.toFixed(1)}/s)`);
  console.log(`latency_p50_ms ${percentile(sorted, 50).toFixed(0)}`);
  console.log(`latency_p95_ms ${percentile(sorted, 95).toFixed(0)}`);
  console.log(`latency_p99_ms ${percentile(sorted, 99).toFixed(0)}`);
  console.log(`errors ${result.non2xx + result.errors + result.timeouts} (not 2xx ${result.non2xx}, timeouts ${result.timeouts}, connection errors ${result.errors})`);
  console.log('target: p95 < 300 ms and no errors');
}

try {
  await main();
} finally {
  await closeDb();
}
