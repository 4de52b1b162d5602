/**
 * The planted faults appear in the exports where the plan puts them, and nowhere else. Each fault is
 * checked against a run of the same seed without it: the random draws per minute do not depend on
 * the plant's state, so before the fault the two runs' exports agree exactly, and after it they
 * differ by what the fault does.
 */
import { describe, expect, it } from 'vitest';
import { water } from '~/lib/thermo';
import { siteMidnightMs } from '../../scripts/demo/generate';
import type { FaultPlan } from '../../scripts/demo/plant';
import { DAY_ms, generate, HOUR_ms, Hours, mean } from './support';

const NONE = { turbineOutage: null, foulingStartMs: null, valvePassingStartMs: null, turbineStepMs: null, frozenTransmitter: null };
const START = '2025-01-13'; // a Monday
const t0 = siteMidnightMs(START);

function pair(days: number, fault: Partial<FaultPlan>, seed = 21) {
  const faulty = new Hours(generate({ start: START, days, seed, clean: true, faults: { ...NONE, ...fault } }).files);
  const healthy = new Hours(generate({ start: START, days, seed, clean: true, faults: NONE }).files);
  return { faulty, healthy };
}

/** TG1 isentropic efficiency of an hour, from its exported means. */
function tgEta(h: Hours, hour: number): number {
  const p = h.si('hp.p', hour);
  const T = h.si('hp.T', hour);
  const hIn = water.h_pt(p, T);
  const hEx = water.h_pt(h.si('tg1.ex.p', hour), h.si('tg1.ex.T', hour));
  const hS = water.h_ps(h.si('tg1.ex.p', hour), water.s_pt(p, T));
  return (hIn - hEx) / (hIn - hS);
}

/** E601 UA of an hour [W/K] from its exported means: condensing side at Tsat(shell p). */
function e601UA(h: Hours, hour: number): number {
  const Tret = h.si('e601.ret.T', hour);
  const Tsup = h.si('e601.sup.T', hour);
  const Tsat = water.tsat(h.si('e601.shell.p', hour));
  const cp = (water.h_pt(h.si('e601.sup.p', hour), Tsup) - water.h_pt(h.si('e601.ret.p', hour), Tret)) / (Tsup - Tret);
  const eps = (Tsup - Tret) / (Tsat - Tret);
  return -h.si('e601.loop.m', hour) * cp * Math.log(1 - eps);
}

describe('the planted faults', () => {
  it('self-consistency: TG1 isentropic efficiency drops by the planned step from its date, and only then', () => {
    const stepMs = t0 + 2 * DAY_ms + 6 * HOUR_ms;
    const step = 0.04;
    const { faulty, healthy } = pair(4, { turbineStepMs: stepMs, turbineStep: step });
    const running = faulty.hourStarts().filter((h) => faulty.si('tg1.W', h) > 500_000 && h !== stepMs - HOUR_ms);
    const before = running.filter((h) => h < stepMs);
    const after = running.filter((h) => h >= stepMs + HOUR_ms);
    expect(before.length).toBeGreaterThan(24);
    expect(after.length).toBeGreaterThan(24);
    for (const h of before) expect(Math.abs(tgEta(faulty, h) - tgEta(healthy, h))).toBeLessThan(1e-9);
    // the hourly efficiency carries about 0.002 of noise from the exhaust temperature (0.25 K a minute)
    const drop = mean(after.map((h) => tgEta(healthy, h) - tgEta(faulty, h)));
    expect(Math.abs(drop - step)).toBeLessThan(0.005);
    // less power from the same steam, and a hotter exhaust
    for (const h of after) {
      expect(faulty.si('tg1.W', h)).toBeLessThan(healthy.si('tg1.W', h) * 0.97);
      expect(faulty.si('tg1.ex.T', h)).toBeGreaterThan(healthy.si('tg1.ex.T', h) + 3);
    }
  });

  it('self-consistency: PRV1 passes steam from its date while it should be shut; TG1 gets that much less', () => {
    const fromMs = t0 + 1 * DAY_ms + 10.5 * HOUR_ms;
    const { faulty, healthy } = pair(3, { valvePassingStartMs: fromMs, valvePassingStart_tph: 0.8, valvePassingEnd_tph: 1.8, valvePassingGrowth_days: 2 });
    // hours in which the healthy valve is shut (TG1 takes the whole LP demand)
    const shut = healthy.hourStarts().filter((h) => healthy.si('prv1.m', h) < 0.1 / 3.6);
    const before = shut.filter((h) => h + HOUR_ms <= fromMs);
    const after = shut.filter((h) => h >= fromMs);
    expect(before.length).toBeGreaterThan(20);
    expect(after.length).toBeGreaterThan(20);
    for (const h of before) expect(faulty.si('prv1.m', h)).toBeLessThan(0.1 / 3.6);
    const flows: number[] = [];
    for (const h of after) {
      const leak = faulty.si('prv1.m', h);
      flows.push(leak);
      expect(leak).toBeGreaterThan(0.7 / 3.6);
      expect(leak).toBeLessThan(1.9 / 3.6);
      // the steam that passes the valve does not pass the turbine (flow meters: 0.3 % a minute)
      expect(Math.abs(healthy.si('tg1.m', h) - faulty.si('tg1.m', h) - leak)).toBeLessThan(0.15 / 3.6);
      // throttled HP steam is much hotter downstream than the dead leg of a shut valve
      expect(faulty.si('prv1.T', h)).toBeGreaterThan(healthy.si('prv1.T', h) + 100);
    }
    // the passing grows
    expect(mean(flows.slice(-6))).toBeGreaterThan(mean(flows.slice(0, 6)) + 0.3 / 3.6);
  });

  it('self-consistency: E601 fouls over the days after its date: UA falls, the approach temperature rises, at last the supply falls short', () => {
    const fromMs = t0 + 1 * DAY_ms;
    const tau_days = 1.2;
    const final = 1.3;
    const { faulty, healthy } = pair(6, { foulingStartMs: fromMs, foulingTau_days: tau_days, foulingFinal: final });
    const running = healthy.hourStarts().filter((h) => healthy.si('e601.loop.m', h) > 40 / 3.6 && healthy.si('e601.steam.m', h) > 0.5 / 3.6);
    const before = running.filter((h) => h + HOUR_ms <= fromMs);
    const late = running.filter((h) => h >= fromMs + 3.5 * DAY_ms);
    expect(before.length).toBeGreaterThan(12);
    expect(late.length).toBeGreaterThan(12);
    for (const h of before) expect(Math.abs(e601UA(faulty, h) / e601UA(healthy, h) - 1)).toBeLessThan(1e-9);
    for (const h of late) {
      const t = (h - fromMs) / DAY_ms;
      const expected = 1 / (1 + final * (1 - Math.exp(-t / tau_days)));
      // UA from hourly means: 0.06 K of temperature noise a minute on a 10-20 K rise: a few percent
      expect(Math.abs(e601UA(faulty, h) / e601UA(healthy, h) / expected - 1)).toBeLessThan(0.06);
      const approach = (x: Hours) => water.tsat(x.si('e601.shell.p', h)) - x.si('e601.sup.T', h);
      expect(approach(faulty)).toBeGreaterThan(approach(healthy) + 10);
    }
    // with the shell at its highest pressure the loop no longer reaches its 85 degC set point
    const short = late.filter((h) => faulty.si('e601.sup.T', h) < 273.15 + 84);
    expect(short.length).toBeGreaterThan(3);
    for (const h of late) expect(healthy.si('e601.sup.T', h)).toBeGreaterThan(273.15 + 84.8);
  });

  it('self-consistency: the TG1 inspection stops the turbine and PRV1 carries the LP demand', () => {
    const fromMs = t0 + 1 * DAY_ms + 6 * HOUR_ms;
    const toMs = fromMs + 1 * DAY_ms;
    const { faulty } = pair(3, { turbineOutage: { fromMs, toMs } });
    // the last hour is left out: the ingest draws a line from its last sample to the next hour's first
    const inside = faulty.hourStarts().filter((h) => h >= fromMs && h + 2 * HOUR_ms <= toMs);
    expect(inside.length).toBe(23);
    for (const h of inside) {
      expect(faulty.si('tg1.W', h)).toBeLessThan(5_000);
      expect(Math.abs(faulty.si('prv1.m', h) / faulty.si('b1.steam.m', h) - 1)).toBeLessThan(0.01);
    }
  });
});
