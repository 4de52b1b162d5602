/**
 * Runs once before the vitest suite. When a database is configured (docker-free-start.sh test starts
 * a throwaway cluster and the fakes and exports their URLs), apply the migrations and seed the demo
 * accounts, so integration tests run against a real PostgreSQL, S3 fake and SMTP catcher.
 */
export default async function setup(): Promise<void> {
  if (!process.env.DATABASE_URL || !process.env.BETTER_AUTH_SECRET) return;
  const { migrate } = await import('drizzle-orm/node-postgres/migrator');
  const { db, closeDb } = await import('~/server/db/client');
  await migrate(db(), { migrationsFolder: 'drizzle' });
  const { seedAccounts } = await import('../../scripts/seed');
  await seedAccounts();
  // Tests write tag hours and unit hours of 2020-2027 directly (the workers make their months on demand).
  const { ensureMonthPartitions, PARTITIONED_TABLES } = await import('~/server/db/partitions');
  for (const t of PARTITIONED_TABLES) await ensureMonthPartitions(null, t, Date.UTC(2020, 0, 1), Date.UTC(2027, 11, 1));
  const { ensureBucket } = await import('~/server/storage');
  await ensureBucket();
  await closeDb();
}
