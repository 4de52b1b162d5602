/**
 * npm run fuzz:ingest [-- --runs=10000 --seed=N --timeout-ms=20000]
 * Hostile exports into the ingest core; prints what happened to them and exits non-zero on a
 * finding (an escaped error, a broken invariant, a hang). Failing files go to fuzz/failures/.
 */
import { parseArgs } from 'node:util';
import { runIngestFuzz } from './runner';

const { values } = parseArgs({ options: { runs: { type: 'string' }, seed: { type: 'string' }, 'timeout-ms': { type: 'string' } } });
const report = await runIngestFuzz({
  numRuns: Number(values.runs ?? 10_000),
  seed: values.seed ? Number(values.seed) : undefined,
  caseTimeoutMs: values['timeout-ms'] ? Number(values['timeout-ms']) : 20_000,
  failuresDir: 'fuzz/failures',
  onProgress: (r) => console.log(`[fuzz:ingest] ${r.cases} files ...`),
});
console.log(`[fuzz:ingest] seed ${report.seed}: ${report.cases} files in ${(report.totalMs / 1000).toFixed(1)} s (slowest ${report.slowestMs.toFixed(0)} ms)`);
console.log(`[fuzz:ingest] read ${report.read}, read after a layout question ${report.asked}, stopped with a catalogued reason ${Object.values(report.stopped).reduce((a, b) => a + b, 0)}`);
for (const [code, n] of Object.entries(report.stopped).sort((a, b) => b[1] - a[1])) console.log(`  ${code}: ${n}`);
if (report.failure) {
  console.error(`[fuzz:ingest] FINDING (rerun with --seed=${report.seed}):\n${report.failure}`);
  process.exit(1);
}
