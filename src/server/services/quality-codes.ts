import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { DEFAULT_GOOD_QUALITY_CODES, qualityCodesOf } from '~/lib/ingest/quality-codes';
import { db } from '../db/client';
import { siteQualityCodes } from '../db/schema';

/** A site's good quality codes: what the API takes. An empty list goes back to the defaults. */
export const QualityCodesInput = z.object({
  goodCodes: z.array(z.string().trim().min(1).max(64)).max(100),
});

/** The good quality codes of a site's wide files, and whether they are the defaults. */
export async function getQualityCodes(siteId: string) {
  const [row] = await db().select().from(siteQualityCodes).where(eq(siteQualityCodes.siteId, siteId));
  return { goodCodes: qualityCodesOf(row?.goodCodes), defaults: !row, defaultCodes: [...DEFAULT_GOOD_QUALITY_CODES] };
}

/** Sets a site's good quality codes (files read from now on use them); [] restores the defaults. */
export async function setQualityCodes(siteId: string, input: z.infer<typeof QualityCodesInput>, userId: string) {
  const codes = [...new Set(input.goodCodes)];
  if (codes.length === 0) await db().delete(siteQualityCodes).where(eq(siteQualityCodes.siteId, siteId));
  else {
    await db()
      .insert(siteQualityCodes)
      .values({ siteId, goodCodes: codes, updatedBy: userId })
      .onConflictDoUpdate({ target: siteQualityCodes.siteId, set: { goodCodes: codes, updatedBy: userId, updatedAt: new Date() } });
  }
  return getQualityCodes(siteId);
}
