import { z } from 'zod';
import type PgBoss from 'pg-boss';

/**
 * Queue names and payload schemas, shared by the web side (which sends) and the worker (which works).
 * Every payload is parsed again by the worker with the same schema.
 */
export const QUEUES = {
  ingestFile: 'ingest-file',
  computeUnitHours: 'compute-unit-hours',
  /** One unit x one month of a compute request (the worker cuts compute-unit-hours into these). */
  computeUnitMonth: 'compute-unit-month',
  /** Waits until every unit-month of a compute request is done, then sends check-drift once. */
  computeSettle: 'compute-settle',
  checkDrift: 'check-drift',
  sendMail: 'send-mail',
  /** Idle and limit rules of units over an hour range (also run by every drift check); sent when a rule changes. */
  checkUnitRules: 'check-unit-rules',
  /** Scheduled hourly: one digest a day of drift notices not yet closed to each person who opted in, at 06:00 in the zone of their first site. */
  noticeDigest: 'notice-digest',
  /** Scheduled daily: month partitions ahead, each site's retention (src/server/db/partitions.ts). */
  partitionUpkeep: 'partition-upkeep',
} as const;

export type QueueName = (typeof QUEUES)[keyof typeof QUEUES];

export const IngestFilePayload = z.object({ uploadId: z.string().uuid() });
export const ComputeUnitHoursPayload = z.object({
  siteId: z.string().uuid(),
  fromMs: z.number().int(),
  toMs: z.number().int(),
  unitIds: z.array(z.string().uuid()).optional(),
});
/** One unit over [fromMs, toMs) within one month, as part of the compute request `runId`. */
export const ComputeUnitMonthPayload = z.object({
  runId: z.string().uuid(),
  siteId: z.string().uuid(),
  unitId: z.string().uuid(),
  fromMs: z.number().int(),
  toMs: z.number().int(),
});
export const ComputeSettlePayload = z.object({ runId: z.string().uuid(), siteId: z.string().uuid() });
/** Queues that are not pg-boss's default policy: at most one job per key queued and one active. */
export const QUEUE_POLICIES: Partial<Record<QueueName, 'stately'>> = { 'compute-unit-month': 'stately', 'compute-settle': 'stately' };
/** Sent by the engine after it stored unit hours: the drift check looks at these hours. */
export const CheckDriftPayload = z.object({
  siteId: z.string().uuid(),
  fromMs: z.number().int(),
  toMs: z.number().int(),
  unitIds: z.array(z.string().uuid()).optional(),
});
/** Same shape as the drift check's: the hours [fromMs, toMs) of a site, or of the listed units. */
export const CheckUnitRulesPayload = CheckDriftPayload;
/** The scheduled digest run; `day` (yyyy-MM-dd, UTC) only when sent by hand: the run then stands at 12:00 UTC of it, mails everyone not yet mailed for their own day at that instant whatever their hour, and the mail names each site's own day. */
export const NoticeDigestPayload = z.object({ day: z.string().regex(/^\d{4}-\d{2}-\d{2}$/).optional() });
export const SendMailPayload = z.object({
  to: z.string().email(),
  subject: z.string().min(1),
  text: z.string(),
  html: z.string().optional(),
});

/** The payload schema of each queue: what a job of that queue carries. */
export const JOB_PAYLOADS = {
  [QUEUES.ingestFile]: IngestFilePayload,
  [QUEUES.computeUnitHours]: ComputeUnitHoursPayload,
  [QUEUES.computeUnitMonth]: ComputeUnitMonthPayload,
  [QUEUES.computeSettle]: ComputeSettlePayload,
  [QUEUES.checkDrift]: CheckDriftPayload,
  [QUEUES.sendMail]: SendMailPayload,
  [QUEUES.checkUnitRules]: CheckUnitRulesPayload,
  [QUEUES.noticeDigest]: NoticeDigestPayload,
  [QUEUES.partitionUpkeep]: z.object({}),
} satisfies Record<QueueName, z.ZodType>;

export type JobPayload<Q extends QueueName> = z.input<(typeof JOB_PAYLOADS)[Q]>;

/**
 * Queues one job: the payload is checked against its queue's schema first (a ZodError, and nothing
 * queued, when it does not fit). Every place that queues work sends through here.
 */
export async function sendJob<Q extends QueueName>(boss: PgBoss, name: Q, payload: JobPayload<Q>, options: PgBoss.SendOptions = {}): Promise<string | null> {
  const data = JOB_PAYLOADS[name].parse(payload) as object;
  return boss.send(name, data, options);
}
