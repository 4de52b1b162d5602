/**
 * The live figures of a drift notice (src/lib/analytics/notice-figures.ts) against residual series
 * worked by hand. The rules (trend, fading, a clearly larger shift, the repair verdict) are
 * Lossline's own and stated in the file's head; the uncertainty of a mean follows JCGM 100:2008
 * (4.2.3 and 5.1.2) and the AR(1) effective sample size n (1 - phi) / (1 + phi) (Box, Jenkins &
 * Reinsel, Time Series Analysis, ch. 3; the n' of ASHRAE Guideline 14-2014, Annex B).
 */
import { describe, expect, it } from 'vitest';
import {
  chartSeries,
  clearlyLarger,
  costPerDay,
  effectiveHours,
  fadedAt,
  liveFigures,
  repairVerdict,
  shiftFigure,
  trendOf,
  type ResidualHour,
} from '~/lib/analytics/notice-figures';
import { expectClose } from '../support/expect-close';

const HOUR = 3_600_000;
const series = (rs: number[], U: number | null = null, start = 0, extra: Partial<ResidualHour>[] = []): ResidualHour[] =>
  rs.map((r, i) => ({ hourStart_ms: start + i * HOUR, residual_W: r, hourU_W: U, cPlus: 0, cMinus: 0, signal: null, ...(extra[i] ?? {}) }));

describe('the size of a shift and its uncertainty', () => {
  it('hand-worked: four hours, sigma 2000 W, U(hour) 4000 W, phi 0', () => {
    // mean (1000 + 3000 + 2000 + 2000) / 4 = 2000 W; statistical 2 x 2000 / sqrt(4) = 2000 W;
    // measurement 4000 / sqrt(4) = 2000 W; combined sqrt(2000^2 + 2000^2) = 2828.43 W.
    const f = shiftFigure(series([1000, 3000, 2000, 2000], 4000), 2000);
    expect(f.hours).toBe(4);
    expectClose(f.mean_W, 2000, { rtol: 1e-12 });
    expectClose(f.statU_W, 2000, { rtol: 1e-12 });
    expectClose(f.measU_W!, 2000, { rtol: 1e-12 });
    expectClose(f.U_W, 2828.4271247, { rtol: 1e-9 });
    // |2000| is not above 2000: not beyond the measurement uncertainty.
    expect(f.exceedsMeasurement).toBe(false);
  });

  it('hand-worked: autocorrelated residuals count as fewer hours (phi 0.5: 6 hours are 2)', () => {
    expectClose(effectiveHours(6, 0.5), 2, { rtol: 1e-12 });
    expectClose(effectiveHours(24, 0), 24, { rtol: 1e-12 });
    // mean (3 x 3000) / 6 = 1500 W; statistical 2 x 1000 / sqrt(2) = 1414.21 W; one hour without U: no measurement part.
    const hs = series([0, 0, 0, 3000, 3000, 3000], 500);
    hs[2]!.hourU_W = null;
    const f = shiftFigure(hs, 1000, 0.5);
    expectClose(f.mean_W, 1500, { rtol: 1e-12 });
    expectClose(f.U_W, 1414.2135624, { rtol: 1e-9 });
    expect(f.measU_W).toBeNull();
    expect(f.exceedsMeasurement).toBeNull();
  });

  it('hand-worked: cost per day at c_F = 30 EUR/MWh of exergy: 2000 W -> 30/3.6e9 x 2000 x 86400 = 1.44 EUR/day', () => {
    const c = costPerDay({ mean_W: 2000, U_W: 1000 }, 30 / 3.6e9);
    expectClose(c.cost_per_day!, 1.44, { rtol: 1e-12 });
    expectClose(c.costU_per_day!, 0.72, { rtol: 1e-12 });
    expect(costPerDay({ mean_W: 2000, U_W: 1000 }, null)).toEqual({ cost_per_day: null, costU_per_day: null });
  });
});

describe('live figures and trend', () => {
  it('hand-worked: a growing shift; the current day is larger than the mean since onset', () => {
    // 48 hours since onset: the first day at 1000 W, the second at 3000 W; sigma 500 W, phi 0.
    // current (last 24) = 3000 W, U = 2 x 500 / sqrt(24) = 204.12 W; since onset = 2000 W, U = 2 x 500 / sqrt(48) = 144.34 W.
    // difference 1000 W > sqrt(204.12^2 + 144.34^2) = 250 W: growing.
    const hs = series([...Array(24).fill(1000), ...Array(24).fill(3000)]);
    const live = liveFigures(hs, 500, 0, 'up');
    expectClose(live.current.mean_W, 3000, { rtol: 1e-12 });
    expectClose(live.current.U_W, 204.1241452, { rtol: 1e-9 });
    expectClose(live.sinceOnset.mean_W, 2000, { rtol: 1e-12 });
    expect(live.current.hours).toBe(24);
    expect(live.sinceOnset.hours).toBe(48);
    expect(live.trend).toBe('growing');
    // the same series read as a shift downwards (less destruction) recedes
    expect(liveFigures(hs, 500, 0, 'down').trend).toBe('receding');
    // a steady shift stays steady
    expect(liveFigures(series(Array(48).fill(2000)), 500, 0, 'up').trend).toBe('steady');
  });

  it('hand-worked: the trend boundary is the combined uncertainty sqrt(U_cur^2 + U_onset^2)', () => {
    const cur = { hours: 24, fromMs: 0, toMs: 0, mean_W: 5000, U_W: 1000, statU_W: 1000, measU_W: null, nEff: 24, exceedsMeasurement: null };
    // 5000 - 3600 = 1400 < sqrt(2) x 1000 = 1414.2: steady; 5000 - 3500 = 1500 > 1414.2: growing
    expect(trendOf(cur, { ...cur, mean_W: 3600 }, 'up')).toBe('steady');
    expect(trendOf(cur, { ...cur, mean_W: 3500 }, 'up')).toBe('growing');
    expect(trendOf(cur, { ...cur, mean_W: 6500 }, 'up')).toBe('receding');
  });
});

describe('fading', () => {
  it('hand-worked: the mean of the last 24 hours falls within its uncertainty of zero at the 26th hour after the last signal', () => {
    // 5 hours at 3 sigma (sums above zero), then hours at zero. sigma = 1000 W, U(mean of 24) = 2000 / sqrt(24) = 408.2 W.
    // Window ending at hour index 23: mean 5 x 3000 / 24 = 625 W > 408.2; index 24: 4 x 3000 / 24 = 500 W > 408.2;
    // index 25: 3 x 3000 / 24 = 375 W <= 408.2: faded at index 25.
    const rs = [...Array(5).fill(3000), ...Array(30).fill(0)];
    const hs = series(rs, null, 0, rs.map((r) => ({ cPlus: r > 0 ? 2 : 0.5 })));
    expect(fadedAt(hs, 1000, 0, 'up')).toBe(25 * HOUR);
    // A signal inside the window restarts the count: a signal at index 10 -> not before index 10 + 24 = 34.
    hs[10]!.signal = 'up';
    expect(fadedAt(hs, 1000, 0, 'up')).toBe(34 * HOUR);
    // Still shifted (1 sigma throughout, sums never at zero): never fades.
    expect(fadedAt(series(Array(60).fill(1000), null, 0, Array(60).fill({ cPlus: 1 })), 1000, 0, 'up')).toBeNull();
  });

  it('hand-worked: the sum at zero over the whole window also ends the shift, whatever the mean', () => {
    // window 3 hours, residuals 2000 W (mean 2000 > U = 2 x 1000 / sqrt(3) = 1154.7) but C+ = 0 at each of them.
    const hs = series([2000, 2000, 2000, 2000], null, 0, [{ cPlus: 1 }, { cPlus: 0 }, { cPlus: 0 }, { cPlus: 0 }]);
    expect(fadedAt(hs, 1000, 0, 'up', 3)).toBe(3 * HOUR);
  });
});

describe('a later, larger shift', () => {
  it('hand-worked: 1.5 times the current size and apart by more than 1.5 sqrt(U_new^2 + U_cur^2)', () => {
    const cur = { hours: 24, fromMs: 0, toMs: 0, mean_W: 2000, U_W: 500, statU_W: 500, measU_W: null, nEff: 24, exceedsMeasurement: null };
    // 4000 >= 1.5 x 2000 = 3000 and 4000 - 2000 = 2000 > 1.5 sqrt(1000^2 + 500^2) = 1677.1: a notice of its own.
    expect(clearlyLarger({ ...cur, mean_W: 4000, U_W: 1000 }, cur, 'up')).toBe(true);
    // 3500 - 2000 = 1500 < 1677.1: absorbed.
    expect(clearlyLarger({ ...cur, mean_W: 3500, U_W: 1000 }, cur, 'up')).toBe(false);
    // 2900 < 3000: absorbed whatever the uncertainty.
    expect(clearlyLarger({ ...cur, mean_W: 2900, U_W: 10 }, cur, 'up')).toBe(false);
    // 1.5 sqrt(1400^2 + 500^2) = 2229.9: 4300 - 2000 = 2300 above it (true); with U 1500, 1.5 sqrt(1500^2 + 500^2) = 2371.7 (false).
    expect(clearlyLarger({ ...cur, mean_W: 4300, U_W: 1400 }, cur, 'up')).toBe(true);
    expect(clearlyLarger({ ...cur, mean_W: 4300, U_W: 1500 }, cur, 'up')).toBe(false);
    // The stopping rule's floor (k + h/N) sigma: with k = 0.5, h = 5, N = 3 and sigma = 1500 W the floor is
    // 2.1667 x 1500 = 3250 W, above the current 2000 W: 4800 < 1.5 x 3250 = 4875, absorbed (it would not be
    // without the floor); 6000 >= 4875 and 6000 - 3250 = 2750 > 1677.1: a notice of its own.
    expect(clearlyLarger({ ...cur, mean_W: 4800, U_W: 1000 }, cur, 'up')).toBe(true);
    expect(clearlyLarger({ ...cur, mean_W: 4800, U_W: 1000 }, cur, 'up', (0.5 + 5 / 3) * 1500)).toBe(false);
    expect(clearlyLarger({ ...cur, mean_W: 6000, U_W: 1000 }, cur, 'up', (0.5 + 5 / 3) * 1500)).toBe(true);
    // downwards: sizes count in the notice's direction
    expect(clearlyLarger({ ...cur, mean_W: -4000, U_W: 1000 }, { ...cur, mean_W: -2000 }, 'down')).toBe(true);
  });

  it('hand-worked: the same fault at a higher duty is not larger; a larger fault at the same duty is', () => {
    const cur = { hours: 24, fromMs: 0, toMs: 0, mean_W: 2000, U_W: 500, statU_W: 500, measU_W: null, nEff: 24, exceedsMeasurement: null };
    // 4000 W against 2000 W passes in watts (as above). Expected 10 kW at the current window, 20 kW at the signal:
    // 4000 / 20000 = 0.2 against 1.5 x 2000 / 10000 = 0.3: the same 20 % at twice the duty, absorbed.
    expect(clearlyLarger({ ...cur, mean_W: 4000, U_W: 1000 }, cur, 'up', 0, { signal_W: 20_000, current_W: 10_000 })).toBe(false);
    // At the same duty (10 kW both): 0.4 >= 0.3, a notice of its own, as without the duty.
    expect(clearlyLarger({ ...cur, mean_W: 4000, U_W: 1000 }, cur, 'up', 0, { signal_W: 10_000, current_W: 10_000 })).toBe(true);
    // 6100 W at 20 kW: 0.305 >= 0.3, larger in proportion too.
    expect(clearlyLarger({ ...cur, mean_W: 6100, U_W: 1000 }, cur, 'up', 0, { signal_W: 20_000, current_W: 10_000 })).toBe(true);
    // Larger in proportion only (a fixed extra on a light load): 2900 W fails in watts whatever the duty.
    expect(clearlyLarger({ ...cur, mean_W: 2900, U_W: 10 }, cur, 'up', 0, { signal_W: 5_000, current_W: 10_000 })).toBe(false);
    // No usable expected value (zero or negative): the size in watts decides alone.
    expect(clearlyLarger({ ...cur, mean_W: 4000, U_W: 1000 }, cur, 'up', 0, { signal_W: 0, current_W: 10_000 })).toBe(true);
  });
});

describe('repair verdict (IPMVP: adjusted baseline against the reporting period)', () => {
  const cF = 30 / 3.6e9; // 30 EUR per MWh of destroyed exergy (invented)
  // Before the repair: 24 hours at 6000 W (sigma 1000 W: U = 2000 / sqrt(24) = 408.25 W).
  const before = shiftFigure(series(Array(24).fill(6000)), 1000);

  it('hand-worked: back on the line after the repair; avoided 6000 W, 131.49 EUR/month', () => {
    // 72 hours alternating +500 / -500 W: mean 0, U = 2000 / sqrt(72) = 235.70 W.
    const after = shiftFigure(series(Array.from({ length: 72 }, (_, i) => (i % 2 ? 500 : -500))), 1000);
    const v = repairVerdict(before, after, 'up', cF);
    expect(v.back).toBe(true);
    expectClose(v.avoided_W, 6000, { rtol: 1e-12 });
    // sqrt(408.248^2 + 235.702^2) = 471.40 W
    expectClose(v.avoidedU_W, 471.4045208, { rtol: 1e-9 });
    // 30/3.6e9 EUR/J x 6000 W x 86400 s/day x 30.4375 days/month = 4.32 x 30.4375 = 131.49 EUR/month
    expectClose(v.avoidedCost_per_month!, 131.49, { rtol: 1e-9 });
    expectClose(v.avoidedCostU_per_month!, (30 / 3.6e9) * 471.4045208 * 86400 * 30.4375, { rtol: 1e-9 });
  });

  it('hand-worked: the shift is still there; the avoided part is the difference', () => {
    const after = shiftFigure(series(Array(72).fill(5000)), 1000);
    const v = repairVerdict(before, after, 'up', null);
    expect(v.back).toBe(false);
    expectClose(v.avoided_W, 1000, { rtol: 1e-12 });
    expect(v.avoidedCost_per_month).toBeNull();
    // a residual of 200 W after, within U = 235.7 W: back
    expect(repairVerdict(before, shiftFigure(series(Array(72).fill(200)), 1000), 'up', cF).back).toBe(true);
    // a residual of 300 W after, beyond 235.7 W: not back
    expect(repairVerdict(before, shiftFigure(series(Array(72).fill(300)), 1000), 'up', cF).back).toBe(false);
  });
});

describe('the chart series', () => {
  it('self-consistency: hourly up to 14 days, per day beyond, with the largest sum and any signal of the day', () => {
    const short = series(Array(48).fill(1000));
    expect(chartSeries(short, 'up', (ms) => ms - (ms % (24 * HOUR))).span).toBe('hour');
    const n = 20 * 24;
    const long = series(
      Array.from({ length: n }, (_, i) => (i < 24 ? 1000 : 3000)),
      null,
      0,
      Array.from({ length: n }, (_, i) => ({ cPlus: i % 24, signal: i === 30 ? ('up' as const) : null })),
    );
    const s = chartSeries(long, 'up', (ms) => ms - (ms % (24 * HOUR)));
    expect(s.span).toBe('day');
    expect(s.points).toHaveLength(20);
    expect(s.points[0]).toEqual({ t: new Date(0).toISOString(), hours: 24, residual_W: 1000, cusum: 23, signal: false });
    expect(s.points[1]!.signal).toBe(true);
    expect(s.points[2]!.signal).toBe(false);
    expect(s.points.every((p) => p.hours === 24)).toBe(true);
  });
});
