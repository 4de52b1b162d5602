/**
 * Ingest benchmark, run by `npm run bench:ingest` (which starts throwaway services first through
 * `./docker-free-start.sh bench-ingest`). In one run it
 *   1. generates a one-minute wide export: 200 tags x 30 days = 43 200 rows, 8.64 million values;
 *   2. reads and aggregates it into tag hours in-process (the ingest core, file streamed from disk);
 *   3. reads and aggregates the same file hourly with pandas (Debian's python3-pandas);
 *   4. uploads it through the API path into the object store and times upload -> committed tag hours
 *      with a real worker process, whose peak resident memory is read from /proc.
 * Prints: ingest_values_per_s, vs_pandas (pandas time / ours), end_to_end_s, worker_peak_rss_mb.
 * `npm run bench:ingest -- --mb 500` runs it on a 500 MB export instead of 70 MB.
 * A machine upload within INGEST_WHILE_UPLOADING_MAX_MB is read while it uploads (in this process,
 * services/ingest-early.ts): the bench says so and prints when the reader started and committed;
 * INGEST_WHILE_UPLOADING_MAX_MB=0 times the worker's read instead.
 * BENCH_INGEST_BROWSER=1 uploads as the uploads page does instead (the SHA-256 declared, a presigned
 * PUT straight into the store, then complete): the worker hashes the stored bytes while it reads them.
 */
import { spawn, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { request } from 'node:http';
import { closeSync, createReadStream, mkdtempSync, openSync, readFileSync, readSync, rmSync, statSync, writeSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { eq } from 'drizzle-orm';
import { createFileIngest, sniffLayout } from '~/lib/ingest';
import { closeDb, db } from '~/server/db/client';
import { layoutProfiles, sites, uploads, user } from '~/server/db/schema';
import { queue, stopQueue } from '~/server/queue';
import { stopReaderThreads, warmReaderThread } from '~/server/services/ingest-thread-pool';
import { completeBrowserUpload, createBrowserUpload, receiveApiUpload } from '~/server/services/uploads';
import { bytesPerRow } from './storage';
import { cpuGroups, cpuSince, cpuSnapshot } from './cpu';

const TAGS = 200;
/** Bytes of one generated day (1440 rows of 200 values) [MB]. */
const MB_PER_DAY = 69.8 / 30;
/**
 * 30 days: a 70 MB export. `npm run bench:ingest -- --mb 500` (or BENCH_INGEST_MB=500) makes about
 * 500 MB (215 days, the worker's memory check); BENCH_INGEST_DAYS sets the days directly.
 */
function days(): number {
  const i = process.argv.indexOf('--mb');
  const mb = Number(i > 0 ? process.argv[i + 1] : (process.env.BENCH_INGEST_MB ?? NaN));
  if (Number.isFinite(mb) && mb > 0) return Math.max(1, Math.round(mb / MB_PER_DAY));
  return Number(process.env.BENCH_INGEST_DAYS ?? 30);
}
const DAYS = days();
const ROWS = DAYS * 24 * 60;
const PYTHON = process.env.LOSSLINE_PYTHON ?? '/usr/bin/python3';

/** Writes the export a day at a time (a 500 MB file is never one string). */
function generate(path: string) {
  const pad = (n: number) => String(n).padStart(2, '0');
  const fd = openSync(path, 'w');
  writeSync(fd, ['Timestamp', ...Array.from({ length: TAGS }, (_, j) => `NB.AI-${1000 + j}`)].join(',') + '\n');
  const start = Date.UTC(2025, 5, 1);
  let parts: string[] = [];
  for (let i = 0; i < ROWS; i++) {
    const d = new Date(start + i * 60_000);
    let line = `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}:00`;
    for (let j = 0; j < TAGS; j++) line += ',' + (100 + j + 10 * Math.sin(i / 50 + j)).toFixed(3);
    parts.push(line + '\n');
    if (parts.length === 1440) {
      writeSync(fd, parts.join(''));
      parts = [];
    }
  }
  writeSync(fd, parts.join(''));
  closeSync(fd);
}

async function inProcess(path: string) {
  const t0 = performance.now();
  let hours = 0;
  const ingest = createFileIngest({ timeZone: 'UTC', onHour: () => hours++ });
  for await (const chunk of createReadStream(path, { highWaterMark: 64 * 1024 })) ingest.push(chunk as Buffer);
  const out = ingest.end();
  return { seconds: (performance.now() - t0) / 1000, values: out.report.valueCount, hours };
}

/** A full garbage collection of this process before a timed part (V8's gc(), reached without a command-line flag). */
function collectGarbage() {
  setFlagsFromString('--expose-gc');
  (runInNewContext('gc') as () => void)();
}

function pandas(path: string) {
  const script = `
import sys, time, pandas as pd
t0 = time.perf_counter()
df = pd.read_csv(sys.argv[1], parse_dates=['Timestamp'], index_col='Timestamp')
r = df.resample('1h')
out = pd.concat({'mean': r.mean(), 'min': r.min(), 'max': r.max(), 'std': r.std(), 'first': r.first(), 'last': r.last(), 'count': r.count()}, axis=1)
print(time.perf_counter() - t0, pd.__version__, out.shape[0] * ${TAGS})
`;
  const res = spawnSync(PYTHON, ['-c', script, path], { encoding: 'utf8' });
  if (res.status !== 0) throw new Error(`pandas run failed: ${res.stderr}`);
  const [seconds, version, hours] = res.stdout.trim().split(/\s+/);
  return { seconds: Number(seconds), version: version!, hours: Number(hours) };
}

function peakRssMb(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  const kb = Number(status.match(/VmHWM:\s+(\d+)/)?.[1] ?? 0);
  return kb / 1024;
}

/**
 * An upload as the uploads page makes it: the browser hashes the file (timed here too, it is part of
 * the person's wait), the record is created, the bytes go by the presigned PUT, then complete.
 */
async function browserUpload(siteId: string, path: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path, { highWaterMark: 1024 * 1024 })) hash.update(chunk as Buffer);
  // The person who uploads (the bench's services have no accounts): one made for the bench.
  const [operator] = await db()
    .insert(user)
    .values({ id: `bench-${Date.now()}`, name: 'Bench operator', email: `bench-${Date.now()}@bench.lossline.test`, role: 'operator' })
    .returning({ id: user.id });
  const size = statSync(path).size;
  const c = await createBrowserUpload(siteId, { fileName: 'bench.csv', sizeBytes: size, contentType: 'text/csv', sha256: hash.digest('hex') }, operator!.id);
  await new Promise<void>((resolve, reject) => {
    const req = request(c.url, { method: 'PUT', headers: { ...c.headers, 'content-length': String(size) } }, (res) => {
      res.resume();
      res.on('end', () => (res.statusCode === 200 ? resolve() : reject(new Error(`the store answered ${res.statusCode} to the PUT`))));
    });
    req.on('error', reject);
    createReadStream(path, { highWaterMark: 1024 * 1024 }).pipe(req);
  });
  await completeBrowserUpload(c.uploadId);
  return c.uploadId;
}

async function endToEnd(path: string) {
  const worker = spawn(process.execPath, [...(process.env.BENCH_WORKER_NODE_ARGS ?? '').split(' ').filter(Boolean), '--import', 'tsx', 'src/worker/main.ts'], { stdio: ['ignore', 'pipe', 'inherit'], env: { ...process.env, LOSSLINE_INGEST_TIMING: '1' } });
  await new Promise<void>((resolve, reject) => {
    worker.stdout!.on('data', (d: Buffer) => {
      const text = d.toString();
      for (const line of text.split('\n')) if (line.startsWith('[ingest]')) console.log(line);
      if (text.includes('[worker] ready')) resolve();
    });
    worker.on('exit', (code) => reject(new Error(`worker exited ${code}`)));
  });
  const [site] = await db().insert(sites).values({ name: `Bench site ${Date.now()}`, timeZone: 'UTC' }).returning();
  // The layout a person confirmed for this shape (its numbers all have three decimals, which a
  // machine upload never guesses): saved for the site like the uploads page does.
  const headBytes = Buffer.alloc(96 * 1024);
  const fd = openSync(path, 'r');
  const got = readSync(fd, headBytes, 0, headBytes.length, 0);
  closeSync(fd);
  const head = headBytes.subarray(0, got).toString('utf8');
  const sniffed = sniffLayout(head, { complete: false });
  await db()
    .insert(layoutProfiles)
    .values({ siteId: site!.id, fingerprint: sniffed.fingerprint, name: 'bench layout', profile: { ...sniffed, questions: [] } });
  // The timing lines of a read in this process (read while uploading) too.
  process.env.LOSSLINE_INGEST_TIMING = '1';
  // This process stands for a web process that has served before: its job queue is started and its
  // reader thread is loaded (both happen once per process, at its first machine upload).
  await queue();
  console.log(`  reader thread in this process: ${(await warmReaderThread()) ? 'loaded' : 'none (parsed on the main thread)'}`);
  const groups = await cpuGroups(worker.pid!);
  // Both timed parts start from a collected heap (the in-process read's leftovers are not the upload's to collect).
  collectGarbage();
  const cpu0 = cpuSnapshot(groups);
  const t0 = performance.now();
  const t0Ms = Date.now();
  // The size is passed as the files endpoint passes a request's Content-Length (one streamed PUT);
  // BENCH_INGEST_MULTIPART=1 leaves it out, as for a chunked request (multipart upload).
  const size = process.env.BENCH_INGEST_MULTIPART === '1' ? undefined : statSync(path).size;
  console.log(`  upload path: ${process.env.BENCH_INGEST_BROWSER === '1' ? 'browser (presigned PUT, hashed by the worker while it reads)' : size === undefined ? 'machine, multipart' : 'machine, one streamed PUT'}`);
  // This process's resident memory while it uploads (and, read while uploading, reads) the file.
  const rssBeforeMb = process.memoryUsage().rss / 1024 ** 2;
  let rssPeakMb = rssBeforeMb;
  const sampler = setInterval(() => (rssPeakMb = Math.max(rssPeakMb, process.memoryUsage().rss / 1024 ** 2)), 100);
  const { uploadId, readWhileUploading } =
    process.env.BENCH_INGEST_BROWSER === '1'
      ? { uploadId: await browserUpload(site!.id, path), readWhileUploading: false }
      : await receiveApiUpload(site!.id, 'bench.csv', createReadStream(path, { highWaterMark: 1024 * 1024 }), {}, size);
  const uploadedS = (performance.now() - t0) / 1000;
  clearInterval(sampler);
  console.log(`  read while uploading: ${readWhileUploading ? 'yes (read and committed in this process before the endpoint answered)' : 'no (read by the worker)'}`);
  let status = '';
  let peak = 0;
  for (;;) {
    const [u] = await db().select({ status: uploads.status, reason: uploads.failureReason }).from(uploads).where(eq(uploads.id, uploadId));
    status = u!.status;
    peak = Math.max(peak, peakRssMb(worker.pid!));
    if (status === 'done' || status === 'read-with-problems' || status === 'failed' || status === 'needs-review') {
      if (status !== 'done' && status !== 'read-with-problems') throw new Error(`bench upload ended ${status}: ${u!.reason}`);
      break;
    }
    await new Promise((r) => setTimeout(r, 25));
  }
  const seconds = (performance.now() - t0) / 1000;
  const [u] = await db().select().from(uploads).where(eq(uploads.id, uploadId));
  if (readWhileUploading) {
    // Upload and read overlap: the moments from the start of the upload, by the machine's clock
    // (the database and this process share it); the store's moment is in the [ingest] line above.
    const at = (d: Date) => ((d.getTime() - t0Ms) / 1000).toFixed(2);
    console.log(
      `  upload and read together ${uploadedS.toFixed(2)} s: record at ${at(u!.createdAt)} s, reader started at ${at(u!.startedAt!)} s, committed at ${at(u!.finishedAt!)} s, endpoint answered at ${uploadedS.toFixed(2)} s`,
    );
    console.log('  (cpu "bench" below is this process: the upload and the read; the worker only idles)');
    console.log(`  this process's rss ${rssBeforeMb.toFixed(0)} MB before the upload, peak ${rssPeakMb.toFixed(0)} MB while it uploaded and read (sampled every 100 ms)`);
  } else {
    const queuedS = (u!.startedAt!.getTime() - u!.createdAt.getTime()) / 1000 - uploadedS;
    console.log(`  upload into the store ${uploadedS.toFixed(2)} s, waiting for the worker ${queuedS.toFixed(2)} s, reading and committing ${((u!.finishedAt!.getTime() - u!.startedAt!.getTime()) / 1000).toFixed(2)} s`);
  }
  peak = Math.max(peak, peakRssMb(worker.pid!));
  console.log(`  cpu seconds: ${cpuSince(cpu0, cpuSnapshot(await cpuGroups(worker.pid!)))}`);
  worker.kill('SIGTERM');
  return { seconds, peakMb: peak, readWhileUploading };
}

const dir = mkdtempSync(join(tmpdir(), 'lossline-bench-'));
const file = join(dir, 'export.csv');
try {
  generate(file);
  const mb = statSync(file).size / 1e6;
  console.log(`load_average_before ${loadavg().map((x) => x.toFixed(2)).join(' ')}`);
  await inProcess(file); // warm-up
  collectGarbage();
  const ours = await inProcess(file);
  // BENCH_INGEST_PANDAS=0 leaves the pandas comparison out (when only the end-to-end part is of interest).
  const pd = process.env.BENCH_INGEST_PANDAS === '0' ? { seconds: NaN, version: 'not run', hours: NaN } : pandas(file);
  console.log(`file_megabytes ${mb.toFixed(1)}`);
  console.log(`values ${ours.values}`);
  console.log(`tag_hours ${ours.hours} (pandas ${pd.hours}, pandas ${pd.version})`);
  console.log(`in_process_s ${ours.seconds.toFixed(2)}`);
  console.log(`pandas_s ${pd.seconds.toFixed(2)}`);
  console.log(`ingest_values_per_s ${Math.round(ours.values / ours.seconds)}`);
  console.log(`vs_pandas ${(pd.seconds / ours.seconds).toFixed(2)}`);
  if (process.env.DATABASE_URL) {
    const e2e = await endToEnd(file);
    console.log(`end_to_end_s ${e2e.seconds.toFixed(2)}`);
    console.log(`end_to_end_vs_in_process ${(e2e.seconds / ours.seconds).toFixed(2)}`);
    console.log(`worker_peak_rss_mb ${e2e.peakMb.toFixed(0)}${e2e.readWhileUploading ? ' (the worker only idled: the file was read while uploading, in this process)' : ''}`);
    const st = await bytesPerRow('tag_hours');
    console.log(`load_average_after ${loadavg().map((x) => x.toFixed(2)).join(' ')}`);
    console.log(`tag_hour_bytes ${st.perRow.toFixed(1)}  (${st.rows} rows, ${(st.bytes / 1e6).toFixed(1)} MB with indexes; target <= 120)`);
  } else {
    console.log('end_to_end_s skipped: no DATABASE_URL (run npm run bench:ingest, which starts the services)');
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
  await stopQueue().catch(() => undefined);
  await stopReaderThreads();
  await closeDb();
}
