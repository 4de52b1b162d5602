/** Applies the committed Drizzle migrations in drizzle/ to DATABASE_URL. */
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { closeDb, db } from '~/server/db/client';

import { PARTITIONED_TABLES, ensureMonthPartitions } from '~/server/db/partitions';

await migrate(db(), { migrationsFolder: 'drizzle' });
// Month partitions of tag hours and unit hours: the last year and the next two months (older months
// are made when a file brings them; LOSSLINE_PARTITIONS_FROM=2020-01 makes them from then on).
const now = Date.now();
const from = process.env.LOSSLINE_PARTITIONS_FROM ? Date.parse(`${process.env.LOSSLINE_PARTITIONS_FROM}-01T00:00:00Z`) : now - 366 * 86_400_000;
for (const t of PARTITIONED_TABLES) await ensureMonthPartitions(null, t, from, now + 62 * 86_400_000);
await closeDb();
console.log('[db] migrations applied');
