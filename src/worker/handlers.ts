import type PgBoss from 'pg-boss';
import { CheckDriftPayload, IngestFilePayload, NoticeDigestPayload, QUEUES } from '../jobs';
import { checkDrift } from '../server/services/drift';
import { handleComputeUnitHours } from '../server/services/engine';
import { partitionUpkeep } from '../server/db/partitions';
import { sendNoticeDigests } from '../server/services/notices';
import { ingestUpload } from '../server/services/ingest';

/** Job handlers beyond mail; each capability registers its queue here. */
export async function registerHandlers(boss: PgBoss): Promise<void> {
  await boss.work(QUEUES.ingestFile, { pollingIntervalSeconds: 0.5, batchSize: 1 }, async ([job]) => {
    const { uploadId } = IngestFilePayload.parse(job!.data);
    const out = await ingestUpload(uploadId);
    console.log(`[worker] ingest ${uploadId}: ${out.kind}${'reason' in out ? ' - ' + out.reason : ''}`);
  });
  // --- engine ---
  await boss.work(QUEUES.computeUnitHours, { pollingIntervalSeconds: 1, batchSize: 1 }, async ([job]) => {
    const out = await handleComputeUnitHours(job!.data);
    if (out.computed) console.log(`[worker] compute-unit-hours ${out.siteId}: ${out.computed} unit hours, ${out.written} written, ${out.unchanged} unchanged`);
  });
  // --- baselines and drift ---
  await boss.work(QUEUES.checkDrift, { pollingIntervalSeconds: 1, batchSize: 1 }, async ([job]) => {
    const out = await checkDrift(CheckDriftPayload.parse(job!.data));
    const opened = out.flatMap((u) => u.opened);
    if (opened.length) console.log(`[worker] check-drift: ${opened.length} notice(s) opened`);
  });
  await boss.work(QUEUES.noticeDigest, { pollingIntervalSeconds: 5, batchSize: 1 }, async ([job]) => {
    const { day } = NoticeDigestPayload.parse(job!.data ?? {});
    await sendNoticeDigests(day ? new Date(`${day}T12:00:00Z`) : new Date());
  });
  await boss.schedule(QUEUES.noticeDigest, '0 6 * * *', {}, { tz: 'UTC' });
  // --- storage: month partitions ahead and retention ---
  await boss.work(QUEUES.partitionUpkeep, { pollingIntervalSeconds: 30, batchSize: 1 }, async () => {
    const out = await partitionUpkeep();
    console.log(`[worker] partition-upkeep: ${out.made} partition(s) made, ${out.deletedTagHours} tag hours and ${out.deletedUnitHours} unit hours past retention removed${out.dropped.length ? `, dropped ${out.dropped.join(', ')}` : ''}`);
  });
  await boss.schedule(QUEUES.partitionUpkeep, '15 1 * * *', {}, { tz: 'UTC' });
}
