/**
 * Figures read from unit hours (a site's first and last computed hour, the overview's sums over its
 * last day) kept in the web process's memory until unit hours or plant units change: 50 people asking
 * for the overview at once then cost one set of queries, not 50.
 *
 * How it learns of a change: the database notifies the channel HOURS_CHANNEL at the commit of any
 * statement that writes unit_hours or plant_units (statement triggers of the migration
 * web-read-cache; the engine's writes, retention, a unit removed, a test's own inserts alike), and
 * sites, baselines or drift_notices (migration web-access-cache). Each
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
import { MINUTE_MS } from '~/lib/time';

export const HOURS_CHANNEL = 'lossline_hours_changed';
/**
 * Sent at the commit of any statement that changes who may do what: people (role, deactivation,
 * name), their sessions (ended, refreshed) and their site lists (migration web-access-cache). Each
 * notification empties the sign-in cache (cachedAccess), not the figures.
 */
export const ACCESS_CHANNEL = 'lossline_access_changed';
/** Longest an entry of the sign-in cache is kept, whatever happens (a backstop; changes empty it at once). */
export const ACCESS_MAX_AGE_MS = MINUTE_MS;

/** Entries kept: a few per site (its span, the overview's sums) and per unit (its span). */
const MAX_ENTRIES = 2000;
const RECONNECT_MS = 2000;

let generation = 0;
let accessGen = 0;
let live = false;
let wanted = false;
let client: pg.Client | null = null;
let connecting: Promise<void> | null = null;
// Promises, so that callers arriving while the first one computes share its answer.
const entries = new LRUCache<string, { value: Promise<unknown> }>({ max: MAX_ENTRIES });
/**
 * Whole answers (a trend's period, a unit's hours), bounded by their size as JSON: 64 M characters in
 * all (an entry counts 1 until its answer is in, then the length of its JSON).
 */
const MAX_LARGE_CHARS = 64 * 1024 * 1024;
const large = new LRUCache<string, { value: Promise<unknown> }>({ max: 5000, maxSize: MAX_LARGE_CHARS, sizeCalculation: () => 1 });
/** Sessions by their cookie (the signed token): a few per person signed in. */
const access = new LRUCache<string, { value: Promise<unknown> }>({ max: 10_000, ttl: ACCESS_MAX_AGE_MS, ttlAutopurge: false });

/** Changes noticed so far (each notification of the channel counts one). */
export function hoursGeneration(): number {
  return generation;
}

/** True while the cache answers (its listening connection is up). */
export function hoursCacheLive(): boolean {
  return live;
}

/** Changes of people, sessions and site lists noticed so far. */
export function accessGeneration(): number {
  return accessGen;
}

function changed(): void {
  hoursChanged();
  accessChanged();
}

function hoursChanged(): void {
  generation++;
  entries.clear();
  large.clear();
}

function accessChanged(): void {
  accessGen++;
  access.clear();
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
      if (n.channel === HOURS_CHANNEL) hoursChanged();
      else if (n.channel === ACCESS_CHANNEL) accessChanged();
    });
    c.on('error', () => undefined);
    c.on('end', () => {
      if (client === c) dropped();
    });
    try {
      await c.connect();
      await c.query(`listen ${HOURS_CHANNEL}; listen ${ACCESS_CHANNEL}`);
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
 * The answer of `compute` for `key`, from memory when nothing in unit hours, plant units, sites,
 * baselines or drift notices has changed since it was computed. The answer is shared: callers must
 * not change it. `large` keeps it among the fewer whole answers (hundreds of hours each).
 */
export async function cachedHours<T>(key: string, compute: () => Promise<T>, options: { large?: boolean } = {}): Promise<T> {
  if (!live) {
    if (!wanted && serverProcess()) void startHoursCache();
    return compute();
  }
  const store = options.large ? large : entries;
  const hit = store.get(key);
  if (hit) return hit.value as Promise<T>;
  const value = compute();
  const entry = { value };
  store.set(key, entry);
  value.then(
    (v) => {
      // Counted at its size once known (a change may have emptied the cache meanwhile: then not kept).
      if (options.large && store.peek(key) === entry) store.set(key, entry, { size: Math.max(1, JSON.stringify(v)?.length ?? 1) });
    },
    () => {
      if (store.peek(key) === entry) store.delete(key);
    },
  );
  // A change noticed while computing empties the cache (changed()), this entry with it; the answer
  // still goes to the callers who asked before the change was noticed.
  return value;
}

/**
 * The answer of `compute` for a session cookie `key` (the guard's session lookup with the person's
 * sites), from memory while nobody's role, deactivation, sessions or site list has changed since it
 * was computed (ACCESS_CHANNEL) and for at most ACCESS_MAX_AGE_MS. Like cachedHours, it answers only
 * while the listening connection is up, so a deactivation takes effect as soon as its commit is
 * notified. A null answer (no session) is not kept. The answer is shared: callers must not change it.
 */
export async function cachedAccess<T>(key: string, compute: () => Promise<T | null>): Promise<T | null> {
  if (!live) {
    if (!wanted && serverProcess()) void startHoursCache();
    return compute();
  }
  const hit = access.get(key);
  if (hit) return hit.value as Promise<T | null>;
  const gen = accessGen;
  const value = compute();
  access.set(key, { value });
  const drop = () => {
    if (access.get(key)?.value === value) access.delete(key);
  };
  value.then((v) => {
    // Nothing to keep, or a change came in while computing (the entry went with access.clear()).
    if (v === null || gen !== accessGen) drop();
  }, drop);
  return value;
}
