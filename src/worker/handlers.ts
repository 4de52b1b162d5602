import type PgBoss from 'pg-boss';
import { CheckDriftPayload, CheckUnitRulesPayload, IngestFilePayload, NoticeDigestPayload, QUEUES } from '../jobs';
import { checkUnitRules } from '../server/services/unit-rules';
import { checkDrift } from '../server/services/drift';
import { computeUnitMonth, fanOutCompute, settleCompute } from '../server/services/engine-jobs';
import { partitionUpkeep } from '../server/db/partitions';
import { sendNoticeDigests } from '../server/services/notices';
import { DIGEST_CRON } from '../lib/digest-time';
import { ingestUpload } from '../server/services/ingest';


/** E-mail addresses in a log line (a file's text quoted in a reason may hold some) become [e-mail]. */
export function redactForLog(text: string): string {
  return text.replace(/[^\s@<>()[\]"',;:]+@[^\s@<>()[\]"',;:]+\.[^\s@<>()[\]"',;:]+/g, '[e-mail]');
}

/** Job handlers beyond mail; each capability registers its queue here. */
/** Returns the id of the ingest worker (src/worker/ingest-wake.ts wakes it). */
export async function registerHandlers(boss: PgBoss): Promise<{ ingestWorker: string }> {
  const ingestWorker = await boss.work(QUEUES.ingestFile, { pollingIntervalSeconds: 0.5, batchSize: 1 }, async ([job]) => {
    const { uploadId } = IngestFilePayload.parse(job!.data);
    console.log(`[worker ${process.pid}] ingest ${uploadId}: picked up`);
    const out = await ingestUpload(uploadId);
    console.log(redactForLog(`[worker ${process.pid}] ingest ${uploadId}: ${out.kind}${'reason' in out ? ' - ' + out.reason : 'why' in out ? ' - ' + out.why : ''}`));
  });
  // --- engine ---
  await registerEngineHandlers(boss);
  // --- baselines and drift ---
  await boss.work(QUEUES.checkDrift, { pollingIntervalSeconds: 1, batchSize: 1 }, async ([job]) => {
    const out = await checkDrift(CheckDriftPayload.parse(job!.data));
    const opened = out.flatMap((u) => u.opened);
    if (opened.length) console.log(`[worker] check-drift: ${opened.length} notice(s) opened`);
    await runUnitRules(job!.data);
  });
  // --- idle and limit rules of units: after every drift check, and on their own when a rule changes ---
  await boss.work(QUEUES.checkUnitRules, { pollingIntervalSeconds: 1, batchSize: 1 }, async ([job]) => runUnitRules(job!.data));
  await boss.work(QUEUES.noticeDigest, { pollingIntervalSeconds: 5, batchSize: 1 }, async ([job]) => {
    const { day } = NoticeDigestPayload.parse(job!.data ?? {});
    // Scheduled: every hour, each person's digest at 06:00 of their first site's zone; by hand: everyone now.
    await sendNoticeDigests(day ? new Date(`${day}T12:00:00Z`) : new Date(), { anyHour: !!day });
  });
  await boss.schedule(QUEUES.noticeDigest, DIGEST_CRON, {}, { tz: 'UTC' });
  // --- storage: month partitions ahead and retention ---
  await boss.work(QUEUES.partitionUpkeep, { pollingIntervalSeconds: 30, batchSize: 1 }, async () => {
    const out = await partitionUpkeep();
    console.log(`[worker] partition-upkeep: ${out.made} partition(s) made, ${out.deletedTagHours} tag hours and ${out.deletedUnitHours} unit hours past retention removed${out.dropped.length ? `, dropped ${out.dropped.join(', ')}` : ''}`);
  });
  await boss.schedule(QUEUES.partitionUpkeep, '15 1 * * *', {}, { tz: 'UTC' });
  return { ingestWorker };
}

async function runUnitRules(data: unknown): Promise<void> {
  const out = await checkUnitRules(CheckUnitRulesPayload.parse(data));
  const opened = out.flatMap((u) => u.opened);
  if (opened.length) console.log(`[worker] unit rules: ${opened.length} notice(s) opened`);
}

/** The engine's queues: a site's request is cut into unit-month jobs that every worker process shares (engine-jobs.ts). */
export async function registerEngineHandlers(boss: PgBoss): Promise<void> {
  await boss.work(QUEUES.computeUnitHours, { pollingIntervalSeconds: 1, batchSize: 1 }, async ([job]) => {
    const out = await fanOutCompute(job!.data);
    if (out.queued) console.log(`[worker] compute-unit-hours: ${out.queued} unit-month job(s) queued (${out.alreadyQueued} already were)`);
  });
  await boss.work(QUEUES.computeUnitMonth, { pollingIntervalSeconds: 0.5, batchSize: 1 }, async ([job]) => ({ ...(await computeUnitMonth(job!.data)), pid: process.pid }));
  await boss.work(QUEUES.computeSettle, { pollingIntervalSeconds: 1, batchSize: 1 }, async ([job]) => {
    const out = await settleCompute(job!.data);
    if (out.touched) console.log(`[worker] compute settled: check-drift sent for ${out.touched.unitIds.length} unit(s)`);
  });
}
