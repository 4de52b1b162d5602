/**
 * The web process's read cache (src/server/hours-cache.ts) on a real database: a second overview
 * reads no unit hours, and a newly computed hour (written by the engine's writer, which notifies at
 * commit) gives a fresh answer: the new latest hour, the new day's sums and the unit's new span.
 */
import { afterAll, beforeAll, expect, it, vi } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '~/server/db/client';
import { driftNotices, sites, unitHours } from '~/server/db/schema';
import { siteOfParam } from '~/server/access';
import { acceptBaseline, fitDraft } from '~/server/services/baselines';
import { unitHoursOf } from '~/server/services/engine-results';
import { hoursCacheLive, hoursGeneration, startHoursCache, stopHoursCache } from '~/server/hours-cache';
import { writeUnitHours } from '~/server/services/engine';
import { dataSpan, overview, unitTrend } from '~/server/services/views';
import { describeIntegration } from '../support/integration';
import { queriesSent } from '../support/queries';
import { addHours, at, HOUR, inventedSite } from './support';

/** Counts the queries that read unit_hours for the site or unit `id` while `run` runs. */
async function unitHourQueries(id: string, run: () => Promise<unknown>): Promise<number> {
  return queriesOf(/unit_hours/, id, run);
}

/** Counts the queries whose text matches `table` and whose parameters name `id` while `run` runs. */
async function queriesOf(table: RegExp, id: string, run: () => Promise<unknown>): Promise<number> {
  return (await queriesSent((q) => table.test(q.text) && JSON.stringify(q.values).includes(id), run)).length;
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

describeIntegration('read cache of whole answers: a trend, a unit’s hours, the guard’s unit-to-site', () => {
  let siteId = '';
  let unitId = '';
  const ref = Date.parse('2024-02-05T00:00:00Z'); // a Monday
  const steady = (i: number) => {
    const load = 0.5 + 0.02 * (i % 25);
    const T0_K = 295 + 0.1 * (i % 17);
    // self-consistency: an invented unit, destruction 100 kW + 400 kW x load with a small wiggle
    return { hourStart: new Date(ref + i * HOUR), state: 'steady' as const, load, loadUnit: '-', T0_K, destruction_W: 1e5 + 4e5 * load + 1e3 * Math.sin(i * 1.7), destruction_U_W: 1e4 };
  };
  const week = { range: 'week' as const, anchor: '2024-02-07' };

  beforeAll(async () => {
    await startHoursCache();
    const made = await inventedSite({ timeZone: 'UTC', units: [{ name: 'Turbine T1', kind: 'turbine' }] });
    siteId = made.site.id;
    unitId = made.units.get('Turbine T1')!;
    await addHours(unitId, Array.from({ length: 48 }, (_, i) => steady(i)));
    await acceptBaseline((await fitDraft(unitId, { periodFrom: new Date(ref), periodTo: new Date(ref + 48 * HOUR), terms: ['load'] }, null)).id, null);
  });
  afterAll(async () => {
    await stopHoursCache();
  });

  /** Waits for the notification of a commit made by `change`. */
  async function notified(change: () => Promise<unknown>) {
    const before = hoursGeneration();
    await change();
    await vi.waitFor(() => expect(hoursGeneration()).toBeGreaterThan(before));
  }

  it('a trend asked again reads nothing; a new baseline, notice, site name or hour gives a fresh one', async () => {
    const first = await unitTrend(unitId, week);
    expect(first.baseline?.version).toBe(1);
    expect(first.stateHours.steady).toBe(48);
    expect(first.notices).toEqual([]);
    const again = await queriesOf(/unit_hours|baselines|drift_notices|plant_units/, unitId, () => unitTrend(unitId, week));
    expect(again).toBe(0);

    await notified(async () => {
      const draft = await fitDraft(unitId, { periodFrom: new Date(ref), periodTo: new Date(ref + 40 * HOUR), terms: ['load'] }, null);
      await acceptBaseline(draft.id, null);
    });
    expect((await unitTrend(unitId, week)).baseline?.version).toBe(2);

    await notified(() =>
      db().insert(driftNotices).values({ siteId, unitId, direction: 'up', onsetHour: new Date(ref + 10 * HOUR), signalHour: new Date(ref + 14 * HOUR), lastSignalHour: new Date(ref + 14 * HOUR), hours: 4, extra_W: 5e4, expected_W: 3e5, shift_sigma: 3, currency: 'EUR', k: 0.5, h: 5 }),
    );
    expect((await unitTrend(unitId, week)).notices).toHaveLength(1);
    expect((await overview()).find((s) => s.id === siteId)!.openNotices).toBe(1);

    await notified(() => db().update(sites).set({ name: `Renamed ${siteId.slice(0, 8)}` }).where(eq(sites.id, siteId)));
    expect((await unitTrend(unitId, week)).site.name).toBe(`Renamed ${siteId.slice(0, 8)}`);

    await notified(() => addHours(unitId, [steady(60)]));
    expect((await unitTrend(unitId, week)).stateHours.steady).toBe(49);
  });

  it('a unit’s hours asked again read nothing; a new hour is in the next answer', async () => {
    const from = new Date(ref);
    const to = new Date(ref + 7 * 24 * HOUR);
    const n = (await unitHoursOf(unitId, from, to)).length;
    expect(await unitHourQueries(unitId, () => unitHoursOf(unitId, from, to))).toBe(0);
    await notified(() => addHours(unitId, [steady(70)]));
    expect(await unitHoursOf(unitId, from, to)).toHaveLength(n + 1);
  });

  it('the guard finds a unit’s site once, then from memory', async () => {
    expect(await siteOfParam('unitId', unitId)).toBe(siteId);
    expect(await queriesOf(/plant_units/, unitId, () => siteOfParam('unitId', unitId))).toBe(0);
    expect(await siteOfParam('unitId', '00000000-0000-4000-8000-000000000000')).toBeNull();
  });
});
