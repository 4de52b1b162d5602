/**
 * Figures read from unit hours (a site's first and last computed hour, the overview's sums over its
 * last day) kept in the web process's memory until unit hours or plant units change: 50 people asking
 * for the overview at once then cost one set of queries, not 50.
 *
 * How it learns of a change: the database notifies the channel HOURS_CHANNEL at the commit of any
 * statement that writes unit_hours or plant_units (statement triggers of the migration
 * web-read-cache; the engine's writes, retention, a unit removed, a test's own inserts alike). Each
 * notification moves the generation on and empties the cache, so an answer is always computed from
 * data at least as new as the last notified change. The key of an entry names the site (or unit) it
 * belongs to; the generation is the "latest compute stamp" of every site at once.
 *
 * The cache answers only while its listening connection is up: before it is, after it drops (until
 * it reconnects) and in processes that never start it (the worker, scripts, most tests) every call
 * computes afresh. The web server starts it (scripts/serve.ts marks the process); a test may call
 * startHoursCache(). HOURS_CACHE=0 turns it off.
 */
import { LRUCache } from 'lru-cache';
import pg from 'pg';
import { env } from './env';

export const HOURS_CHANNEL = 'lossline_hours_changed';

/** Entries kept: a few per site (its span, the overview's sums) and per unit (its span). */
const MAX_ENTRIES = 2000;
const RECONNECT_MS = 2000;

let generation = 0;
let live = false;
let wanted = false;
let client: pg.Client | null = null;
let connecting: Promise<void> | null = null;
// Promises, so that callers arriving while the first one computes share its answer.
const entries = new LRUCache<string, { value: Promise<unknown> }>({ max: MAX_ENTRIES });

/** Changes noticed so far (each notification of the channel counts one). */
export function hoursGeneration(): number {
  return generation;
}

/** True while the cache answers (its listening connection is up). */
export function hoursCacheLive(): boolean {
  return live;
}

function changed(): void {
  generation++;
  entries.clear();
}

function dropped(): void {
  live = false;
  client = null;
  changed();
  if (wanted) setTimeout(() => void connect(), RECONNECT_MS).unref();
}

async function connect(): Promise<void> {
  if (!wanted || client || connecting) return connecting ?? undefined;
  connecting = (async () => {
    const c = new pg.Client({ connectionString: env().DATABASE_URL });
    c.on('notification', (n) => {
      if (n.channel === HOURS_CHANNEL) changed();
    });
    c.on('error', () => undefined);
    c.on('end', () => {
      if (client === c) dropped();
    });
    try {
      await c.connect();
      await c.query(`listen ${HOURS_CHANNEL}`);
      client = c;
      // Anything cached before (there is nothing, or it was computed while not listening) is dropped.
      changed();
      live = wanted;
      if (!wanted) await c.end();
    } catch {
      await c.end().catch(() => undefined);
      if (wanted) setTimeout(() => void connect(), RECONNECT_MS).unref();
    }
  })().finally(() => {
    connecting = null;
  });
  return connecting;
}

/** Starts listening (the cache answers once the connection is up); resolves when it is. */
export async function startHoursCache(): Promise<void> {
  if (process.env.HOURS_CACHE === '0') return;
  wanted = true;
  await connect();
}

/** Stops listening and empties the cache (tests; a server shutting down). */
export async function stopHoursCache(): Promise<void> {
  wanted = false;
  await connecting;
  const c = client;
  live = false;
  client = null;
  changed();
  await c?.end().catch(() => undefined);
}

/** The web server (scripts/serve.ts marks its process) starts the cache on first use. */
function serverProcess(): boolean {
  return (globalThis as { __losslineServe?: boolean }).__losslineServe === true && process.env.HOURS_CACHE !== '0';
}

/**
 * The answer of `compute` for `key`, from memory when nothing in unit hours or plant units has changed
 * since it was computed. The answer is shared: callers must not change it.
 */
export async function cachedHours<T>(key: string, compute: () => Promise<T>): Promise<T> {
  if (!live) {
    if (!wanted && serverProcess()) void startHoursCache();
    return compute();
  }
  const hit = entries.get(key);
  if (hit) return hit.value as Promise<T>;
  const value = compute();
  entries.set(key, { value });
  value.catch(() => {
    if (entries.get(key)?.value === value) entries.delete(key);
  });
  // A change noticed while computing empties the cache (changed()), this entry with it; the answer
  // still goes to the callers who asked before the change was noticed.
  return value;
}
