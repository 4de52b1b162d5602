import { describe, expect, it } from 'vitest';
import { zeroStateCounts } from '~/lib/hour-states';
import type { CurvePoint, ScatterPoint, TrendPoint } from '~/lib/views/trend';
import { loadScatterRows, timeChartRows } from '~/lib/views/trend-chart';

const states = { ...zeroStateCounts(), steady: 1 };
const point = (over: Partial<TrendPoint>): TrendPoint => ({
  t: 0,
  states,
  efficiency: null,
  efficiency_U: null,
  destruction_W: null,
  destruction_U_W: null,
  load: null,
  T0_K: null,
  expected: null,
  ...over,
});

/** Unit facts (SI, BIPM brochure): 1 kW = 1000 W, 1 MW = 10^6 W; a fraction of 1 is 100 %. */
describe('the trend charts rows', () => {
  it('SI units: efficiency in percent, destruction in the site power unit, band as a pair', () => {
    const p = point({
      t: 3_600_000,
      efficiency: 0.8,
      destruction_W: 2_500_000,
      expected: { efficiency: 0.82, efficiencyLo: 0.8, efficiencyHi: 0.84, destruction_W: 2_000_000, destructionLo_W: 1_500_000, destructionHi_W: 2_500_000 },
    });
    const [eff] = timeChartRows([p], 'efficiency', 1000);
    expect(eff?.t).toBe(3_600_000);
    expect(eff?.measured).toBeCloseTo(80, 12);
    expect(eff?.expected).toBeCloseTo(82, 12);
    expect(eff?.band?.[0]).toBeCloseTo(80, 12);
    expect(eff?.band?.[1]).toBeCloseTo(84, 12);
    expect(eff?.point).toBe(p);
    const [kW] = timeChartRows([p], 'destruction', 1000);
    expect([kW?.measured, kW?.expected, kW?.band]).toEqual([2500, 2000, [1500, 2500]]);
    const [MW] = timeChartRows([p], 'destruction', 1e6);
    expect([MW?.measured, MW?.expected, MW?.band]).toEqual([2.5, 2, [1.5, 2.5]]);
  });

  it('self-consistency: a missing value or band end stays empty (a gap, not zero)', () => {
    const p = point({ expected: { efficiency: null, efficiencyLo: 0.7, efficiencyHi: null, destruction_W: 5, destructionLo_W: null, destructionHi_W: 6 } });
    expect(timeChartRows([p], 'efficiency', 1000)[0]).toMatchObject({ measured: null, expected: null, band: null });
    expect(timeChartRows([p], 'destruction', 1)[0]).toMatchObject({ measured: null, expected: 5, band: null });
    expect(timeChartRows([point({})], 'destruction', 1)[0]).toMatchObject({ expected: null, band: null });
  });

  it('SI units: scatter dots without a value are left out; the curve keeps its band on both axes', () => {
    const scatter: ScatterPoint[] = [
      { t: 1, load: 10_000, efficiency: 0.5, efficiency_U: null, destruction_W: 3000 },
      { t: 2, load: 20_000, efficiency: null, efficiency_U: null, destruction_W: 4000 },
    ];
    const curve: CurvePoint[] = [
      { load: 10_000, efficiency: 0.6, lo: 0.55, hi: 0.65, destruction_W: 1000, dLo_W: null, dHi_W: 2000 },
    ];
    const eff = loadScatterRows(scatter, curve, 'efficiency', 1e-3, 1000);
    expect(eff.pts.map((p) => [p.x, p.y])).toEqual([[10, 50]]);
    expect(eff.cur[0]?.x).toBe(10);
    expect(eff.cur[0]?.y).toBeCloseTo(60, 12);
    expect(eff.cur[0]?.band?.[0]).toBeCloseTo(55, 12);
    expect(eff.cur[0]?.band?.[1]).toBeCloseTo(65, 12);
    const d = loadScatterRows(scatter, curve, 'destruction', 1e-3, 1000);
    expect(d.pts.map((p) => [p.x, p.y])).toEqual([[10, 3], [20, 4]]);
    expect(d.cur[0]).toMatchObject({ x: 10, y: 1, band: null });
  });
});
