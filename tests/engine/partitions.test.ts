/**
 * Month partitions of tag hours and unit hours on a real database: a query of a period reads only the
 * partitions of that period (the plan says so), a month is made on demand before a write, and a site's
 * retention removes its older hours and nobody else's.
 */
import { eq, sql } from 'drizzle-orm';
import { expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { ensureMonthPartitions, monthPartitions, partitionName, partitionUpkeep } from '~/server/db/partitions';
import { plantUnits, sites, tagHours, tags, unitHours } from '~/server/db/schema';
import { writeTagHours } from '~/server/services/tag-hours';
import { describeIntegration } from '../support/integration';
import { uniqueName } from '../plant/support';

/** Every relation a plan reads (EXPLAIN FORMAT JSON). */
async function relationsRead(query: string): Promise<string[]> {
  const res = await db().execute<{ 'QUERY PLAN': unknown }>(sql.raw(`explain (format json) ${query}`));
  const out = new Set<string>();
  const walk = (n: Record<string, unknown>) => {
    if (typeof n['Relation Name'] === 'string') out.add(n['Relation Name']);
    for (const c of (n.Plans as Record<string, unknown>[] | undefined) ?? []) walk(c);
  };
  const plan = res.rows[0]!['QUERY PLAN'] as { Plan: Record<string, unknown> }[];
  walk(plan[0]!.Plan);
  return [...out].sort();
}

const hour = { mean: 1, min: 1, max: 1, std: 0, samples: 60, coveredFraction: 1 };

describeIntegration('month partitions', () => {
  it('a period of tag hours or unit hours reads only the partitions of its months', async () => {
    await ensureMonthPartitions(null, 'tag_hours', Date.UTC(2024, 1, 1), Date.UTC(2024, 4, 1));
    await ensureMonthPartitions(null, 'unit_hours', Date.UTC(2024, 1, 1), Date.UTC(2024, 4, 1));
    expect(await relationsRead(`select * from tag_hours where tag_id = any('{1,2,3}'::int[]) and hour_start >= '2024-03-01T00:00:00Z' and hour_start < '2024-04-01T00:00:00Z'`)).toEqual([
      'tag_hours_y2024m03',
    ]);
    expect(
      await relationsRead(
        `select * from unit_hours where unit_id = '00000000-0000-0000-0000-000000000000' and hour_start >= '2024-03-20T00:00:00Z' and hour_start < '2024-04-10T00:00:00Z'`,
      ),
    ).toEqual(['unit_hours_y2024m03', 'unit_hours_y2024m04']);
    // Without a period every month is read: the test above can fail.
    expect((await relationsRead(`select * from tag_hours where tag_id = 1`)).length).toBeGreaterThan(3);
  });

  it('a month nobody wrote yet is made before the first write into it', async () => {
    const month = Date.UTC(2031, 4, 1);
    expect((await monthPartitions('tag_hours')).map((p) => p.name)).not.toContain(partitionName('tag_hours', month));
    const [site] = await db().insert(sites).values({ name: uniqueName('Partition plant') }).returning();
    const [t] = await db().insert(tags).values({ siteId: site!.id, name: 'P1' }).returning();
    await writeTagHours([{ tagId: t!.seq, hourStart: new Date(month + 5 * 3_600_000), ...hour }]);
    const parts = await monthPartitions('tag_hours');
    const made = parts.find((p) => p.name === 'tag_hours_y2031m05')!;
    expect([made.fromMs, made.toMs]).toEqual([month, Date.UTC(2031, 5, 1)]);
    expect((await db().select().from(tagHours).where(eq(tagHours.tagId, t!.seq))).length).toBe(1);
  });

  it("a site's retention removes its hours older than the kept months, not another site's", async () => {
    const now = Date.UTC(2025, 6, 15);
    const mk = async (name: string, retentionMonths: number | null) => {
      const [site] = await db().insert(sites).values({ name: uniqueName(name), retentionMonths }).returning();
      const [t] = await db().insert(tags).values({ siteId: site!.id, name: 'R1' }).returning();
      const [u] = await db().insert(plantUnits).values({ siteId: site!.id, name: 'V1', kind: 'let-down-valve' }).returning();
      const old = new Date(Date.UTC(2024, 5, 10));
      const recent = new Date(Date.UTC(2025, 3, 10));
      await writeTagHours([old, recent].map((h) => ({ tagId: t!.seq, hourStart: h, ...hour })));
      for (const h of [old, recent]) await db().insert(unitHours).values({ unitId: u!.id, hourStart: h, state: 'steady', modelVersion: 'm', inputsHash: 'i' });
      return { tag: t!.seq, unit: u!.id };
    };
    const keeps12 = await mk('Retention plant', 12);
    const keepsAll = await mk('Keep-all plant', null);
    const out = await partitionUpkeep(now);
    expect(out.deletedTagHours).toBeGreaterThanOrEqual(1);
    const th = async (tag: number) => (await db().select().from(tagHours).where(eq(tagHours.tagId, tag))).map((r) => r.hourStart.toISOString());
    const uh = async (unit: string) => (await db().select().from(unitHours).where(eq(unitHours.unitId, unit))).map((r) => r.hourStart.toISOString());
    // Kept: July 2024 on (twelve months before July 2025); June 2024 goes.
    expect(await th(keeps12.tag)).toEqual(['2025-04-10T00:00:00.000Z']);
    expect(await uh(keeps12.unit)).toEqual(['2025-04-10T00:00:00.000Z']);
    expect((await th(keepsAll.tag)).length).toBe(2);
    expect((await uh(keepsAll.unit)).length).toBe(2);
    // Other sites keep everything, so no month is dropped whole; the months ahead exist.
    expect(out.dropped).toEqual([]);
    const names = (await monthPartitions('unit_hours')).map((p) => p.name);
    expect(names).toContain('unit_hours_y2025m09');
  });
});
