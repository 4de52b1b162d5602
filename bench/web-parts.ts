/**
 * Where the time of the three bench:web requests goes, one request at a time (no load from this
 * script): the services behind them in-process, split into database time (every pool query timed)
 * and the rest (shaping), the session lookup, and each route over HTTP against the running server
 * (whatever the HTTP time adds to the service is session, guard, rendering and serialising).
 *
 *   node --import tsx bench/web-parts.ts   (DATABASE_URL, BETTER_AUTH_SECRET, PUBLIC_BASE_URL of a
 *   bench:web run; the server must be up and the bench's people made, i.e. after one bench:web run)
 *
 * Prints the median and p90 of BENCH_PARTS_ROUNDS (default 30) rounds per part, in ms. With
 * BENCH_WEB_PID (the server's process id; with WEB_PROCESSES > 1 the primary's, its copies counted too) it also prints the server's CPU time per request of each
 * route over HTTP (user + system, from /proc/PID/stat): unlike wall time, it stays the same under
 * load, and 50 connections on 2 cores with p95 < 300 ms need it to be a few ms.
 */
import { readFileSync } from 'node:fs';
import { asc, eq } from 'drizzle-orm';
import type pg from 'pg';
import { closeDb, db, pgPool } from '~/server/db/client';
import { plantUnits, sites } from '~/server/db/schema';
import { auth } from '~/server/auth';
import { overview, unitTrend } from '~/server/services/views';
import { unitHeader, unitHoursOf } from '~/server/services/engine-results';
import { answer } from '~/server/answer';
import { UnitHoursAnswer } from '~/lib/api/hours';

const ROUNDS = Number(process.env.BENCH_PARTS_ROUNDS ?? 30);
const BASE = process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4341';
const WEEK = { anchor: '2025-06-18', from: '2025-06-16T00:00:00Z', to: '2025-06-23T00:00:00Z' };

/** Database time of the current part: every query through the shared pool, summed. */
let dbMs = 0;
let dbCalls = 0;
function timePool(pool: pg.Pool) {
  const query = pool.query.bind(pool) as (...a: unknown[]) => Promise<unknown>;
  (pool as unknown as { query: (...a: unknown[]) => Promise<unknown> }).query = async (...a: unknown[]) => {
    const t = performance.now();
    try {
      return await query(...a);
    } finally {
      dbMs += performance.now() - t;
      dbCalls++;
    }
  };
}

const stats = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return `median ${s[Math.floor(s.length / 2)]!.toFixed(1)}, p90 ${s[Math.min(s.length - 1, Math.ceil(s.length * 0.9) - 1)]!.toFixed(1)}`;
};

async function part(name: string, run: () => Promise<unknown>) {
  const total: number[] = [];
  const inDb: number[] = [];
  let calls = 0;
  for (let i = 0; i < ROUNDS; i++) {
    dbMs = 0;
    dbCalls = 0;
    const t = performance.now();
    await run();
    total.push(performance.now() - t);
    inDb.push(dbMs);
    calls = dbCalls;
  }
  const rest = total.map((t, i) => t - inDb[i]!);
  console.log(`${name.padEnd(22)} total ${stats(total)} | database ${stats(inDb)} (${calls} queries) | rest ${stats(rest)}`);
}

async function cookieOf(email: string): Promise<string> {
  const res = await fetch(`${BASE}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: new URL(BASE).origin },
    body: JSON.stringify({ email, password: 'lossline-bench-1' }),
  });
  if (!res.ok) throw new Error(`sign-in answered ${res.status}: run npm run bench:web once first (it makes the bench's people)`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

const SERVER_PID = process.env.BENCH_WEB_PID;

/** CPU time of the server so far, ms: utime + stime of /proc/PID/stat (clock ticks of 10 ms) of the
 * process and its children (the copies WEB_PROCESSES > 1 starts under node:cluster). */
function serverCpuMs(): number | null {
  if (!SERVER_PID) return null;
  const cpuOf = (pid: string): number => {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
    let children = '';
    try {
      children = readFileSync(`/proc/${pid}/task/${pid}/children`, 'utf8');
    } catch {
      // no children file (an older kernel): the process alone
    }
    const own = (Number(fields[11]) + Number(fields[12])) * 10;
    return own + children.split(' ').filter(Boolean).reduce((sum, child) => sum + cpuOf(child), 0);
  };
  return cpuOf(SERVER_PID);
}

async function http(name: string, path: string, cookie: string, encoding = 'gzip') {
  const ms: number[] = [];
  const headers = { cookie, 'accept-encoding': encoding };
  let bytes = 0;
  // Warm-up (caches filled, code compiled), then the rounds timed.
  for (let i = 0; i < 3; i++) await (await fetch(BASE + path, { headers })).arrayBuffer();
  const cpu0 = serverCpuMs();
  for (let i = 0; i < ROUNDS; i++) {
    const t = performance.now();
    const res = await fetch(BASE + path, { headers });
    bytes = (await res.arrayBuffer()).byteLength;
    if (!res.ok) throw new Error(`${path} answered ${res.status}`);
    ms.push(performance.now() - t);
  }
  const cpu1 = serverCpuMs();
  const cpu = cpu0 !== null && cpu1 !== null ? ` | server CPU ${((cpu1 - cpu0) / ROUNDS).toFixed(2)} ms per request` : '';
  console.log(`${`${name} (${encoding})`.padEnd(32)} total ${stats(ms)}${cpu} | ${bytes} bytes`);
}

async function main() {
  timePool(pgPool());
  const [site] = await db().select().from(sites).where(eq(sites.name, 'Harrowgate Mills Energy Centre'));
  if (!site) throw new Error('no demo site: run npm run bench:web first');
  const [unit] = await db().select().from(plantUnits).where(eq(plantUnits.siteId, site.id)).orderBy(asc(plantUnits.name)).limit(1);
  const cookie = await cookieOf('bench-00@bench.lossline.test').catch((err: Error) => {
    console.log(`no session (${err.message.slice(0, 120)}): services only`);
    return null;
  });
  const trendPath = `/api/units/${unit!.id}/trend?range=week&anchor=${WEEK.anchor}`;
  const hoursPath = `/api/v1/units/${unit!.id}/hours?from=${encodeURIComponent(WEEK.from)}&to=${encodeURIComponent(WEEK.to)}`;
  console.log(`rounds ${ROUNDS}, one request at a time, ms; unit ${unit!.name}`);
  if (cookie) await part('session lookup', () => auth().api.getSession({ headers: new Headers({ cookie }) }));
  await part('overview service', () => overview());
  await part('trend week service', () => unitTrend(unit!.id, { range: 'week', anchor: WEEK.anchor }));
  await part('unit hours service', async () => {
    const u = await unitHeader(unit!.id);
    const hours = await unitHoursOf(u.id, new Date(WEEK.from), new Date(WEEK.to));
    return (await answer(UnitHoursAnswer, { unit: u, from: WEEK.from, to: WEEK.to, hours }).text()).length;
  });
  if (!cookie) return;
  // autocannon (bench:web) asks without Accept-Encoding; browsers ask for gzip.
  for (const encoding of ['identity', 'gzip']) {
    await http('overview over HTTP', '/', cookie, encoding);
    await http('trend week over HTTP', trendPath, cookie, encoding);
    await http('unit hours over HTTP', hoursPath, cookie, encoding);
  }
}

try {
  await main();
} finally {
  await closeDb();
}
