/**
 * Seeds demo accounts (one per role) and the invented demo site, and makes sure the raw-file bucket
 * exists. Idempotent: running it again changes nothing that is already there.
 */
import { randomUUID } from 'node:crypto';
import { hashPassword } from 'better-auth/crypto';
import { eq } from 'drizzle-orm';
import { closeDb, db } from '~/server/db/client';
import { account, sites, user } from '~/server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '~/server/demo-accounts';
import { ensureBucket } from '~/server/storage';

export async function seedAccounts(): Promise<void> {
  for (const a of DEMO_ACCOUNTS) {
    const [found] = await db().select({ id: user.id }).from(user).where(eq(user.email, a.email)).limit(1);
    if (found) continue;
    const id = randomUUID();
    await db().transaction(async (tx) => {
      await tx.insert(user).values({ id, email: a.email, name: a.name, role: a.role, emailVerified: true });
      await tx.insert(account).values({ id: randomUUID(), accountId: id, providerId: 'credential', userId: id, password: await hashPassword(DEMO_PASSWORD) });
    });
  }
}

export async function seedDemoSite(): Promise<void> {
  await db().insert(sites).values({ name: 'Harrowgate Mills Energy Centre', timeZone: 'Europe/London' }).onConflictDoNothing();
}

if (import.meta.url === `file://${process.argv[1]}`) {
  await seedAccounts();
  await seedDemoSite();
  await ensureBucket().catch((err) => console.warn('[seed] bucket not checked:', (err as Error).message));
  await closeDb();
  console.log('[seed] demo accounts and site ready');
}
