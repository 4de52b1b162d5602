/**
 * The idle rule and the limit rule on invented hours (src/lib/analytics/unit-rules.ts). Figures are
 * worked by hand beside each check; the site's clock is checked against the UK's published 2025
 * clock changes (GMT to BST at 01:00 UTC on 30 March 2025, back at 01:00 UTC on 26 October 2025:
 * The Summer Time Order 2002, last Sunday of March and of October).
 */
import { describe, expect, it } from 'vitest';
import { crossedLimits, idleRuns, inIdleTime, limitRuns, limitText, localDayHour, type RuleHour, type RuleHourState } from '~/lib/analytics/unit-rules';
import { NormallyIdleSchema, normallyIdleText, type NormallyIdle } from '~/lib/plant/idle';
import { expectClose } from '../support/expect-close';
import { THIN_SPACE, localeStyle } from '~/lib/format';

const H = 3_600_000;
const T0 = Date.UTC(2025, 0, 6, 0); // Monday 2025-01-06 00:00 UTC = 00:00 GMT in London

/** Consecutive hours from `startMs` with the given states (and optional figures per hour). */
function hours(states: string, startMs = T0, fig: (i: number) => Partial<RuleHour> = () => ({})): RuleHour[] {
  const map: Record<string, RuleHourState> = { S: 'steady', U: 'unsettled', I: 'idle', X: 'suspect' };
  return [...states].map((c, i) => ({
    hourStartMs: startMs + i * H,
    state: map[c]!,
    destruction_W: c === 'S' || c === 'U' ? 100_000 : null,
    destructionCost_per_h: c === 'S' || c === 'U' ? 5 : null,
    efficiency: null,
    ...fig(i),
  }));
}

const always = (extra: Partial<NormallyIdle> = {}): NormallyIdle => NormallyIdleSchema.parse({ when: 'always', ...extra });

describe('the idle rule', () => {
  it('opens on the fourth running hour in a row (more than 3 by default), not on three', () => {
    expect(idleRuns(hours('IISSSII'), always(), 'UTC')).toEqual([]);
    const [run, ...rest] = idleRuns(hours('IISSSSI'), always(), 'UTC');
    expect(rest).toEqual([]);
    expect(run!.fromMs).toBe(T0 + 2 * H);
    expect(run!.lastMs).toBe(T0 + 5 * H);
    expect(run!.hours).toBe(4);
    expect(run!.signalMs).toBe(T0 + 5 * H); // hours 2, 3, 4 are three; hour 5 is the fourth
  });

  it('counts unsettled hours as running; an idle, suspect or missing hour ends the run', () => {
    expect(idleRuns(hours('SUSU'), always(), 'UTC')).toHaveLength(1);
    expect(idleRuns(hours('SSXSS'), always(), 'UTC')).toEqual([]);
    expect(idleRuns(hours('SSISS'), always(), 'UTC')).toEqual([]);
    const gap = hours('SSSSSS').filter((h) => h.hourStartMs !== T0 + 3 * H); // the fourth hour has no row
    expect(idleRuns(gap, always(), 'UTC')).toEqual([]);
  });

  it('takes its hours from the declaration (settable per unit)', () => {
    expect(idleRuns(hours('SSSSSS'), always({ hours: 6 }), 'UTC')).toEqual([]);
    expect(idleRuns(hours('SSSSSSS'), always({ hours: 6 }), 'UTC')[0]!.signalMs).toBe(T0 + 6 * H);
    expect(idleRuns(hours('SS'), always({ hours: 1 }), 'UTC')[0]!.signalMs).toBe(T0 + 1 * H);
  });

  it('states the run by its mean destruction and cost per day, worked by hand', () => {
    // destruction 100, 200, 300, 400 kW -> mean 250 kW; cost 4, 6, 8, 10 per hour -> mean 7 -> 168 per day
    const hs = hours('SSSS', T0, (i) => ({ destruction_W: (i + 1) * 100_000, destructionCost_per_h: 4 + 2 * i }));
    const [run] = idleRuns(hs, always(), 'UTC');
    expectClose(run!.meanDestruction_W!, 250_000, { rtol: 1e-12 });
    expectClose(run!.cost_per_day!, 168, { rtol: 1e-12 });
    // hours without a cost leave the cost unknown, not zero
    const [bare] = idleRuns(hours('SSSS', T0, () => ({ destructionCost_per_h: null })), always(), 'UTC');
    expect(bare!.cost_per_day).toBeNull();
  });

  it('finds each long run of a series on its own', () => {
    const runs = idleRuns(hours('SSSSIISSISSSSS'), always(), 'UTC');
    expect(runs.map((r) => [r.fromMs - T0, r.hours])).toEqual([
      [0, 4],
      [9 * H, 5],
    ]);
  });

  it('applies only while the named units run (a bypass while its turbine runs)', () => {
    const decl = always({ whileRunning: ['TG1'] });
    const tgStopped = new Set([T0 + 2 * H]);
    // the valve runs for 6 hours; the turbine is stopped in the third: the longest run is 3 hours
    expect(idleRuns(hours('SSSSSS'), decl, 'UTC', (ms) => !tgStopped.has(ms))).toEqual([]);
    expect(idleRuns(hours('SSSSSS'), decl, 'UTC', () => true)).toHaveLength(1);
    // without names the rule does not ask
    expect(idleRuns(hours('SSSS'), always(), 'UTC', () => false)).toHaveLength(1);
  });
});

describe("the idle time in the site's clock", () => {
  const nights = NormallyIdleSchema.parse({ when: [{ days: ['mon', 'tue', 'wed', 'thu', 'fri'], from: '22:00', to: '06:00' }, { days: ['sun'] }] });

  it('reads day and hour in the site zone across the 2025 clock changes (UK Summer Time Order 2002)', () => {
    expect(localDayHour(Date.UTC(2025, 0, 6, 22), 'Europe/London')).toEqual({ day: 'mon', hour: 22 }); // GMT
    expect(localDayHour(Date.UTC(2025, 6, 7, 21), 'Europe/London')).toEqual({ day: 'mon', hour: 22 }); // BST = UTC+1
    expect(localDayHour(Date.UTC(2025, 2, 30, 0), 'Europe/London')).toEqual({ day: 'sun', hour: 0 });
    expect(localDayHour(Date.UTC(2025, 2, 30, 1), 'Europe/London')).toEqual({ day: 'sun', hour: 2 }); // 01:00 local skipped
  });

  it('windows run over midnight and name their days; a window without days is every day', () => {
    const at = (y: number, m: number, d: number, h: number) => inIdleTime(nights, Date.UTC(y, m - 1, d, h), 'Europe/London');
    expect(at(2025, 7, 7, 21)).toBe(true); // Mon 22:00 BST
    expect(at(2025, 7, 7, 20)).toBe(false); // Mon 21:00 BST
    expect(at(2025, 7, 8, 4)).toBe(true); // Tue 05:00 BST, from Monday's window
    expect(at(2025, 7, 8, 5)).toBe(false); // Tue 06:00 BST
    expect(at(2025, 7, 12, 1)).toBe(true); // Sat 02:00 BST, from Friday's window
    expect(at(2025, 7, 12, 12)).toBe(false); // Sat 13:00
    expect(at(2025, 7, 13, 12)).toBe(true); // Sun all day
    expect(at(2025, 7, 14, 1)).toBe(false); // Mon 02:00: Sunday's window ends at 24:00
    const daily = NormallyIdleSchema.parse({ when: [{ from: '12:00', to: '13:00' }] });
    expect(inIdleTime(daily, Date.UTC(2025, 0, 8, 12), 'UTC')).toBe(true);
    expect(inIdleTime(daily, Date.UTC(2025, 0, 8, 13), 'UTC')).toBe(false);
  });

  it('a run outside the idle time raises nothing; inside it does', () => {
    // Monday 2025-01-06 (GMT): running 18:00 to 01:00 next day: 22, 23, 00 are inside: 3 hours, not more
    const evening = hours('SSSSSSS', Date.UTC(2025, 0, 6, 18));
    expect(idleRuns(evening, nights, 'Europe/London')).toEqual([]);
    const [run] = idleRuns(hours('SSSSSSSS', Date.UTC(2025, 0, 6, 18)), nights, 'Europe/London');
    expect(run!.fromMs).toBe(Date.UTC(2025, 0, 6, 22));
    expect(run!.hours).toBe(4);
  });

  it('says the declaration in words', () => {
    expect(normallyIdleText(nights)).toBe('Mon-Fri 22:00-06:00; Sun 00:00-24:00');
    expect(normallyIdleText(always({ whileRunning: ['TG1'] }))).toBe('always, while TG1 runs');
  });

  it('refuses a window that is not a whole hour, and an unknown day', () => {
    expect(NormallyIdleSchema.safeParse({ when: [{ from: '22:30' }] }).success).toBe(false);
    expect(NormallyIdleSchema.safeParse({ when: [{ days: ['monday'] }] }).success).toBe(false);
    expect(NormallyIdleSchema.safeParse({ when: 'sometimes' }).success).toBe(false);
    expect(NormallyIdleSchema.safeParse({ when: 'always', hours: 0 }).success).toBe(false);
  });
});

describe('the limit rule', () => {
  it('cost: a running hour whose cost times 24 is above the limit crosses it', () => {
    // 20 per hour = 480 per day > 400; 16 per hour = 384 per day <= 400
    const h = (state: RuleHourState, c: number): RuleHour => ({ hourStartMs: T0, state, destruction_W: 1, destructionCost_per_h: c, efficiency: 0.9 });
    expect(crossedLimits(h('steady', 20), { maxCost_per_day: 400 })).toEqual(['cost']);
    expect(crossedLimits(h('unsettled', 20), { maxCost_per_day: 400 })).toEqual(['cost']);
    expect(crossedLimits(h('steady', 16), { maxCost_per_day: 400 })).toEqual([]);
    expect(crossedLimits(h('idle', 20), { maxCost_per_day: 400 })).toEqual([]);
  });

  it('efficiency: only a steady hour below the limit crosses it', () => {
    const h = (state: RuleHourState, e: number): RuleHour => ({ hourStartMs: T0, state, destruction_W: 1, destructionCost_per_h: 1, efficiency: e });
    expect(crossedLimits(h('steady', 0.75), { minEfficiency: 0.8 })).toEqual(['efficiency']);
    expect(crossedLimits(h('steady', 0.8), { minEfficiency: 0.8 })).toEqual([]);
    expect(crossedLimits(h('unsettled', 0.5), { minEfficiency: 0.8 })).toEqual([]);
  });

  it('opens after more than the set hours, says which limits were crossed and the mean efficiency', () => {
    // efficiency 0.70, 0.72, 0.74, 0.76 (all below 0.8) -> mean 0.73; the cost limit is crossed in hours 2 and 3 only
    const hs = hours('SSSS', T0, (i) => ({ efficiency: 0.7 + 0.02 * i, destructionCost_per_h: i >= 2 ? 30 : 10 }));
    const [run] = limitRuns(hs, { minEfficiency: 0.8, maxCost_per_day: 500 });
    expect(run!.hours).toBe(4);
    expect(run!.crossed).toEqual(['cost', 'efficiency']);
    expectClose(run!.meanEfficiency!, 0.73, { rtol: 1e-12 });
    expectClose(run!.cost_per_day!, 20 * 24, { rtol: 1e-12 }); // mean of 10, 10, 30, 30 per hour
    expect(limitRuns(hs, { minEfficiency: 0.8, hours: 4 })).toEqual([]);
    expect(limitRuns(hs, {})).toEqual([]);
  });
});

describe('the words of a crossed limit', () => {
  it('the limit as set, through the one formatter: no trailing zeros, grouped in the style given (CLDR en-GB: comma)', () => {
    expect(limitText('cost', { maxCost_per_day: 1500 }, 'EUR')).toBe(`cost of destruction above EUR 1${THIN_SPACE}500 per day`);
    expect(limitText('cost', { maxCost_per_day: 1500.5 }, 'GBP', localeStyle('en-GB'))).toBe('cost of destruction above GBP 1,500.5 per day');
    expect(limitText('cost', { maxCost_per_day: 99.999 }, 'EUR')).toBe('cost of destruction above EUR 100 per day');
    expect(limitText('efficiency', { minEfficiency: 0.625 }, 'EUR')).toBe('exergy efficiency below 62.5 %');
    expect(limitText('efficiency', { minEfficiency: 0.7 }, 'EUR', localeStyle('de-DE'))).toBe('exergy efficiency below 70 %');
    expect(limitText('efficiency', { minEfficiency: 0.7251 }, 'EUR', localeStyle('de-DE'))).toBe('exergy efficiency below 72,5 %');
  });
});
