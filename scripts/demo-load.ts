/**
 * Loads the demo plant on first start (docker-free-start.sh runs it after the web server is up; see
 * docs/demo.md). Idempotent: on later starts it finds everything in place and ends in seconds. The
 * app runs whether or not this succeeds: on a problem it prints the reason and exits non-zero.
 *
 *   DEMO_DAYS   days of exports (default 365; 0 skips the demo)
 *   DEMO_START  first day, YYYY-MM-DD in the site's time zone (default 2025-01-06)
 *   DEMO_SEED   seed of the generator (default 7)
 *   DEMO_WAIT_MINUTES  how long to wait for the worker at most (default 45)
 */
import { closeDb } from '~/server/db/client';
import { stopQueue } from '~/server/queue';
import { loadDemo } from './demo/load';

function intEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw.trim() === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0) throw new Error(`${name} must be a whole number >= 0, got '${raw}'.`);
  return n;
}

let code = 0;
const t0 = Date.now();
try {
  const days = intEnv('DEMO_DAYS', 365);
  if (days === 0) {
    console.log('[demo] DEMO_DAYS=0: the demo plant is not loaded');
  } else {
    const report = await loadDemo({
      days,
      start: process.env.DEMO_START || undefined,
      seed: intEnv('DEMO_SEED', 7),
      waitTimeoutMs: intEnv('DEMO_WAIT_MINUTES', 45) * 60_000,
    });
    console.log(
      `[demo] ready in ${((Date.now() - t0) / 1000).toFixed(0)} s: ${report.planned} weekly files (${report.uploaded.length} uploaded now), ` +
        `${report.unitHours} unit hours, ${report.notices} drift notice(s)`,
    );
  }
} catch (err) {
  code = 1;
  console.error(`[demo] the demo plant was not loaded: ${(err as Error).message}`);
} finally {
  await stopQueue().catch(() => undefined);
  await closeDb().catch(() => undefined);
}
process.exit(code);
