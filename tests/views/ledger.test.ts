import { beforeAll, expect, it } from 'vitest';
import { GET as getLedger } from '~/pages/api/sites/[siteId]/ledger';
import { GET as getFlow } from '~/pages/api/sites/[siteId]/flow';
import { siteLedger, type LedgerAnswer, type FlowAnswer } from '~/server/services/views';
import { describeIntegration } from '../support/integration';
import { expectClose } from '../support/expect-close';
import { addHours, at, ctx, inventedSite, type HourRow } from './support';

/**
 * Invented unit hours in the week of Monday 2024-03-04 (site in UTC). Only steady hours count in
 * sums and means; the numbers below are worked by hand from the rows.
 */
describeIntegration('loss ledger', () => {
  let siteId: string;
  let units: Map<string, string>;

  beforeAll(async () => {
    ({ site: { id: siteId }, units } = await inventedSite({
      timeZone: 'UTC',
      units: [
        { name: 'Turbine T1', kind: 'turbine' },
        { name: 'Feed pump P1', kind: 'pump' },
        { name: 'PRV 3', kind: 'let-down-valve' },
        { name: 'Fan F1', kind: 'fan' },
      ],
    }));
    const steady = (iso: string, D_kW: number, DU_kW: number, cost: number, eff: number | null, effU: number | null, F_kW: number, P_kW: number, L_kW = 0): HourRow => ({
      hourStart: at(iso),
      state: 'steady',
      destruction_W: D_kW * 1e3,
      destruction_U_W: DU_kW * 1e3,
      destructionCost_per_h: cost,
      efficiency: eff,
      efficiency_U: effU,
      fuel_W: F_kW * 1e3,
      product_W: P_kW * 1e3,
      loss_W: L_kW * 1e3,
    });
    await addHours(units.get('Turbine T1')!, [
      steady('2024-03-05T10:00:00Z', 400, 20, 20, 0.8, 0.01, 2000, 1600),
      steady('2024-03-05T11:00:00Z', 500, 25, 25, 0.78, 0.012, 2200, 1700),
      steady('2024-03-05T12:00:00Z', 600, 30, 30, 0.76, 0.014, 2400, 1800),
      // Not steady: counted by state, never summed.
      { hourStart: at('2024-03-05T13:00:00Z'), state: 'unsettled', destruction_W: 9e6, destructionCost_per_h: 999, efficiency: 0.1 },
      { hourStart: at('2024-03-05T14:00:00Z'), state: 'idle', destruction_W: 1e3, destructionCost_per_h: 1 },
      // Outside the week (the next Monday 00:00 is the exclusive end).
      steady('2024-03-11T00:00:00Z', 9000, 1, 1000, 0.5, 0.01, 10000, 1000),
      steady('2024-03-03T23:00:00Z', 9000, 1, 1000, 0.5, 0.01, 10000, 1000),
    ]);
    await addHours(units.get('Feed pump P1')!, [
      steady('2024-03-06T08:00:00Z', 50, 4, 5, 0.6, 0.02, 125, 75),
      steady('2024-03-06T09:00:00Z', 70, 6, 7, 0.7, 0.03, 233.33, 163.33),
      { hourStart: at('2024-03-06T10:00:00Z'), state: 'suspect', reasons: [{ code: 'frozen', message: 'FW_FLOW did not change for 6 h' }] },
    ]);
    await addHours(units.get('PRV 3')!, [0, 1, 2, 3].map((i) => steady(`2024-03-07T0${i}:00:00Z`, 300, 15, 15, null, null, 300, 0)));
  });

  it('hand-worked: ranks units by the cost of steady-hour destruction, with MWh, shares, efficiency means and hours by state', async () => {
    const res = await getLedger(ctx(`/api/sites/${siteId}/ledger?range=week&anchor=2024-03-06`, { siteId }, 'planner'));
    expect(res.status).toBe(200);
    const l = (await res.json()) as LedgerAnswer;
    expect(l.period.from).toBe('2024-03-04T00:00:00.000Z');
    expect(l.rows.map((r) => [r.rank, r.name])).toEqual([
      [1, 'Turbine T1'], // 20 + 25 + 30 = 75 EUR
      [2, 'PRV 3'], // 4 x 15 = 60 EUR
      [3, 'Feed pump P1'], // 5 + 7 = 12 EUR
      [4, 'Fan F1'], // no hours: no cost
    ]);
    const [t1, prv, pump, fan] = l.rows;
    // Turbine: (400 + 500 + 600) kW x 1 h = 1500 kWh = 1.5 MWh; U (k=2) added linearly: 20 + 25 + 30 = 75 kWh.
    expectClose(t1!.destruction_MWh, 1.5, { rtol: 1e-12 });
    expectClose(t1!.destruction_U_MWh, 0.075, { rtol: 1e-12 });
    expectClose(t1!.cost!, 75, { rtol: 1e-12 });
    // Cost carries the relative U of the destruction: 75 x 0.075 / 1.5 = 3.75 EUR.
    expectClose(t1!.cost_U!, 3.75, { rtol: 1e-12 });
    // Efficiency: (0.80 + 0.78 + 0.76) / 3 = 0.78; U: (0.010 + 0.012 + 0.014) / 3 = 0.012.
    expectClose(t1!.efficiencyMean!, 0.78, { rtol: 1e-12 });
    expectClose(t1!.efficiencyMean_U!, 0.012, { rtol: 1e-12 });
    expect(t1!.hours).toEqual({ steady: 3, unsettled: 1, idle: 1, suspect: 0 });
    // Fuel 2000 + 2200 + 2400 = 6600 kWh; product 1600 + 1700 + 1800 = 5100 kWh.
    expectClose(t1!.fuel_MWh, 6.6, { rtol: 1e-12 });
    expectClose(t1!.product_MWh, 5.1, { rtol: 1e-12 });
    // Valve: 4 x 300 kWh = 1.2 MWh, dissipative (no efficiency).
    expectClose(prv!.destruction_MWh, 1.2, { rtol: 1e-12 });
    expect(prv!.efficiencyMean).toBeNull();
    // Pump: 50 + 70 = 120 kWh; efficiency (0.6 + 0.7) / 2 = 0.65; one suspect hour.
    expectClose(pump!.destruction_MWh, 0.12, { rtol: 1e-12 });
    expectClose(pump!.efficiencyMean!, 0.65, { rtol: 1e-12 });
    expect(pump!.hours).toEqual({ steady: 2, unsettled: 0, idle: 0, suspect: 1 });
    expect(fan!.cost).toBeNull();
    expect(fan!.destruction_MWh).toBe(0);
    // Shares of the site cost 75 + 60 + 12 = 147 EUR.
    expect(l.shareBasis).toBe('cost');
    expectClose(t1!.share!, 75 / 147, { rtol: 1e-12 });
    expectClose(prv!.share!, 60 / 147, { rtol: 1e-12 });
    expectClose(pump!.share!, 12 / 147, { rtol: 1e-12 });
    // Site totals: 1.5 + 1.2 + 0.12 = 2.82 MWh; U 0.075 + 0.06 + 0.01 = 0.145 MWh; 147 EUR.
    expectClose(l.totals.destruction_MWh, 2.82, { rtol: 1e-12 });
    expectClose(l.totals.destruction_U_MWh, 0.145, { rtol: 1e-12 });
    expectClose(l.totals.cost!, 147, { rtol: 1e-12 });
    expect(l.totals.hours).toEqual({ steady: 9, unsettled: 1, idle: 1, suspect: 1 });
  });

  it('hand-worked: a day holding only the unsettled hour sums nothing, and the ranking then falls back to destruction', async () => {
    const day = await siteLedger(siteId, { range: 'custom', from: '2024-03-07', to: '2024-03-07' });
    expect(day.rows[0]!.name).toBe('PRV 3');
    expect(day.rows.filter((r) => r.destruction_MWh > 0).map((r) => r.name)).toEqual(['PRV 3']);
    const other = await siteLedger(siteId, { range: 'day', anchor: '2024-03-12' });
    expect(other.totals.destruction_MWh).toBe(0);
    expect(other.totals.cost).toBeNull();
    expect(other.shareBasis).toBe('destruction');
    expect(other.rows.every((r) => r.share === null)).toBe(true);
  });

  it('hand-worked: the flow picture splits each unit’s fuel exergy into product, loss and destruction by source', async () => {
    const res = await getFlow(ctx(`/api/sites/${siteId}/flow?range=week&anchor=2024-03-04`, { siteId }));
    const f = (await res.json()) as FlowAnswer;
    expect(f.units.map((u) => [u.name, u.source])).toEqual([
      ['Turbine T1', 'streams'],
      ['PRV 3', 'streams'],
      ['Feed pump P1', 'power'],
    ]);
    // Streams: turbine 6.6 MWh + valve 4 x 0.3 = 1.2 MWh = 7.8 MWh; power: pump 0.125 + 0.23333 = 0.35833 MWh.
    expectClose(f.sources.find((s) => s.key === 'streams')!.MWh, 7.8, { rtol: 1e-12 });
    expectClose(f.sources.find((s) => s.key === 'power')!.MWh, 0.35833, { rtol: 1e-12 });
    expectClose(f.totals.destruction_MWh, 2.82, { rtol: 1e-12 });
    expect(f.steadyHours).toBe(9);
  });

  it('answers 404 for an unknown site and 400 for a broken period', async () => {
    const missing = await getLedger(ctx('/api/sites/x/ledger?range=week', { siteId: '00000000-0000-4000-8000-000000000000' }));
    expect(missing.status).toBe(404);
    const broken = await getLedger(ctx(`/api/sites/${siteId}/ledger?range=custom&from=2024-03-09&to=2024-03-01`, { siteId }));
    expect(broken.status).toBe(400);
    expect((await broken.json()).error.message).toMatch(/ends before/);
  });
});
