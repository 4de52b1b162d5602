/**
 * The reader threads of this process (ingest-thread.ts) and one read's conversation with one of
 * them. A thread is started on first need (or ahead by warmReaderThread) and kept for the next read;
 * at most INGEST_READ_THREADS (default 2) run at once. Where none can be had (the setting is 0, all
 * are busy, or a thread cannot start, as in a build without the source files), the caller parses on
 * its own thread as before: the result is the same, only slower.
 *
 * The thread runs ingest-thread.ts bundled once per process by esbuild into one CommonJS script
 * (about 0.4 s, kept for every later thread): a thread that loaded the TypeScript sources through
 * tsx as the worker process does would carry a loader thread of its own, 52 MB resident against
 * 20 MB for the bundle (measured on the idle worker).
 */
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { IngestError, sniffLayout, type LayoutProfile, type RejectedCell } from '~/lib/ingest';
import type { PackedHours } from '~/lib/ingest/hour-pack';
import type { SiteReadFacts } from './ingest-options';
import type { ReaderThreadIn, ReaderThreadOut, ThreadError } from './ingest-thread';

/** Chunks sent to the thread and not yet parsed (each at most a chunk of the byte stream). */
const CHUNKS_IN_FLIGHT = 32;
/**
 * The thread's young generation [MB]. The parse makes short-lived strings fast; with V8's default
 * the thread's young generation alone grew by about 30 MB more (peak resident size of a 70 MB read,
 * 335 MB against 304 MB with 8 MB, at the same read time). No limit on the old generation.
 */
const THREAD_YOUNG_MB = 8;
/** How long a new thread may take to load before the read goes on without it [ms]. */
const START_TIMEOUT_MS = 30_000;

function maxThreads(): number {
  const n = Number(process.env.INGEST_READ_THREADS ?? 2);
  return Number.isInteger(n) && n >= 0 ? n : 2;
}

/** The thread's source file: beside this module, or in the checkout the process runs from (a built web server). */
function threadFile(): string | null {
  let here: string | null = null;
  try {
    here = join(dirname(fileURLToPath(import.meta.url)), 'ingest-thread.ts');
  } catch {
    here = null;
  }
  return [here, join(process.cwd(), 'src/server/services/ingest-thread.ts')].find((f): f is string => f !== null && existsSync(f)) ?? null;
}

interface PooledThread {
  worker: Worker;
  ready: Promise<boolean>;
  onMessage: ((m: ReaderThreadOut) => void) | null;
  onDeath: ((err: Error) => void) | null;
}

const idle: PooledThread[] = [];
let running = 0;
/** Threads being started for a read. */
let starting = 0;
let jobs = 0;

let bundled: Promise<string | null> | null = null;

/** ingest-thread.ts and all it imports as one script, or null when it cannot be built here. */
function threadScript(): Promise<string | null> {
  bundled ??= (async () => {
    const file = threadFile();
    if (!file) return null;
    try {
      const { build } = await import('esbuild');
      const out = await build({ entryPoints: [file], bundle: true, platform: 'node', format: 'cjs', target: 'node20', write: false, logLevel: 'silent' });
      return out.outputFiles[0]?.text ?? null;
    } catch (err) {
      console.error(`[ingest] the reader thread could not be built (${(err as Error).message}): uploads are parsed on the calling thread`);
      return null;
    }
  })();
  return bundled;
}

async function spawnThread(): Promise<PooledThread | null> {
  const code = await threadScript();
  if (!code) return null;
  let worker: Worker;
  try {
    worker = new Worker(code, { eval: true, resourceLimits: { maxYoungGenerationSizeMb: THREAD_YOUNG_MB } });
  } catch {
    return null;
  }
  const t: PooledThread = { worker, ready: Promise.resolve(false), onMessage: null, onDeath: null };
  t.ready = new Promise<boolean>((resolve) => {
    const timer = setTimeout(() => resolve(false), START_TIMEOUT_MS);
    worker.on('message', (m: ReaderThreadOut) => {
      if (m.type === 'ready') {
        clearTimeout(timer);
        resolve(true);
        return;
      }
      t.onMessage?.(m);
    });
    const die = (err: Error) => {
      clearTimeout(timer);
      resolve(false);
      const i = idle.indexOf(t);
      if (i >= 0) idle.splice(i, 1);
      t.onDeath?.(err);
    };
    worker.on('error', die);
    worker.on('exit', (code) => die(new Error(`the reader thread stopped (exit code ${code})`)));
  });
  return t;
}

/**
 * A day of one-minute readings of 50 tags: read once by a new thread at warmReaderThread, so that its
 * parse is compiled to machine code before the first real file (as after any earlier upload).
 */
function warmUpFile(): Uint8Array {
  const lines = ['Timestamp,' + Array.from({ length: 50 }, (_, j) => `WARM-${j}`).join(',')];
  const start = Date.UTC(2020, 0, 1);
  for (let i = 0; i < 1440; i++) {
    const cells = Array.from({ length: 50 }, (_, j) => (100 + j + Math.sin(i / 40 + j)).toFixed(3));
    lines.push(`${new Date(start + i * 60_000).toISOString().slice(0, 19).replace('T', ' ')},${cells.join(',')}`);
  }
  return new TextEncoder().encode(lines.join('\n') + '\n');
}

/**
 * Starts one reader thread ahead of the first read (the worker at its start; a web process before
 * its first machine upload; a bench before it times) and has it read a small generated file.
 */
export async function warmReaderThread(): Promise<boolean> {
  if (maxThreads() === 0 || idle.length > 0 || running > 0) return idle.length > 0 || running > 0;
  const t = await spawnThread();
  if (!t) return false;
  if (!(await t.ready)) {
    await t.worker.terminate().catch(() => undefined);
    return false;
  }
  t.worker.unref();
  idle.push(t);
  const bytes = warmUpFile();
  const facts: SiteReadFacts = { timeZone: 'UTC', timeWindow: { minMs: 0, maxMs: Date.UTC(2100, 0, 1) }, goodQualityCodes: [], tags: [], links: [] };
  const profile = sniffLayout(new TextDecoder().decode(bytes.subarray(0, 65536)), { complete: false });
  const read = await startThreadRead(facts, profile, { onHours: () => undefined, onRejects: () => undefined });
  if (!read) return true;
  try {
    for (let o = 0; o < bytes.length; o += 65536) await read.push(bytes.subarray(o, o + 65536));
    await read.end();
  } finally {
    read.drop();
  }
  return true;
}

/** Stops the idle reader threads (tests and a worker's shutdown). */
export async function stopReaderThreads(): Promise<void> {
  const all = idle.splice(0);
  await Promise.all(all.map((t) => t.worker.terminate().catch(() => undefined)));
}

async function acquire(): Promise<PooledThread | null> {
  while (idle.length > 0) {
    const t = idle.pop()!;
    if (await t.ready) return t;
  }
  if (running + starting + idle.length >= maxThreads()) return null;
  starting++;
  const t = await spawnThread().finally(() => starting--);
  if (!t) return null;
  if (!(await t.ready)) {
    await t.worker.terminate().catch(() => undefined);
    return null;
  }
  return t;
}

/** Chunk memory the threads handed back, for the next chunks (at most SPARE_BUFFERS kept). */
const spares: ArrayBuffer[] = [];
const SPARE_BUFFERS = CHUNKS_IN_FLIGHT + 8;

/** A Uint8Array of n bytes over a spare buffer large enough, or over a new one. */
function spareBuffer(n: number): Uint8Array {
  for (let i = spares.length - 1; i >= 0; i--) {
    const b = spares[i]!;
    if (b.byteLength >= n) {
      spares.splice(i, 1);
      return new Uint8Array(b, 0, n);
    }
  }
  return new Uint8Array(new ArrayBuffer(Math.max(n, 65536)), 0, n);
}

function keepSpare(b: ArrayBuffer) {
  if (spares.length < SPARE_BUFFERS) spares.push(b);
}

function errorFrom(e: ThreadError): Error {
  if (e.name === 'IngestError' && e.code) return new IngestError(e.code as IngestError['code'], e.message, e.details ?? {}, e.line ?? null);
  // A fault of the reading code keeps its kind, so it is told as a reader fault (ingest-failure.ts).
  if (e.name === 'TypeError') return new TypeError(e.message);
  if (e.name === 'RangeError') return new RangeError(e.message);
  return new Error(e.message);
}

export interface ThreadRead {
  /** Sends a chunk; resolves when fewer than CHUNKS_IN_FLIGHT wait in the thread. Throws the thread's failure. */
  push(bytes: Uint8Array): Promise<void>;
  /** Ends the file; resolves with the thread's report once every batch has been handed over. */
  end(): Promise<{ report: Extract<ReaderThreadOut, { type: 'done' }>['report']; encoding: string }>;
  /** Abandons the read (the caller failed); the thread goes back to the pool. */
  drop(): void;
}

/**
 * Starts a read on a reader thread: `onHours` and `onRejects` receive the thread's batches in order.
 * Null when no thread can be had (the caller parses on its own thread).
 */
export async function startThreadRead(
  facts: SiteReadFacts,
  profile: LayoutProfile,
  handlers: { onHours: (batch: PackedHours) => void; onRejects: (cells: RejectedCell[]) => void },
): Promise<ThreadRead | null> {
  if (maxThreads() === 0) return null;
  const t = await acquire();
  if (!t) return null;
  running++;
  t.worker.ref();
  const job = ++jobs;
  let sent = 0;
  let read = 0;
  let failure: Error | null = null;
  let finished = false;
  /** The push waiting for the thread to catch up, and the end waiting for its answer. */
  let wake: (() => void) | null = null;
  let answer: ((m: Extract<ReaderThreadOut, { type: 'done' }> | null) => void) | null = null;
  const release = (alive: boolean) => {
    if (finished) return;
    finished = true;
    running--;
    t.onMessage = null;
    t.onDeath = null;
    if (!alive) return;
    t.worker.unref();
    idle.push(t);
  };
  const stop = (err: Error) => {
    failure ??= err;
    wake?.();
    wake = null;
    answer?.(null);
    answer = null;
  };
  t.onMessage = (m) => {
    if (!('job' in m) || m.job !== job) return;
    try {
      if (m.type === 'hours') handlers.onHours(m.batch);
      else if (m.type === 'rejects') handlers.onRejects(m.cells);
      else if (m.type === 'read') {
        read = m.chunks;
        if (m.spare) keepSpare(m.spare);
        if (sent - read < CHUNKS_IN_FLIGHT) {
          wake?.();
          wake = null;
        }
      } else if (m.type === 'failed') stop(errorFrom(m.error));
      else if (m.type === 'done') {
        answer?.(m);
        answer = null;
      }
    } catch (err) {
      // A handler's failure (the writer refused a batch) ends the read; the thread is told to drop it.
      t.worker.postMessage({ type: 'drop', job } satisfies ReaderThreadIn);
      stop(err as Error);
    }
  };
  t.onDeath = (err) => {
    stop(err);
    release(false);
  };
  const send = (m: ReaderThreadIn, transfer: ArrayBuffer[] = []) => t.worker.postMessage(m, transfer);
  send({ type: 'start', job, facts, profile });
  return {
    async push(bytes) {
      if (failure) throw failure;
      // A copy the thread owns (the stream's buffer may share its memory with others, and a body
      // read while uploading goes to the store too), in memory the thread hands back once it has
      // parsed it: fresh memory for every chunk cost 160 ms of page faults per 70 MB.
      const own = spareBuffer(bytes.byteLength);
      own.set(bytes);
      send({ type: 'chunk', job, bytes: own }, [own.buffer as ArrayBuffer]);
      sent++;
      if (sent - read >= CHUNKS_IN_FLIGHT) await new Promise<void>((resolve) => (wake = resolve));
      if (failure) throw failure;
    },
    async end() {
      const m = failure ? null : await new Promise<Extract<ReaderThreadOut, { type: 'done' }> | null>((resolve) => {
        answer = resolve;
        send({ type: 'end', job });
      });
      release(true);
      if (!m) throw failure ?? new Error('the reader thread ended without an answer');
      return { report: m.report, encoding: m.encoding };
    },
    drop() {
      if (finished) return;
      send({ type: 'drop', job });
      release(true);
    },
  };
}
