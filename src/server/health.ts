import { sql } from 'drizzle-orm';
import { db } from './db/client';
import { mailReachable } from './mail';
import { queueReachable } from './queue';
import { storageReachable } from './storage';

async function timed(check: () => Promise<boolean>, timeoutMs = 3000) {
  const t0 = Date.now();
  const ok = await Promise.race([
    check().catch(() => false),
    new Promise<boolean>((r) => setTimeout(() => r(false), timeoutMs)),
  ]);
  return { ok, ms: Date.now() - t0 };
}

/** The state of every service Lossline needs; ok only when all answer. */
export async function health() {
  const [database, objectStore, mail, queue] = await Promise.all([
    timed(async () => {
      await db().execute(sql`select 1`);
      return true;
    }),
    timed(storageReachable),
    timed(mailReachable),
    timed(queueReachable),
  ]);
  const checks = { database, objectStore, mail, queue };
  return { ok: Object.values(checks).every((c) => c.ok), checks };
}
