import { desc, eq } from 'drizzle-orm';
import { z } from 'zod';
import { db } from '../db/client';
import { apiTokens } from '../db/schema';

export const NewTokenInput = z.object({
  name: z.string().trim().min(1, 'Name the token after what uses it (e.g. "nightly export").').max(120),
  role: z.enum(['operator', 'admin']).default('operator'),
});

export async function listTokens(siteId: string) {
  return db()
    .select({ id: apiTokens.id, name: apiTokens.name, prefix: apiTokens.prefix, role: apiTokens.role, createdAt: apiTokens.createdAt, lastUsedAt: apiTokens.lastUsedAt, revokedAt: apiTokens.revokedAt })
    .from(apiTokens)
    .where(eq(apiTokens.siteId, siteId))
    .orderBy(desc(apiTokens.createdAt));
}
