/**
 * A short run of the ingest fuzz harness (npm run fuzz:ingest runs 10,000 cases): hostile exports
 * into the reader, each case time-boxed in a worker thread. Every file is read or stops with a
 * catalogued reason; nothing escapes, nothing hangs. FUZZ_SEED=<n> repeats a run.
 */
import { expect, it } from 'vitest';
import { runIngestFuzz } from '../../fuzz/runner';

it('300 hostile exports: each read or stopped with a catalogued reason, none hangs', async () => {
  const seed = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : Date.now() % 2 ** 31;
  const report = await runIngestFuzz({ numRuns: 300, seed, caseTimeoutMs: 20_000 });
  expect(report.failure, `fuzz seed ${seed}`).toBeNull();
  expect(report.cases).toBe(300);
  // The generator reaches both ends: files read and files stopped.
  expect(report.read + report.asked).toBeGreaterThan(0);
  expect(Object.keys(report.stopped).length).toBeGreaterThan(3);
}, 300_000);
