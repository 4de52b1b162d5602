/**
 * Uploads a dead worker left half-read are taken over by a live one (see resumeInterruptedUploads).
 */
import { sql } from 'drizzle-orm';
import { db } from '../db/client';
import { QUEUES, sendJob } from '~/jobs';
import { queue } from '../queue';
import { withUploadLock } from './ingest-locks';
import { INGEST_JOB_OPTIONS } from './uploads';

/**
 * An upload left 'processing' by a worker that died is queued again, to be read from the start (its
 * transaction rolled back). The test of life is the per-upload advisory lock: the reading worker
 * holds it on its own database session for as long as it lives, and PostgreSQL releases it the
 * moment that session ends (a killed process closes its connection). Run at worker start and every
 * INGEST_SWEEP_SECONDS (default 20) by every live worker, so a live worker takes over within a
 * minute rather than after the job's two-hour expiry.
 */
export async function resumeInterruptedUploads(): Promise<number> {
  // 'processing' with the lock free: its reader is gone. 'queued' with no job waiting for it and no
  // job that began in the last 30 s: a worker took its job and died before it began reading.
  const stuck = (
    await db().execute<{ id: string }>(sql`
      select u.id from uploads u
      where u.status = 'processing'
         or (u.status = 'queued' and not exists (
               select 1 from pgboss.job j
               where j.name = ${QUEUES.ingestFile} and j.data->>'uploadId' = u.id::text
                 and (j.state in ('created', 'retry') or (j.state = 'active' and j.started_on > now() - interval '30 seconds'))))`)
  ).rows;
  let resumed = 0;
  for (const { id } of stuck) {
    // Under the lock (held by a live reader, else free), so no worker can start on it between the check and the change.
    const moved = await withUploadLock(id, async (client) => {
      const res = await client.query(`update uploads set status = 'queued' where id = $1 and status in ('processing', 'queued')`, [id]);
      if (res.rowCount !== 1) return false; // it finished in between
      const boss = await queue();
      await sendJob(boss, QUEUES.ingestFile, { uploadId: id }, { singletonKey: `${id}:resume:${Date.now()}`, ...INGEST_JOB_OPTIONS });
      return true;
    });
    if (moved) resumed++;
  }
  return resumed;
}

/** Seconds between two looks for uploads a dead worker left 'processing'. */
export function sweepSeconds(): number {
  const s = Number(process.env.INGEST_SWEEP_SECONDS ?? 20);
  return Number.isFinite(s) && s > 0 ? s : 20;
}
