/** Applies the committed Drizzle migrations in drizzle/ to DATABASE_URL. */
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { closeDb, db } from '../src/server/db/client';

await migrate(db(), { migrationsFolder: 'drizzle' });
await closeDb();
console.log('[db] migrations applied');
