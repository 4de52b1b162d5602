import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { sites, tagHourUploads, tags, uploads, user } from '~/server/db/schema';
import { DEMO_ACCOUNTS } from '~/server/demo-accounts';
import { UploadListQuery, listUploadPage } from '~/server/services/upload-list';
import { describeIntegration } from '../support/integration';

const operator = DEMO_ACCOUNTS.find((a) => a.role === 'operator')!;

describeIntegration('the upload list of a site', () => {
  it('pages newest first by cursor, says who uploaded, the span of hours a file produced and which file a repeat repeats', async () => {
    const [site] = await db().insert(sites).values({ name: `Upload list site ${Date.now()}`, timeZone: 'Europe/London' }).returning();
    const [op] = await db().select().from(user).where(eq(user.email, operator.email));
    const t0 = Date.UTC(2025, 4, 12, 8);
    const made = [];
    for (let i = 0; i < 5; i++) {
      const [u] = await db()
        .insert(uploads)
        .values({ siteId: site!.id, fileName: `HM_weekly_${i}.csv`, objectKey: `test/${randomUUID()}`, source: 'browser', uploadedBy: op!.id, status: 'done', createdAt: new Date(t0 + i * 60_000) })
        .returning();
      made.push(u!);
    }
    const [repeat] = await db()
      .insert(uploads)
      .values({ siteId: site!.id, fileName: 'HM_weekly_0 (copy).csv', objectKey: `test/${randomUUID()}`, source: 'browser', uploadedBy: op!.id, status: 'done', duplicateOf: made[0]!.id, createdAt: new Date(t0 + 10 * 60_000) })
      .returning();
    const [tag] = await db().insert(tags).values({ siteId: site!.id, name: 'FT-101' }).returning();
    const [tag2] = await db().insert(tags).values({ siteId: site!.id, name: 'PT-101' }).returning();
    await db().insert(tagHourUploads).values([
      { uploadId: made[4]!.id, tagId: tag!.seq, firstHour: new Date('2025-05-05T00:00:00Z'), lastHour: new Date('2025-05-11T22:00:00Z') },
      { uploadId: made[4]!.id, tagId: tag2!.seq, firstHour: new Date('2025-05-04T23:00:00Z'), lastHour: new Date('2025-05-11T23:00:00Z') },
    ]);

    const first = await listUploadPage(site!.id, UploadListQuery.parse({ limit: '4' }));
    expect(first.total).toBe(6);
    expect(first.uploads.map((u) => u.fileName)).toEqual(['HM_weekly_0 (copy).csv', 'HM_weekly_4.csv', 'HM_weekly_3.csv', 'HM_weekly_2.csv']);
    expect(first.uploads[0]!.duplicateOfFile?.fileName).toBe('HM_weekly_0.csv');
    expect(first.uploads[1]!.uploadedBy).toBe(op!.name);
    expect([first.uploads[1]!.hoursFrom, first.uploads[1]!.hoursTo]).toEqual(['2025-05-04T23:00:00.000Z', '2025-05-11T23:00:00.000Z']);
    expect(first.uploads[2]!.hoursFrom).toBeNull();
    expect(first.next).not.toBeNull();

    const second = await listUploadPage(site!.id, UploadListQuery.parse({ limit: '4', before: first.next! }));
    expect(second.uploads.map((u) => u.fileName)).toEqual(['HM_weekly_1.csv', 'HM_weekly_0.csv']);
    expect(second.next).toBeNull();
    expect(UploadListQuery.safeParse({ before: "2025'; drop table uploads" }).success).toBe(false);
    expect(repeat!.duplicateOf).toBe(made[0]!.id);
    await db().delete(sites).where(eq(sites.id, site!.id));
  });
});
