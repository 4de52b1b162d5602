/**
 * How far the worker's heap may grow past what it holds, set before anything else loads.
 *
 * Reading a large file allocates far more than it keeps: every batch of tag hours lives until the
 * database has taken it, so it outlives the young generation and dies in the old one. V8 lets the
 * old generation grow to up to four times the live set before its next full collection when it
 * allocates fast, so a 500 MB export took the worker's resident memory to about 370 MB on a quiet
 * machine while it held about 50 MB live (README, "Ingest speed"). V8's `--heap-growing-percent`
 * fixes the factor instead: with 50 the heap is collected once it is 1.5 times its live size. It is
 * no limit (a job that really holds more still gets it) and costs a few more full collections of a
 * small live set. WORKER_HEAP_GROWING_PERCENT changes it; 0 leaves V8's own rule.
 */
import { setFlagsFromString } from 'node:v8';

const DEFAULT_PERCENT = 50;

/** The growing percent the worker runs with, from its environment. */
export function heapGrowingPercent(env: NodeJS.ProcessEnv = process.env): number {
  const raw = env.WORKER_HEAP_GROWING_PERCENT;
  if (raw === undefined || raw.trim() === '') return DEFAULT_PERCENT;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0 || n > 1000) {
    throw new Error(`WORKER_HEAP_GROWING_PERCENT must be a whole number from 0 to 1000 (0 leaves V8's own rule), got "${raw}"`);
  }
  return n;
}

const percent = heapGrowingPercent();
if (percent > 0) setFlagsFromString(`--heap-growing-percent=${percent}`);
