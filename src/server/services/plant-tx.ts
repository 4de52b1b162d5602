import type { z } from 'zod';
import { ComputeUnitHoursPayload, QUEUES, sendJob } from '~/jobs';
import { hourCeil } from '~/lib/time';
import { withTransaction, type Tx } from '../db/tx';
import { queue } from '../queue';

export type { Tx };
export type RecomputeRequest = z.infer<typeof ComputeUnitHoursPayload>;


/** The end of the current hour [ms]: where an open-ended recompute stops (no later hour has data). */
export function openEndMs(now = Date.now()): number {
  return hourCeil(now);
}

/**
 * Runs `fn` in one database transaction whose recompute jobs are enqueued in the same transaction
 * (pg-boss with the transaction's connection): a model change and its recompute commit together or
 * not at all.
 */
export async function inTransaction<T>(fn: (tx: Tx, recompute: (req: RecomputeRequest) => Promise<void>) => Promise<T>): Promise<T> {
  const boss = await queue();
  return withTransaction((tx, exec) =>
    fn(tx, async (req: RecomputeRequest) => {
      const payload = ComputeUnitHoursPayload.parse(req);
      if (payload.toMs <= payload.fromMs) return;
      await sendJob(boss, QUEUES.computeUnitHours, payload, { db: { executeSql: (text, values) => exec(text, values) } });
    }),
  );
}
