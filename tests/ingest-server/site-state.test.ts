import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { QUEUES } from '~/jobs';
import { db } from '~/server/db/client';
import { uploads } from '~/server/db/schema';
import { queue } from '~/server/queue';
import { siteProcessingState } from '~/server/services/site-state';
import { describeIntegration } from '../support/integration';
import { HOUR, addHours, inventedSite } from '../views/support';

/**
 * The processing state a script polls to know when the figures of what it sent are final. No worker
 * runs in these tests, so a queued job stays queued until the test takes it away.
 */
describeIntegration('site processing state', () => {
  let siteId: string;
  let unitId: string;
  const jobIds: string[] = [];

  beforeAll(async () => {
    const made = await inventedSite({ timeZone: 'Europe/London', units: [{ name: 'Let-down valve', kind: 'let-down-valve' }] });
    siteId = made.site.id;
    unitId = made.units.get('Let-down valve')!;
  });

  afterAll(async () => {
    const boss = await queue();
    for (const id of jobIds) await boss.cancel(QUEUES.computeUnitHours, id).catch(() => undefined);
  });

  it('says a new site with nothing sent is settled and has no hours', async () => {
    const s = await siteProcessingState(siteId);
    expect(s).toMatchObject({ siteId, settled: true, latestComputedHour: null, latestTagHour: null });
    expect(s.files).toEqual({ waiting: 0, reading: 0, needsReview: 0 });
  });

  it('counts a file being read and one waiting, and leaves a file that needs review out of "settled"', async () => {
    const key = () => `test/${randomUUID()}.csv`;
    const rows = await db()
      .insert(uploads)
      .values([
        { siteId, fileName: 'a.csv', objectKey: key(), source: 'api', status: 'queued' },
        { siteId, fileName: 'b.csv', objectKey: key(), source: 'api', status: 'processing' },
        { siteId, fileName: 'c.csv', objectKey: key(), source: 'api', status: 'needs-review' },
      ])
      .returning({ id: uploads.id, status: uploads.status });
    const busy = await siteProcessingState(siteId);
    expect(busy.files).toEqual({ waiting: 1, reading: 1, needsReview: 1 });
    expect(busy.settled).toBe(false);
    for (const r of rows.filter((x) => x.status !== 'needs-review')) await db().update(uploads).set({ status: 'done' }).where(eq(uploads.id, r.id));
    expect((await siteProcessingState(siteId)).settled).toBe(true);
  });

  it('counts the engine jobs queued for this site and not those of another site', async () => {
    const boss = await queue();
    const other = await inventedSite({ timeZone: 'UTC', units: [] });
    for (const s of [siteId, other.site.id]) {
      const id = await boss.send(QUEUES.computeUnitHours, { siteId: s, fromMs: 0, toMs: HOUR });
      jobIds.push(id!);
    }
    const s = await siteProcessingState(siteId);
    expect(s.compute).toEqual({ waiting: 1, active: 0 });
    expect(s.driftCheck).toEqual({ waiting: 0, active: 0 });
    expect(s.settled).toBe(false);
    await boss.cancel(QUEUES.computeUnitHours, jobIds[0]!);
    expect((await siteProcessingState(siteId)).settled).toBe(true);
  });

  it('names the newest computed hour', async () => {
    const t = Date.parse('2025-03-30T00:00:00Z');
    await addHours(unitId, [0, 1, 5].map((i) => ({ hourStart: new Date(t + i * HOUR), state: 'steady' as const })));
    expect((await siteProcessingState(siteId)).latestComputedHour).toBe(new Date(t + 5 * HOUR).toISOString());
  });
});
