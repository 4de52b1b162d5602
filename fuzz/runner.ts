/**
 * Runs hostile exports through the ingest core in a worker thread, each case time-boxed: a case that
 * does not finish in time is a hang (the thread is cut off and replaced), an escaped error or a
 * broken invariant is a finding. fast-check makes the cases (reproducible by seed).
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { Worker } from 'node:worker_threads';
import fc from 'fast-check';
import { hostileExport } from './ingest-cases';
import type { CaseOutcome } from './check-file';

export interface FuzzOptions {
  numRuns: number;
  seed?: number;
  /** Longest a case may take before it counts as a hang [ms]. */
  caseTimeoutMs?: number;
  /** Folder for the bytes of a failing case; none when absent. */
  failuresDir?: string;
  /** Called every 1,000 cases with the report so far. */
  onProgress?: (report: FuzzReport) => void;
}

export interface FuzzReport {
  seed: number;
  cases: number;
  read: number;
  asked: number;
  stopped: Record<string, number>;
  slowestMs: number;
  totalMs: number;
  failure: string | null;
}

export async function runIngestFuzz(options: FuzzOptions): Promise<FuzzReport> {
  const seed = options.seed ?? Date.now() % 2 ** 31;
  const timeoutMs = options.caseTimeoutMs ?? 20_000;
  const report: FuzzReport = { seed, cases: 0, read: 0, asked: 0, stopped: {}, slowestMs: 0, totalMs: 0, failure: null };
  // The thread's start-up (loading TypeScript) is not part of any case's time.
  let ready: Promise<void> = Promise.resolve();
  const start = () => {
    const w = new Worker(new URL('./worker-boot.mjs', import.meta.url));
    ready = new Promise((resolve, reject) => {
      w.once('message', () => resolve());
      w.once('error', reject);
    });
    return w;
  };
  let worker = start();
  let nextId = 0;
  const check = async (bytes: Uint8Array) => {
    await ready;
    return new Promise<CaseOutcome & { ms: number }>((resolve, reject) => {
      const id = nextId++;
      const timer = setTimeout(() => {
        worker.removeAllListeners('message');
        void worker.terminate();
        worker = start();
        reject(new Error(`hang: the case did not finish within ${timeoutMs} ms`));
      }, timeoutMs);
      worker.removeAllListeners('message');
      worker.removeAllListeners('error');
      worker.on('message', (m: CaseOutcome & { id: number; ms: number }) => {
        if (m.id !== id) return;
        clearTimeout(timer);
        resolve(m);
      });
      worker.on('error', (err) => {
        clearTimeout(timer);
        worker = start();
        reject(err);
      });
      worker.postMessage({ id, bytes });
    });
  };
  const t0 = performance.now();
  try {
    await fc.assert(
      fc.asyncProperty(hostileExport, async (bytes) => {
        report.cases++;
        if (report.cases % 1000 === 0) options.onProgress?.(report);
        let out: CaseOutcome & { ms: number };
        try {
          out = await check(bytes);
        } catch (err) {
          save(options.failuresDir, seed, report.cases, bytes);
          throw err;
        }
        report.slowestMs = Math.max(report.slowestMs, out.ms);
        if (out.problem) {
          save(options.failuresDir, seed, report.cases, bytes);
          throw new Error(out.problem);
        }
        if (out.outcome === 'read') report.read++;
        else if (out.outcome === 'asked') report.asked++;
        else report.stopped[out.code!] = (report.stopped[out.code!] ?? 0) + 1;
      }),
      { numRuns: options.numRuns, seed, endOnFailure: true },
    );
  } catch (err) {
    const cause = (err as Error).cause as Error | undefined;
    report.failure = `${(err as Error).message}${cause ? `\n${cause.stack ?? cause.message ?? String(cause)}` : ''}`;
  } finally {
    report.totalMs = performance.now() - t0;
    await worker.terminate();
  }
  return report;
}

function save(dir: string | undefined, seed: number, n: number, bytes: Uint8Array) {
  if (!dir) return;
  mkdirSync(dir, { recursive: true });
  writeFileSync(`${dir}/seed-${seed}-case-${n}.bin`, bytes);
}
