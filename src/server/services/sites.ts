import { asc } from 'drizzle-orm';
import { db } from '../db/client';
import { sites } from '../db/schema';

export async function listSites() {
  return db().select().from(sites).orderBy(asc(sites.name));
}
