/**
 * An upload is picked up as soon as it is queued, not at the next poll: queueIngest
 * (src/server/services/uploads.ts) sends NOTIFY on INGEST_WAKE_CHANNEL after the job, and every worker
 * LISTENs on a connection of its own and wakes its ingest worker (pg-boss notifyWorker). Polling every
 * 0.5 s stays as the fallback (a lost connection, a notification sent while no worker listened).
 * Measured in bench:ingest (README, "Ingest speed").
 */
import pg from 'pg';
import type PgBoss from 'pg-boss';
import { INGEST_WAKE_CHANNEL } from '../server/services/uploads';
import { env } from '../server/env';

/** Listens until the process ends; returns a stop function. A failed connection is retried after 5 s. */
export function wakeOnIngestNotify(boss: PgBoss, workerId: string): () => Promise<void> {
  let client: pg.Client | null = null;
  let stopped = false;
  let retry: NodeJS.Timeout | undefined;
  const connect = async () => {
    const c = new pg.Client({ connectionString: env().DATABASE_URL });
    c.on('notification', () => boss.notifyWorker(workerId));
    c.on('error', (err) => {
      console.error(`[worker] ingest wake-up connection lost (polling goes on): ${err.message}`);
      void c.end().catch(() => undefined);
      if (!stopped) retry = setTimeout(() => void connect().catch(() => undefined), 5000);
    });
    try {
      await c.connect();
      await c.query(`listen ${INGEST_WAKE_CHANNEL}`);
      client = c;
    } catch (err) {
      c.emit('error', err);
    }
  };
  void connect();
  return async () => {
    stopped = true;
    clearTimeout(retry);
    await client?.end().catch(() => undefined);
  };
}
