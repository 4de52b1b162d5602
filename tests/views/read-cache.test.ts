/**
 * The web process's read cache (src/server/hours-cache.ts) on a real database: a second overview
 * reads no unit hours, and a newly computed hour (written by the engine's writer, which notifies at
 * commit) gives a fresh answer: the new latest hour, the new day's sums and the unit's new span.
 */
import { afterAll, beforeAll, expect, it, vi } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db, pgPool } from '~/server/db/client';
import { unitHours } from '~/server/db/schema';
import { hoursCacheLive, hoursGeneration, startHoursCache, stopHoursCache } from '~/server/hours-cache';
import { writeUnitHours } from '~/server/services/engine';
import { dataSpan, overview } from '~/server/services/views';
import { describeIntegration } from '../support/integration';
import { addHours, at, HOUR, inventedSite } from './support';

/** Counts the queries that read unit_hours for the site or unit `id` while `run` runs. */
async function unitHourQueries(id: string, run: () => Promise<unknown>): Promise<number> {
  const pool = pgPool() as unknown as { query: (...a: unknown[]) => Promise<unknown> };
  const query = pool.query;
  let n = 0;
  pool.query = (...a: unknown[]) => {
    const text = typeof a[0] === 'string' ? a[0] : (a[0] as { text?: string }).text;
    if (text?.includes('unit_hours') && JSON.stringify(a[1] ?? []).includes(id)) n++;
    return query.apply(pool, a);
  };
  try {
    await run();
  } finally {
    pool.query = query;
  }
  return n;
}

describeIntegration('read cache of unit-hour figures', () => {
  let siteId = '';
  let unitId = '';
  beforeAll(async () => {
    await startHoursCache();
    const made = await inventedSite({ timeZone: 'UTC', units: [{ name: 'Boiler B1', kind: 'boiler' }] });
    siteId = made.site.id;
    unitId = made.units.get('Boiler B1')!;
    await addHours(unitId, [
      { hourStart: at('2024-05-10T10:00:00Z'), state: 'steady', destruction_W: 1000, destructionCost_per_h: 2 },
      { hourStart: at('2024-05-10T11:00:00Z'), state: 'steady', destruction_W: 3000, destructionCost_per_h: 4 },
    ]);
  });
  afterAll(async () => {
    await stopHoursCache();
  });

  const ours = async () => (await overview()).find((s) => s.id === siteId)!;

  it('answers a second overview from memory and a new computed hour at once afresh', async () => {
    expect(hoursCacheLive()).toBe(true);
    const first = await ours();
    expect(first.lastHour).toBe('2024-05-10 11:00');
    expect(first.units[0]!.hours.steady).toBe(2);
    // Asked again with nothing changed: no query of this site's unit hours at all.
    expect(await unitHourQueries(siteId, ours)).toBe(0);
    expect(await ours()).toEqual(first);

    const before = hoursGeneration();
    await writeUnitHours(db(), [{ unitId, hourStart: new Date(Date.parse('2024-05-10T12:00:00Z')), state: 'steady', modelVersion: 'cache-test', inputsHash: 'h', destruction_W: 5000, destructionCost_per_h: 6 }]);
    // The commit's notification reaches the listening connection a moment later.
    await vi.waitFor(() => expect(hoursGeneration()).toBeGreaterThan(before));
    const after = await ours();
    expect(after.lastHour).toBe('2024-05-10 12:00');
    expect(after.units[0]!.hours.steady).toBe(3);
    expect(after.units[0]!.cost).toBe(12);
    expect(await dataSpan(siteId, unitId)).toEqual({ firstMs: Date.parse('2024-05-10T10:00:00Z'), lastMs: Date.parse('2024-05-10T12:00:00Z') });
  });

  it('a unit hour removed is gone from the next answer too', async () => {
    expect((await dataSpan(siteId, unitId))!.lastMs).toBe(Date.parse('2024-05-10T12:00:00Z'));
    const before = hoursGeneration();
    await db().delete(unitHours).where(and(eq(unitHours.unitId, unitId), eq(unitHours.hourStart, new Date(Date.parse('2024-05-10T10:00:00Z') + 2 * HOUR))));
    await vi.waitFor(() => expect(hoursGeneration()).toBeGreaterThan(before));
    expect((await dataSpan(siteId, unitId))!.lastMs).toBe(Date.parse('2024-05-10T11:00:00Z'));
    expect((await ours()).lastHour).toBe('2024-05-10 11:00');
  });
});
