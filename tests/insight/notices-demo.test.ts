/**
 * The demo's exchanger fouling (scripts/demo/plant.ts: fouling resistance growing towards its
 * asymptote) seen through a drift notice: the headline (the current size, mean of the last 24 steady
 * hours) follows the fouling as it grows, while the figure at signal time stays small. Generated
 * hours: eight weeks of the demo's exports with only the fouling planted (from day 21, time constant
 * 14 days), read back through the ingest core; E601's exergy destruction per hour from the hourly
 * means with IAPWS-IF97 (Lossline's water core, itself checked against the release's tables):
 *   D = m_steam [(h_in - h_out) - T0 (s_in - s_out)] - m_loop [(h_sup - h_ret) - T0 (s_sup - s_ret)].
 * A baseline of D on steam flow and T0 over the first three weeks; the tabular CUSUM at the defaults
 * (k = 0.5 sigma, h = 5 sigma) with the drift check's restart and three-hour rule; the notice figures
 * of src/lib/analytics/notice-figures.ts at every day's check.
 */
import { describe, expect, it } from 'vitest';
import { fitBaseline, predict } from '~/lib/analytics/baseline';
import { cusumInit, cusumStep } from '~/lib/analytics/drift';
import { liveFigures, type ResidualHour } from '~/lib/analytics/notice-figures';
import { water } from '~/lib/thermo';
import { siteMidnightMs } from '../../scripts/demo/generate';
import { DAY_ms, HOUR_ms, Hours, generate } from '../demo/support';

const START = '2025-03-03'; // a Monday
const DAYS = 56;
const FOUL_DAY = 21;

describe('the demo exchanger fouling through a drift notice', () => {
  it('self-consistency: the headline grows with the fouling, day after day; the figure at signal stays', { timeout: 180_000 }, () => {
    const t0 = siteMidnightMs(START);
    const foulMs = t0 + FOUL_DAY * DAY_ms;
    const NONE = { turbineOutage: null, valvePassingStartMs: null, turbineStepMs: null, frozenTransmitter: null };
    const hours = new Hours(generate({ start: START, days: DAYS, seed: 7, clean: true, faults: { ...NONE, foulingStartMs: foulMs, foulingTau_days: 14, foulingFinal: 1.3 } }).files);
    const all = hours.hourStarts();
    const running = (h: number) => hours.si('e601.loop.m', h) > 5 / 3.6 && hours.si('e601.steam.m', h) > 0.3 / 3.6;
    // Steady enough: the loop and the steam run in the hour and in both neighbours (no start or stop inside).
    const steady = all.filter((h) => running(h) && running(h - HOUR_ms) && running(h + HOUR_ms));
    const D = (h: number) => {
      const T0 = hours.si('b1.air.T', h);
      const mS = hours.si('e601.steam.m', h);
      const mL = hours.si('e601.loop.m', h);
      const pS = hours.si('e601.shell.p', h);
      const TS = hours.si('e601.steam.T', h);
      const pC = hours.si('e601.cond.p', h);
      const TC = hours.si('e601.cond.T', h);
      const pR = hours.si('e601.ret.p', h);
      const TR = hours.si('e601.ret.T', h);
      const pU = hours.si('e601.sup.p', h);
      const TU = hours.si('e601.sup.T', h);
      const hot = water.h_pt(pS, TS) - water.h_pt(pC, TC) - T0 * (water.s_pt(pS, TS) - water.s_pt(pC, TC));
      const cold = water.h_pt(pU, TU) - water.h_pt(pR, TR) - T0 * (water.s_pt(pU, TU) - water.s_pt(pR, TR));
      return { D: mS * hot - mL * cold, load: mS, T0 };
    };
    const rows = steady.map((h) => ({ h, ...D(h) })).filter((r) => Number.isFinite(r.D));
    const ref = rows.filter((r) => r.h < foulMs);
    const later = rows.filter((r) => r.h >= foulMs);
    expect(ref.length).toBeGreaterThan(200);
    const model = fitBaseline({ load: ref.map((r) => r.load), T_amb_K: ref.map((r) => r.T0), y: ref.map((r) => r.D) }, { terms: ['load', 'T_amb'] });
    const s = model.stats.s;

    // The drift check, hour by hour; the notice opens at the first upward signal.
    let state = cusumInit();
    const series: (ResidualHour & { step: number })[] = [];
    let onsetIdx = -1;
    let first: number | null = null;
    const heads: { day: number; current_W: number; trend: string }[] = [];
    let dayEnd = foulMs + DAY_ms;
    for (const r of later) {
      while (r.h >= dayEnd) {
        // the daily check: the notice's live figures from its onset to the latest hour
        if (onsetIdx >= 0) {
          const live = liveFigures(series.slice(onsetIdx), s, 0, 'up');
          heads.push({ day: Math.round((dayEnd - foulMs) / DAY_ms), current_W: live.current.mean_W, trend: live.trend });
        }
        dayEnd += DAY_ms;
      }
      const residual = r.D - predict(model, r.load, r.T0);
      const out = cusumStep(state, residual / s, { k: 0.5, h: 5, resetOnSignal: true, minRunLength: 3 });
      state = out.state;
      series.push({ hourStart_ms: r.h, residual_W: residual, hourU_W: null, cPlus: out.point.cPlus, cMinus: out.point.cMinus, step: out.point.step });
      const up = out.point.signals.find((x) => x.direction === 'up');
      if (up && onsetIdx < 0) {
        onsetIdx = series.findIndex((p) => p.step === up.onsetStep);
        const hs = series.slice(onsetIdx);
        first = hs.reduce((a, p) => a + p.residual_W, 0) / hs.length;
      }
    }
    expect(onsetIdx).toBeGreaterThanOrEqual(0);
    expect(heads.length).toBeGreaterThan(20);
    // The headline follows the fouling: a week later it is larger than at the first checks, and again a week after that.
    const week = (from: number) => heads.filter((x) => x.day > from && x.day <= from + 7).map((x) => x.current_W);
    const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
    const w1 = mean(week(heads[0]!.day - 1));
    const w2 = mean(week(heads[0]!.day + 6));
    const w3 = mean(week(heads[0]!.day + 13));
    expect(w2).toBeGreaterThan(w1);
    expect(w3).toBeGreaterThan(w2);
    const last = heads[heads.length - 1]!;
    // The last headline is well above the figure at signal time, which stays in the record.
    expect(last.current_W).toBeGreaterThan(1.5 * first!);
    expect(heads.some((x) => x.trend === 'growing')).toBe(true);
    console.log(
      `E601 fouling: sigma ${(s / 1000).toFixed(2)} kW; first figure ${(first! / 1000).toFixed(2)} kW; weekly mean headline ${[w1, w2, w3].map((w) => (w / 1000).toFixed(2)).join(', ')} kW; last ${(last.current_W / 1000).toFixed(2)} kW (${last.trend})`,
    );
  });
});
