import { describe, expect, it } from 'vitest';
import { at } from '../support/present';
import { aboveLimit, classifyHour, distinctFigures, resolvableSpread, STEADY_DEFAULTS, type SteadyLimits, type TagHourStats } from '~/lib/analytics/steady';

// Invented tag hours of a steam turbine: power (kW), steam flow (kg/s), inlet temperature (K).
function hour(mean: number, stdDev: number, extra: Partial<TagHourStats> = {}): TagHourStats {
  return {
    mean,
    stdDev,
    min: mean - 2 * stdDev,
    max: mean + 2 * stdDev,
    sampleCount: 360,
    coveredFraction: 1,
    flatline: false,
    outOfRangeCount: 0,
    nonNumericCount: 0,
    ...extra,
  };
}

const limits: SteadyLimits = {
  loadTag: 'power',
  minLoad: 2000,
  spread: { T_in: { maxStd: 3 } },
};

const good = () => ({
  power: hour(8000, 80),
  steam: hour(10, 0.2),
  T_in: hour(753, 1.5),
});

describe('classifyHour (common practice defaults, docs/domain.md section 6)', () => {
  it('all key tags sound, above minimum load, small spread: steady with no reasons', () => {
    expect(classifyHour({ tags: good() }, limits)).toEqual({ state: 'steady', reasons: [] });
  });

  it('a missing key tag makes the hour suspect', () => {
    const tags = { ...good(), steam: null };
    const r = classifyHour({ tags }, limits);
    expect(r.state).toBe('suspect');
    expect(r.reasons).toMatchObject([{ code: 'TAG_MISSING', tag: 'steam' }]);
    // a key tag named in limits but absent from the input is missing too
    expect(classifyHour({ tags: good() }, { ...limits, keyTags: ['steam', 'drum_level'] }).reasons[0]).toMatchObject({
      code: 'TAG_MISSING',
      tag: 'drum_level',
    });
  });

  it('frozen, out-of-range, poorly covered and status-word tags are each suspect', () => {
    const cases: [Partial<TagHourStats>, string][] = [
      [{ flatline: true }, 'TAG_FROZEN'],
      [{ outOfRangeCount: 3 }, 'TAG_OUT_OF_RANGE'],
      [{ coveredFraction: 0.5 }, 'TAG_POOR_COVERAGE'],
      [{ sampleCount: 1 }, 'TAG_POOR_COVERAGE'],
      [{ nonNumericCount: 60, sampleCount: 300 }, 'TAG_STATUS_WORDS'], // 60/360 = 17 % > 10 %
    ];
    for (const [extra, code] of cases) {
      const r = classifyHour({ tags: { ...good(), steam: hour(10, 0.2, extra) } }, limits);
      expect(r.state, code).toBe('suspect');
      expect(r.reasons.map((x) => x.code)).toContain(code);
    }
    // a few status words (5/365 = 1.4 %) are tolerated
    expect(classifyHour({ tags: { ...good(), steam: hour(10, 0.2, { nonNumericCount: 5 }) } }, limits).state).toBe('steady');
  });

  it('a balance that does not close is suspect; within tolerance it is not', () => {
    expect(classifyHour({ tags: good(), balances: [{ name: 'mass', residual: 0.08 }] }, limits)).toMatchObject({
      state: 'suspect',
      reasons: [{ code: 'BALANCE_NOT_CLOSED', balance: 'mass', value: 0.08, limit: STEADY_DEFAULTS.maxBalanceResidual }],
    });
    expect(classifyHour({ tags: good(), balances: [{ name: 'mass', residual: -0.02 }] }, limits).state).toBe('steady');
    expect(classifyHour({ tags: good(), balances: [{ name: 'mass', residual: 0.02, tolerance: 0.01 }] }, limits).state).toBe('suspect');
    expect(classifyHour({ tags: good(), balances: [{ name: 'mass', residual: NaN }] }, limits).state).toBe('suspect');
  });

  it('below minimum load is idle', () => {
    const r = classifyHour({ tags: { ...good(), power: hour(1500, 10) } }, limits);
    expect(r).toMatchObject({ state: 'idle', reasons: [{ code: 'BELOW_MIN_LOAD', value: 1500, limit: 2000 }] });
  });

  it('spread above the relative or absolute limit is unsettled', () => {
    // steam: 0.8/10 = 8 % > default 5 %
    expect(classifyHour({ tags: { ...good(), steam: hour(10, 0.8) } }, limits)).toMatchObject({
      state: 'unsettled',
      reasons: [{ code: 'SPREAD_HIGH', tag: 'steam' }],
    });
    // T_in has an absolute limit of 3 K: 4 K is too much even though 4/753 = 0.5 % is a small relative spread
    expect(classifyHour({ tags: { ...good(), T_in: hour(753, 4) } }, limits)).toMatchObject({
      state: 'unsettled',
      reasons: [{ code: 'SPREAD_HIGH', tag: 'T_in', value: 4, limit: 3 }],
    });
    // a per-tag relative limit overrides the default
    expect(classifyHour({ tags: { ...good(), steam: hour(10, 0.8) } }, { ...limits, spread: { steam: { maxRelSpread: 0.1 } } }).state).toBe(
      'steady',
    );
  });

  it('precedence: suspect > idle > unsettled, with every reason kept, most severe first', () => {
    const tags = { power: hour(1500, 400), steam: hour(10, 0.2, { flatline: true }), T_in: hour(753, 1) };
    const r = classifyHour({ tags }, limits);
    expect(r.state).toBe('suspect');
    expect(r.reasons.map((x) => x.code)).toEqual(['TAG_FROZEN', 'BELOW_MIN_LOAD', 'SPREAD_HIGH']);
    const idleAndSwinging = classifyHour({ tags: { ...good(), power: hour(1500, 400) } }, limits);
    expect(idleAndSwinging.state).toBe('idle');
    expect(idleAndSwinging.reasons.map((x) => x.code)).toEqual(['BELOW_MIN_LOAD', 'SPREAD_HIGH']);
  });

  it('a suspect load tag gives no idle verdict (the load itself is not trusted)', () => {
    const r = classifyHour({ tags: { ...good(), power: hour(0, 0, { flatline: true }) } }, limits);
    expect(r.state).toBe('suspect');
    expect(r.reasons.map((x) => x.code)).toEqual(['TAG_FROZEN']);
  });

  // Invented hours of a let-down valve's steam flow meter: 2 % of reading, range -1 to 30 t/h (span 31 t/h),
  // in t/h. Its flow is low (about 1 t/h) while it passes steam; the meter's noise does not shrink with it.
  describe('the spread limit never goes below what the instrument resolves (U = 2 u)', () => {
    const meter = { uRel: 0.02, span: 31 };
    const valve: SteadyLimits = { loadTag: 'flow', minLoad: 0.1, spread: { flow: { maxRelSpread: 0.05, instrument: meter } } };
    it('near the bottom of its range a flow meter resolves 2 x 2 % of a tenth of its span: 0.124 t/h', () => {
      expect(resolvableSpread(1, meter)).toBeCloseTo(2 * 0.02 * 3.1, 12);
      // above a tenth of the span, 2 % of the reading itself
      expect(resolvableSpread(20, meter)).toBeCloseTo(2 * 0.02 * 20, 12);
      expect(resolvableSpread(20, undefined)).toBe(0);
    });

    it('a low flow swinging 0.06 t/h (6 % of its mean) is steady; by the percentage alone it was unsettled', () => {
      expect(classifyHour({ tags: { flow: hour(1, 0.06) } }, valve)).toEqual({ state: 'steady', reasons: [] });
      const byPercentOnly = classifyHour({ tags: { flow: hour(1, 0.06) } }, { ...valve, spread: { flow: { maxRelSpread: 0.05 } } });
      expect(byPercentOnly.state).toBe('unsettled');
      // 0.2 t/h is more than the meter's 0.124: unsettled, and the reason names both parts of the limit
      const swinging = classifyHour({ tags: { flow: hour(1, 0.2) } }, valve);
      expect(swinging).toMatchObject({ state: 'unsettled', reasons: [{ code: 'SPREAD_HIGH', tag: 'flow' }] });
      expect(at(swinging.reasons, 0, 'reasons').limit).toBeCloseTo(0.124, 12);
      expect(at(swinging.reasons, 0, 'reasons').message).toMatch(/5\.0 % of the mean; what the instrument resolves: 0\.124/);
    });

    it('mid-range the percentage rules: 6 % of 20 t/h is unsettled (the meter resolves 4 %)', () => {
      const r = classifyHour({ tags: { flow: hour(20, 1.2) } }, valve);
      expect(r).toMatchObject({ state: 'unsettled', reasons: [{ code: 'SPREAD_HIGH', tag: 'flow', limit: 0.05 }] });
    });

    it('a spread exactly at the limit counts as settled, and the reason text says so', () => {
      // absolute uncertainty 0.125, so the floor is exactly 0.25 (binary fractions, no rounding)
      const lim: SteadyLimits = { loadTag: 'flow', minLoad: 0.1, spread: { flow: { maxRelSpread: 0.05, instrument: { uAbs: 0.125 } } } };
      expect(classifyHour({ tags: { flow: hour(2, 0.25) } }, lim).state).toBe('steady');
      const over = classifyHour({ tags: { flow: hour(2, 0.25 + 1e-9) } }, lim);
      expect(over.state).toBe('unsettled');
      expect(at(over.reasons, 0, 'reasons').message).toMatch(/a spread at the limit counts as settled/);
      // the same for an absolute limit (O2 style): 0.02 set, instrument 2 x 0.0125 = 0.025
      const o2: SteadyLimits = { loadTag: 'flow', minLoad: 0.1, spread: { flow: { maxRelSpread: 1 }, O2: { maxStd: 0.02, instrument: { uAbs: 0.0125 } } } };
      expect(classifyHour({ tags: { flow: hour(2, 0), O2: hour(0.03, 0.025) } }, o2).state).toBe('steady');
      expect(classifyHour({ tags: { flow: hour(2, 0), O2: hour(0.03, 0.0251) } }, o2)).toMatchObject({ state: 'unsettled', reasons: [{ code: 'SPREAD_HIGH', tag: 'O2', limit: 0.025 }] });
    });
  });

  describe('a value at its limit is inside; the words of a value above it never read as equal', () => {
    // self-consistency: the rule of src/lib/analytics/steady.ts aboveLimit, at its boundary
    const lim: SteadyLimits = { loadTag: 'flow', minLoad: 0.1, spread: { flow: { maxRelSpread: 0.05 } } };
    it('exactly 5 % of the mean against a 5 % limit is settled, also with floating-point noise', () => {
      expect(classifyHour({ tags: { flow: hour(100, 5) } }, lim).state).toBe('steady');
      expect(aboveLimit(0.05 * (1 + 1e-12), 0.05)).toBe(false);
      expect(aboveLimit(0.05 * (1 + 1e-6), 0.05)).toBe(true);
    });
    it('5.004 % against 5 % is unsettled, and the text shows the two apart', () => {
      const r = classifyHour({ tags: { flow: hour(100, 5.004) } }, lim);
      expect(r.state).toBe('unsettled');
      expect(at(r.reasons, 0, 'reasons').message).toMatch(/spread 5\.004 % of the mean, above its limit 5\.000 %/);
      expect(at(r.reasons, 0, 'reasons').message).not.toMatch(/spread 5\.0 % of the mean, above its limit 5\.0 %/);
    });
    it('absolute limits follow the same rule and words', () => {
      const o2: SteadyLimits = { loadTag: 'flow', minLoad: 0.1, spread: { flow: { maxRelSpread: 1 }, O2: { maxStd: 0.02 } } };
      expect(classifyHour({ tags: { flow: hour(2, 0), O2: hour(0.03, 0.02) } }, o2).state).toBe('steady');
      const over = classifyHour({ tags: { flow: hour(2, 0), O2: hour(0.03, 0.020001) } }, o2);
      expect(over.state).toBe('unsettled');
      expect(at(over.reasons, 0, 'reasons').message).toMatch(/spread 0\.020001 within the hour, above its limit 0\.02 /);
      expect(distinctFigures(5.04, 5)).toEqual(['5.04', '5.00']);
    });
  });
});
