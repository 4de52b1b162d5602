import PgBoss from 'pg-boss';
import { QUEUE_POLICIES, QUEUES } from '../jobs';
import { env } from './env';
import { redact } from './log';

let boss: PgBoss | undefined;
let starting: Promise<PgBoss> | undefined;

/**
 * A started pg-boss instance for this process. The web side only sends; the worker (src/worker)
 * also works. The 'error' listener is attached before start(), as pg-boss requires.
 */
export function queue(): Promise<PgBoss> {
  if (boss) return Promise.resolve(boss);
  starting ??= (async () => {
    const b = new PgBoss({ connectionString: env().DATABASE_URL, schema: 'pgboss', max: 4 });
    b.on('error', (err) => console.error('[queue]', redact(err.message)));
    await b.start();
    for (const name of Object.values(QUEUES)) await b.createQueue(name, { name, policy: QUEUE_POLICIES[name] ?? 'standard' });
    boss = b;
    return b;
  })();
  return starting;
}

export async function stopQueue(): Promise<void> {
  const b = boss;
  boss = undefined;
  starting = undefined;
  await b?.stop({ graceful: true, wait: true });
}

/** True when the queue's schema answers. */
export async function queueReachable(): Promise<boolean> {
  try {
    const b = await queue();
    await b.getQueues();
    return true;
  } catch {
    return false;
  }
}
