import { beforeAll, expect, it } from 'vitest';
import { GET as getTrend } from '~/pages/api/units/[unitId]/trend';
import { db } from '~/server/db/client';
import { driftNotices } from '~/server/db/schema';
import { acceptBaseline, fitDraft } from '~/server/services/baselines';
import type { TrendAnswer } from '~/server/services/views';
import { describeIntegration } from '../support/integration';
import { expectClose } from '../support/expect-close';
import { HOUR, addHours, ctx, inventedSite, type HourRow } from './support';

/**
 * An invented turbine at a site in Asia/Kolkata (UTC+05:30 all year, tzdata), whose efficiency
 * follows 0.60 + 0.20 load - 0.001 (T0 - 290 K) and destruction 100 kW + 400 kW x load, with a
 * small deterministic wiggle (at most 0.001 and 1 kW) so the fit has a residual spread.
 */
const trueEff = (load: number, T0: number) => 0.6 + 0.2 * load - 0.001 * (T0 - 290);
const trueD = (load: number) => 1e5 + 4e5 * load;
const wiggle = (i: number) => Math.sin(i * 1.7);

function hour(t: number, i: number, state: HourRow['state'] = 'steady'): HourRow {
  const load = 0.5 + 0.02 * (i % 25);
  const T0 = 295 + 0.1 * (i % 17);
  return {
    hourStart: new Date(t),
    state,
    load,
    loadUnit: '-',
    T0_K: T0,
    efficiency: trueEff(load, T0) + 0.001 * wiggle(i),
    efficiency_U: 0.012,
    destruction_W: trueD(load) + 1e3 * wiggle(i + 3),
    destruction_U_W: 18e3,
    destructionCost_per_h: 10,
    ...(state !== 'steady' ? { reasons: [{ code: state === 'idle' ? 'below-min-load' : 'load-swing', message: `${state} hour` }] } : {}),
  };
}

describeIntegration('unit trend', () => {
  let siteId: string;
  let unitId: string;
  const dayStart = Date.parse('2024-03-09T18:30:00Z'); // local midnight of 10 March in Kolkata
  // Hours from one hour before the local day to two after it: index 1 is the day's first hour.
  const base = dayStart - HOUR;
  const stateOf = (i: number): HourRow['state'] => (i === 5 || i === 6 ? 'idle' : i === 7 ? 'unsettled' : 'steady');

  beforeAll(async () => {
    const made = await inventedSite({ timeZone: 'Asia/Kolkata', units: [{ name: 'Back-pressure turbine', kind: 'turbine' }] });
    siteId = made.site.id;
    unitId = made.units.get('Back-pressure turbine')!;
    // Reference period for the baseline: 60 steady hours in February.
    const ref = Date.parse('2024-02-01T00:30:00Z');
    await addHours(unitId, Array.from({ length: 60 }, (_, i) => hour(ref + i * HOUR, i + 100)));
    const draft = await fitDraft(unitId, { periodFrom: new Date(ref), periodTo: new Date(ref + 60 * HOUR), terms: ['load', 'T_amb'] }, null);
    await acceptBaseline(draft.id, null);
    await addHours(unitId, Array.from({ length: 27 }, (_, i) => hour(base + i * HOUR, i, stateOf(i))));
    // 12 March (local): five idle hours and one steady one, from 08:00 local (02:30 UTC).
    const mar12 = Date.parse('2024-03-12T02:30:00Z');
    await addHours(unitId, Array.from({ length: 6 }, (_, i) => hour(mar12 + i * HOUR, 200 + i, i === 5 ? 'steady' : 'idle')));
    await db().insert(driftNotices).values([
      {
        siteId,
        unitId,
        direction: 'up',
        onsetHour: new Date(dayStart + 10 * HOUR),
        signalHour: new Date(dayStart + 14 * HOUR),
        lastSignalHour: new Date(dayStart + 14 * HOUR),
        hours: 4,
        extra_W: 5e4,
        expected_W: 3e5,
        shift_sigma: 3,
        currency: 'EUR',
        k: 0.5,
        h: 5,
      },
      {
        siteId,
        unitId,
        direction: 'down',
        status: 'closed',
        onsetHour: new Date('2024-01-05T00:30:00Z'),
        signalHour: new Date('2024-01-06T00:30:00Z'),
        lastSignalHour: new Date('2024-01-06T00:30:00Z'),
        closedAt: new Date('2024-01-20T00:00:00Z'),
        hours: 20,
        extra_W: -2e4,
        expected_W: 3e5,
        shift_sigma: -2,
        currency: 'EUR',
        k: 0.5,
        h: 5,
      },
    ]);
  });

  it('tzdata: a "day" in Asia/Kolkata runs from 18:30 UTC the day before, hour by hour', async () => {
    const res = await getTrend(ctx(`/api/units/${unitId}/trend?range=day&anchor=2024-03-10`, { unitId }, 'operator'));
    expect(res.status).toBe(200);
    const t = (await res.json()) as TrendAnswer;
    expect(t.period.from).toBe('2024-03-09T18:30:00.000Z');
    expect(t.period.to).toBe('2024-03-10T18:30:00.000Z');
    expect(t.bucket).toBe('hour');
    expect(t.points).toHaveLength(24);
    expect(t.points[0]!.t).toBe(dayStart);
    expect(t.points[23]!.t).toBe(dayStart + 23 * HOUR);
    // Index 0 (17:30 UTC) and index 25, 26 lie outside; the day's first hour is index 1.
    expectClose(t.points[0]!.efficiency!, hour(base + HOUR, 1).efficiency!, { rtol: 1e-12 });
    // 24 hours in the day, of which indexes 5 and 6 idle and 7 unsettled: 21 steady.
    expect(t.stateHours).toEqual({ steady: 21, unsettled: 1, idle: 2, suspect: 0 });
    expect(t.summary.steadyHours).toBe(21);
    expect(t.missingHours).toBe(0);
    // Non-steady hours break the line and are shaded as runs.
    expect(t.points[4]!.efficiency).toBeNull();
    expect(t.points[4]!.state).toBe('idle');
    expect(t.context).toEqual([
      { state: 'idle', fromMs: base + 5 * HOUR, toMs: base + 7 * HOUR, hours: 2 },
      { state: 'unsettled', fromMs: base + 7 * HOUR, toMs: base + 8 * HOUR, hours: 1 },
    ]);
  });

  it('hand-worked: the expected band follows the baseline, and the active baseline is named', async () => {
    const t = (await (await getTrend(ctx(`/api/units/${unitId}/trend?range=day&anchor=2024-03-10`, { unitId }))).json()) as TrendAnswer;
    expect(t.baseline?.label).toMatch(/^Baseline v1 \(2024-02-01 to 2024-02-03\)$/);
    const p = t.points[10]!; // index 11: load 0.72, T0 296.1 K
    expect(p.load).toBeCloseTo(0.72, 12);
    // 0.60 + 0.20 x 0.72 - 0.001 x 6.1 = 0.7379; the fit's wiggle is at most 0.001.
    expectClose(p.expected!.efficiency!, 0.7379, { atol: 1e-3 });
    expect(p.expected!.efficiencyLo!).toBeLessThan(p.expected!.efficiency!);
    expect(p.expected!.efficiencyHi!).toBeGreaterThan(p.expected!.efficiency!);
    // 100 kW + 400 kW x 0.72 = 388 kW, within the 1 kW wiggle.
    expectClose(p.expected!.destruction_W!, 388e3, { atol: 1e3 });
    expect(t.points[4]!.expected).toBeNull();
    // The curve for the scatter spans the steady loads at the period's mean T0.
    expect(t.scatter).toHaveLength(21);
    expect(t.curve).toHaveLength(25);
    const loads = t.scatter.map((s) => s.load);
    expectClose(t.curve[0]!.load, Math.min(...loads), { rtol: 1e-12 });
    expectClose(t.curve[24]!.load, Math.max(...loads), { rtol: 1e-12 });
  });

  it('marks the notices that touch the period, not one closed before it', async () => {
    const t = (await (await getTrend(ctx(`/api/units/${unitId}/trend?range=day&anchor=2024-03-10`, { unitId }))).json()) as TrendAnswer;
    expect(t.notices.map((n) => [n.direction, n.onsetMs, n.signalMs])).toEqual([['up', dayStart + 10 * HOUR, dayStart + 14 * HOUR]]);
  });

  it('hand-worked: a year is drawn per local day, each the mean of its steady hours', async () => {
    const t = (await (await getTrend(ctx(`/api/units/${unitId}/trend?range=year&anchor=2024-03-10`, { unitId }))).json()) as TrendAnswer;
    expect(t.bucket).toBe('day');
    expect(t.points).toHaveLength(366);
    expect(t.period.from).toBe('2023-12-31T18:30:00.000Z');
    const day = t.points.find((p) => p.t === dayStart)!;
    let sum = 0;
    let n = 0;
    for (let i = 1; i <= 24; i++) {
      if (stateOf(i) !== 'steady') continue;
      sum += hour(base + i * HOUR, i).efficiency!;
      n += 1;
    }
    expect(n).toBe(21);
    expectClose(day.efficiency!, sum / n, { rtol: 1e-12 });
    expect(day.states).toEqual({ steady: 21, unsettled: 1, idle: 2, suspect: 0 });
    // The local day before holds index 0 only (17:30 UTC = 23:00 local on 9 March).
    expect(t.points.find((p) => p.t === dayStart - 24 * HOUR)!.states.steady).toBe(1);
    // Days are shaded only when most of their hours are not steady: 10 March (21 of 24 steady) is not;
    // 12 March (5 idle, 1 steady) is, from its local midnight (11 March 18:30 UTC) for one day.
    expect(t.context).toEqual([{ state: 'idle', fromMs: Date.parse('2024-03-11T18:30:00Z'), toMs: Date.parse('2024-03-12T18:30:00Z'), hours: 6 }]);
  });

  it('answers 404 for an unknown unit and 400 for an unknown range', async () => {
    expect((await getTrend(ctx('/api/units/x/trend', { unitId: 'not-a-unit' }))).status).toBe(404);
    expect((await getTrend(ctx(`/api/units/${unitId}/trend?range=decade`, { unitId }))).status).toBe(400);
  });
});
