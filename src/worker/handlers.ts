import type PgBoss from 'pg-boss';
import { IngestFilePayload, QUEUES } from '../jobs';
import { ingestUpload } from '../server/services/ingest';

/** Job handlers beyond mail; each capability registers its queue here. */
export async function registerHandlers(boss: PgBoss): Promise<void> {
  await boss.work(QUEUES.ingestFile, { pollingIntervalSeconds: 0.5, batchSize: 1 }, async ([job]) => {
    const { uploadId } = IngestFilePayload.parse(job!.data);
    const out = await ingestUpload(uploadId);
    console.log(`[worker] ingest ${uploadId}: ${out.kind}${'reason' in out ? ' - ' + out.reason : ''}`);
  });
}
