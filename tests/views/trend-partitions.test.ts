/**
 * A trend week reads only its month's partition of unit hours: every query unitTrend sends with the
 * week's bounds is run again under EXPLAIN ANALYZE, and the partitions its plan actually read (nodes
 * executed at least once) are listed. The unit has hours in other months too, so a query of the whole
 * unit would read them and the test would fail.
 */
import { sql } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { db, pgPool } from '~/server/db/client';
import { ensureMonthPartitions } from '~/server/db/partitions';
import { unitTrend } from '~/server/services/views';
import { describeIntegration } from '../support/integration';
import { queriesSent, type SentQuery } from '../support/queries';
import { addHours, at, inventedSite } from './support';

type Sent = SentQuery;

/** The queries that name unit_hours, with their parameters, sent while `run` runs. */
async function queriesOf(run: () => Promise<unknown>): Promise<Sent[]> {
  return queriesSent((q) => q.text.includes('unit_hours'), run);
}

/** Partitions of unit_hours a query's plan read when run (EXPLAIN ANALYZE, nodes with loops > 0). */
async function partitionsRead(q: Sent): Promise<string[]> {
  const res = await pgPool().query(`explain (analyze, format json) ${q.text}`, q.values);
  const out = new Set<string>();
  const walk = (n: Record<string, unknown>) => {
    const name = n['Relation Name'];
    if (typeof name === 'string' && name.startsWith('unit_hours_') && Number(n['Actual Loops']) > 0) out.add(name);
    for (const c of (n.Plans as Record<string, unknown>[] | undefined) ?? []) walk(c);
  };
  walk((res.rows[0]['QUERY PLAN'] as { Plan: Record<string, unknown> }[])[0]!.Plan);
  return [...out].sort();
}

describeIntegration('a trend week and the month partitions', () => {
  let unitId = '';
  beforeAll(async () => {
    await ensureMonthPartitions(null, 'unit_hours', Date.UTC(2023, 2, 1), Date.UTC(2023, 9, 1));
    const made = await inventedSite({ timeZone: 'UTC', units: [{ name: 'Turbine T9', kind: 'turbine' }] });
    unitId = made.units.get('Turbine T9')!;
    const steady = (iso: string) => ({ hourStart: at(iso), state: 'steady' as const, load: 1e6, T0_K: 290, efficiency: 0.8, destruction_W: 1e5 });
    await addHours(unitId, ['2023-03-15T10:00:00Z', '2023-06-13T10:00:00Z', '2023-06-14T10:00:00Z', '2023-09-20T10:00:00Z'].map(steady));
    await db().execute(sql`analyze unit_hours`);
  });

  it("reads the week's hours from June's partition only", async () => {
    const sent = await queriesOf(() => unitTrend(unitId, { range: 'week', anchor: '2023-06-14' }));
    const weekFrom = Date.parse('2023-06-12T00:00:00Z');
    const ofWeek = sent.filter((q) => q.values.some((v) => (v instanceof Date ? v.getTime() : Date.parse(String(v))) === weekFrom));
    expect(ofWeek.length).toBeGreaterThan(0);
    for (const q of ofWeek) expect(await partitionsRead(q)).toEqual(['unit_hours_y2023m06']);
    // The unit's hours without a period are read from every month, March and September too: the check can fail.
    expect(await partitionsRead({ text: 'select * from unit_hours where unit_id = $1', values: [unitId] })).toEqual(expect.arrayContaining(['unit_hours_y2023m03', 'unit_hours_y2023m06', 'unit_hours_y2023m09']));
  });
});
