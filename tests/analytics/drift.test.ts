import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import { at } from '../support/present';
import { cusumInit, cusumRun, cusumStep } from '~/lib/analytics/drift';

// From memory: Montgomery ISQC 6th ed. Example 9.1 (and Table 9.1): 30 observations, the first 20
// from N(10, 1), the last 10 from N(11, 1); mu0 = 10, sigma = 1, k = 0.5, h = 5.
const MONTGOMERY_9_1 = [
  9.45, 7.99, 9.29, 11.66, 12.16, 10.18, 8.04, 11.46, 9.2, 10.34, 9.03, 11.47, 10.51, 9.4, 10.08, 9.37, 10.62, 10.31,
  8.52, 10.84, 10.9, 9.33, 12.29, 11.5, 10.6, 11.08, 10.38, 11.62, 11.31, 10.52,
];
const SRC_9_1 = 'from memory: Montgomery ISQC 6th ed. Example 9.1';

describe('tabular CUSUM', () => {
  it(`${SRC_9_1}: first signal at observation 29, C+ = 5.28, N+ = 7, shift after 22, mean 11.25`, () => {
    const run = cusumRun(MONTGOMERY_9_1, { mu0: 10, sigma: 1, k: 0.5, h: 5 });
    expect(run.signals).toHaveLength(1);
    const s = at(run.signals, 0, 'signals');
    expect(s.direction).toBe('up');
    expect(s.step).toBe(29);
    expect(s.onsetStep).toBe(23); // the process shifted after period 22
    expectClose(at(run.points, 28, 'points').cPlus, 5.28, { atol: 0.005 }); // printed to 2 decimals
    expect(at(run.points, 28, 'points').nPlus).toBe(7);
    expectClose(s.shiftedMean, 11.25, { atol: 0.005 }); // 10 + 0.5 + 5.28/7
    expectClose(s.shift_sigma, 1.25, { atol: 0.005 });
    // the lower side never comes near H
    expect(Math.max(...run.points.map((p) => p.cMinus))).toBeLessThan(2);
  });

  it(`${SRC_9_1} mirrored about mu0: the lower CUSUM signals at 29 with mean 8.75 (self-consistency)`, () => {
    const run = cusumRun(
      MONTGOMERY_9_1.map((x) => 20 - x),
      { mu0: 10, sigma: 1 },
    );
    expect(run.signals.map((s) => [s.direction, s.step, s.onsetStep])).toEqual([['down', 29, 23]]);
    expectClose(at(run.signals, 0, 'signals').shiftedMean, 8.75, { atol: 0.005 });
  });

  it('hand-worked normalised residuals, k = 0.5, h = 4: every C+ value', () => {
    // x:   0     1     2     3     2.5   2
    // C+1 = max(0, 0   - 0.5 + 0  ) = 0      N+ = 0
    // C+2 = max(0, 1   - 0.5 + 0  ) = 0.5    N+ = 1
    // C+3 = max(0, 2   - 0.5 + 0.5) = 2.0    N+ = 2
    // C+4 = max(0, 3   - 0.5 + 2.0) = 4.5    N+ = 3  > h = 4: signal; onset 4 - 3 + 1 = 2; shift 0.5 + 4.5/3 = 2.0
    // C+5 = max(0, 2.5 - 0.5 + 4.5) = 6.5    N+ = 4  (still above h: no new signal)
    // C+6 = max(0, 2   - 0.5 + 6.5) = 8.0    N+ = 5
    // C- stays 0: every -x - 0.5 is negative.
    const run = cusumRun([0, 1, 2, 3, 2.5, 2], { k: 0.5, h: 4 });
    expect(run.points.map((p) => p.cPlus)).toEqual([0, 0.5, 2, 4.5, 6.5, 8]);
    expect(run.points.map((p) => p.nPlus)).toEqual([0, 1, 2, 3, 4, 5]);
    expect(run.points.map((p) => p.cMinus)).toEqual([0, 0, 0, 0, 0, 0]);
    expect(run.signals).toEqual([{ direction: 'up', step: 4, onsetStep: 2, shiftedMean: 2, shift_sigma: 2 }]);
  });

  it('self-consistency: streaming in two parts through a saved JSON state equals one run', () => {
    const whole = cusumRun(MONTGOMERY_9_1, { mu0: 10 });
    const first = cusumRun(MONTGOMERY_9_1.slice(0, 17), { mu0: 10 });
    const saved = JSON.parse(JSON.stringify(first.state));
    const second = cusumRun(MONTGOMERY_9_1.slice(17), { mu0: 10 }, saved);
    expect([...first.points, ...second.points]).toEqual(whole.points);
    expect(second.state).toEqual(whole.state);
  });

  it('self-consistency: a non-steady hour (NaN) is counted but leaves C unchanged; reset after a signal', () => {
    const a = cusumStep(cusumInit(), 2);
    const b = cusumStep(a.state, NaN);
    expect(b.point.skipped).toBe(true);
    expect(b.state).toEqual({ ...a.state, step: 2 });
    const r = cusumRun([3, 3, 3], { h: 4, resetOnSignal: true });
    // C+ = 2.5, 5.0 (signal, then reset), 2.5
    expect(r.points.map((p) => p.cPlus)).toEqual([2.5, 5, 2.5]);
    expect(r.state.cPlus).toBe(2.5);
    expect(() => cusumStep(cusumInit(), 1, { h: 0 })).toThrow(/h > 0/);
  });
});

describe('tabular CUSUM with a minimum run length', () => {
  // Hand-worked, k = 0.5, h = 5 (self-consistency with C+_i = max(0, x_i - k + C+_(i-1))):
  //   x = 0, 8, 0, 0, 0  ->  C+ = 0, 7.5, 7.0, 6.5, 6.0 ; N+ = 0, 1, 2, 3, 4
  //   plain CUSUM signals at step 2 (C+ 7.5 > 5 with N+ = 1);
  //   with minRunLength 3 the shift must have lasted 3 steps: the signal comes at step 4, onset step 2.
  it('self-consistency: a crossing counts once the run has lasted minRunLength steps', () => {
    const xs = [0, 8, 0, 0, 0];
    const plain = cusumRun(xs, { k: 0.5, h: 5 });
    expect(plain.signals.map((s) => [s.step, s.onsetStep])).toEqual([[2, 2]]);
    const sustained = cusumRun(xs, { k: 0.5, h: 5, minRunLength: 3 });
    expect(sustained.signals.map((s) => [s.step, s.onsetStep, s.direction])).toEqual([[4, 2, 'up']]);
    expectClose(sustained.points[3]!.cPlus, 6.5, { rtol: 1e-12 });
  });

  // x = 8, -3, 0, 0  ->  C+ = 7.5, 4.0, 3.5, 3.0 (N+ = 1, 2, 3, 4): over h only at step 1, so with
  // minRunLength 3 the one outlying hour never signals; the plain CUSUM signals at step 1.
  it('self-consistency: one outlying observation that does not last never signals', () => {
    const xs = [8, -3, 0, 0];
    expect(cusumRun(xs, { k: 0.5, h: 5 }).signals.length).toBe(1);
    expect(cusumRun(xs, { k: 0.5, h: 5, minRunLength: 3 }).signals).toEqual([]);
  });

  it('refuses a minimum run length that is not a whole number of at least 1', () => {
    expect(() => cusumStep(cusumInit(), 1, { minRunLength: 0 })).toThrow(/minRunLength/);
  });
});
