/**
 * The pure shaping of the views (src/lib/views/trend.ts, ledger.ts), worked by hand without a
 * database: ranking and shares of the ledger, the flow's split by source, context runs and daily
 * points of the trend.
 */
import { describe, expect, it } from 'vitest';
import { HOUR_MS } from '~/lib/time';
import { flowFrom, ledgerFrom, overviewUnit, type UnitSums } from '~/lib/views/ledger';
import { resolvePeriod } from '~/lib/views/period';
import { contextRuns, dayShading, trendSeries, trendSummary, type TrendHour } from '~/lib/views/trend';
import { expectClose } from '../support/expect-close';

const sums = (o: Partial<UnitSums> & Pick<UnitSums, 'unitId' | 'name' | 'kind'>): UnitSums => ({
  hours: { steady: 0, unsettled: 0, idle: 0, suspect: 0 },
  destruction_Wh: null,
  destructionU_Wh: null,
  fuel_Wh: null,
  product_Wh: null,
  loss_Wh: null,
  cost: null,
  costHours: 0,
  efficiencyMean: null,
  efficiencyMean_U: null,
  ...o,
});

describe('ledger from per-unit sums', () => {
  const boiler = sums({ unitId: 'b', name: 'Boiler', kind: 'boiler', hours: { steady: 2, unsettled: 1, idle: 0, suspect: 0 }, destruction_Wh: 4e6, destructionU_Wh: 4e5, fuel_Wh: 10e6, product_Wh: 5e6, loss_Wh: 1e6, cost: 120, costHours: 2, efficiencyMean: 0.5, efficiencyMean_U: 0.02 });
  const valve = sums({ unitId: 'v', name: 'Valve', kind: 'valve', hours: { steady: 2, unsettled: 0, idle: 0, suspect: 1 }, destruction_Wh: 6e6, destructionU_Wh: 3e5, cost: 30, costHours: 1 });

  it('hand-worked: ranked by cost, MWh from Wh, shares of the cost total, cost U at the destruction relative U', () => {
    const l = ledgerFrom([valve, boiler]);
    expect(l.shareBasis).toBe('cost');
    expect(l.rows.map((r) => [r.rank, r.unitId])).toEqual([[1, 'b'], [2, 'v']]);
    const [b, v] = l.rows;
    expectClose(b!.destruction_MWh, 4, { rtol: 1e-15 });
    expectClose(b!.share!, 120 / 150, { rtol: 1e-15 });
    // 120 x (0.4 MWh / 4 MWh) = 12
    expectClose(b!.cost_U!, 12, { rtol: 1e-15 });
    expect(v!.hoursWithoutCost).toBe(1);
    expect(v!.efficiencyMean_U).toBeNull();
    expect(l.totals.hours).toEqual({ steady: 4, unsettled: 1, idle: 0, suspect: 1 });
    expectClose(l.totals.destruction_MWh, 10, { rtol: 1e-15 });
    expectClose(l.totals.cost!, 150, { rtol: 1e-15 });
  });

  it('hand-worked: without costs the ranking and shares fall back to destruction', () => {
    const l = ledgerFrom([{ ...boiler, cost: null, costHours: 0 }, { ...valve, cost: null, costHours: 0 }]);
    expect(l.shareBasis).toBe('destruction');
    expect(l.rows[0]!.unitId).toBe('v');
    expectClose(l.rows[0]!.share!, 0.6, { rtol: 1e-15 });
    expect(l.totals.cost).toBeNull();
  });

  it('hand-worked: the flow keeps units with fuel exergy, by source; negative products show as zero', () => {
    const pump = sums({ unitId: 'p', name: 'Pump', kind: 'pump', hours: { steady: 1, unsettled: 0, idle: 0, suspect: 0 }, fuel_Wh: 2e6, product_Wh: -1e5, destruction_Wh: 2e6 });
    const f = flowFrom([boiler, valve, pump]);
    expect(f.units.map((u) => [u.unitId, u.source])).toEqual([['b', 'fuel'], ['p', 'power']]);
    expect(f.units[1]!.product_MWh).toBe(0);
    expect(f.sources).toEqual([{ key: 'fuel', label: 'Fuel burned', MWh: 10 }, { key: 'power', label: 'Power in', MWh: 2 }]);
    expect(f.steadyHours).toBe(5);
  });

  it('hand-worked: an overview mean is the energy over the steady hours, 4 MWh / 2 h = 2 MW', () => {
    expect(overviewUnit(boiler).destructionMean_W).toBe(2e6);
    expect(overviewUnit(valve).cost).toBe(30);
  });
});

const t0 = Date.UTC(2024, 2, 4);
const hour = (i: number, state: TrendHour['state'], destruction_W: number | null = null): TrendHour => ({
  hourStart: new Date(t0 + i * HOUR_MS),
  state,
  reasons: [{ message: `r${i}` }],
  load: 1,
  T0_K: 290,
  efficiency: null,
  efficiency_U: null,
  destruction_W,
  destruction_U_W: null,
});

describe('trend shaping', () => {
  it('self-consistency: runs of one non-steady state join; a steady hour or another state breaks them', () => {
    const runs = contextRuns([hour(0, 'idle'), hour(1, 'idle'), hour(2, 'steady', 5), hour(3, 'idle'), hour(4, 'suspect')]);
    expect(runs).toEqual([
      { state: 'idle', fromMs: t0, toMs: t0 + 2 * HOUR_MS, hours: 2 },
      { state: 'idle', fromMs: t0 + 3 * HOUR_MS, toMs: t0 + 4 * HOUR_MS, hours: 1 },
      { state: 'suspect', fromMs: t0 + 4 * HOUR_MS, toMs: t0 + 5 * HOUR_MS, hours: 1 },
    ]);
  });

  it('hand-worked: a UTC day per hour: 24 points, figures only on steady hours, the summary their mean', () => {
    const period = resolvePeriod({ range: 'day', anchor: '2024-03-04' }, 'UTC');
    const rows = [hour(0, 'steady', 100), hour(1, 'steady', 300), hour(2, 'unsettled', 900)];
    const s = trendSeries(rows, period, new Map());
    expect(s.bucket).toBe('hour');
    expect(s.points).toHaveLength(24);
    expect(s.points.map((p) => p.destruction_W).slice(0, 4)).toEqual([100, 300, null, null]);
    expect(s.points[2]!.state).toBe('unsettled');
    expect(trendSummary(rows.slice(0, 2), []).destructionMean_W).toBe(200);
  });

  it('hand-worked: a year per local day; a day of mostly idle hours is shaded idle', () => {
    const period = resolvePeriod({ range: 'year', anchor: '2024-03-04' }, 'UTC');
    const rows = [hour(0, 'steady', 100), hour(1, 'steady', 300), hour(24, 'idle'), hour(25, 'idle'), hour(26, 'steady', 50)];
    const s = trendSeries(rows, period, new Map());
    expect(s.bucket).toBe('day');
    expect(s.points).toHaveLength(366); // 2024 is a leap year
    const i = s.points.findIndex((p) => p.t === t0);
    expect(s.points[i]!.destruction_W).toBe(200);
    expect(s.context).toEqual([{ state: 'idle', fromMs: t0 + 24 * HOUR_MS, toMs: t0 + 48 * HOUR_MS, hours: 3 }]);
    expect(dayShading(s.points, period.toMs)).toEqual(s.context);
  });
});
