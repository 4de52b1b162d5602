import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import { at, cell } from '../support/present';
import { monteCarlo, propagate } from '~/lib/analytics/uncertainty';
import { createRng } from '~/lib/analytics/rng';
import distributions from '../fixtures/distributions-reference.json';

describe('propagate (first order, central differences)', () => {
  it('JCGM 100:2008 4.1.1 (form of the model P = V^2/R; numbers invented, worked by hand)', () => {
    // P = V^2 / R with V = 230 V, u(V) = 0.5 V; R = 50 ohm, u(R) = 0.1 ohm, uncorrelated.
    //   P   = 52900 / 50                   = 1058 W
    //   c_V = dP/dV = 2V/R = 460/50         = 9.2 W/V     -> c_V u(V) = 4.6 W
    //   c_R = dP/dR = -V^2/R^2 = -52900/2500 = -21.16 W/ohm -> |c_R| u(R) = 2.116 W
    //   u(P) = sqrt(4.6^2 + 2.116^2) = sqrt(21.16 + 4.477456) = sqrt(25.637456) (GUM eq. 10)
    const res = propagate((x) => [(at(x, 0) * at(x, 0)) / at(x, 1)], [230, 50], [0.5, 0.1]);
    expectClose(at(res.y, 0), 1058, { rtol: 1e-14 });
    expectClose(cell(res.sensitivity, 0, 0), 9.2, { rtol: 1e-8 });
    expectClose(cell(res.sensitivity, 0, 1), -21.16, { rtol: 1e-8 });
    expectClose(cell(res.contributions, 0, 0), 4.6, { rtol: 1e-8 });
    expectClose(cell(res.contributions, 0, 1), 2.116, { rtol: 1e-8 });
    expectClose(at(res.u, 0), Math.sqrt(25.637456), { rtol: 1e-8 });
    expectClose(at(res.U, 0), 2 * Math.sqrt(25.637456), { rtol: 1e-8 });
    expectClose(cell(res.varianceShare, 0, 0), 21.16 / 25.637456, { rtol: 1e-7 });
    expect(res.k).toBe(2);
  });

  it('JCGM 100:2008 5.1.6 eq. 12: relative uncertainties of a product/quotient add in quadrature', () => {
    // y = x1 x2 / x3 with relative u 1 %, 2 %, 2 %: u(y)/y = sqrt(1 + 4 + 4) % = 3 %.
    const x0 = [4, 5, 10];
    const res = propagate((x) => (at(x, 0) * at(x, 1)) / at(x, 2), x0, [0.04, 0.1, 0.2]);
    expectClose(at(res.y, 0), 2, { rtol: 1e-14 });
    expectClose(at(res.u, 0) / at(res.y, 0), 0.03, { rtol: 1e-8 });
  });

  it('JCGM 100:2008 5.2.2 Note 1: fully correlated inputs of a sum add linearly', () => {
    // y = x1 + x2, u1 = 0.3, u2 = 0.4: r = 0 gives 0.5, r = 1 gives 0.7 (worked by hand).
    const f = (x: Float64Array) => [at(x, 0) + at(x, 1)];
    expectClose(at(propagate(f, [1, 2], [0.3, 0.4]).u, 0), 0.5, { rtol: 1e-9 });
    expectClose(at(propagate(f, [1, 2], [0.3, 0.4], { correlation: [[1, 1], [1, 1]] }).u, 0), 0.7, { rtol: 1e-9 });
  });

  it('self-consistency: several outputs, an input with zero uncertainty contributes nothing', () => {
    const res = propagate((x) => [at(x, 0) * 3, at(x, 0) + at(x, 1)], [2, 7], [0.1, 0], { k: 3 });
    expectClose(at(res.u, 0), 0.3, { rtol: 1e-9 });
    expectClose(at(res.u, 1), 0.1, { rtol: 1e-9 });
    expectClose(at(res.U, 0), 0.9, { rtol: 1e-9 });
    expect(cell(res.contributions, 1, 1)).toBe(0);
  });

  it('refuses mismatched or negative uncertainties', () => {
    expect(() => propagate((x) => at(x, 0), [1, 2], [0.1])).toThrow(/2 inputs but u has 1/);
    expect(() => propagate((x) => at(x, 0), [1], [-0.1])).toThrow(/u\[0\]/);
  });
});

describe('monteCarlo (JCGM 101:2008) against first-order propagation', () => {
  it('self-consistency: a linear model gives the analytic standard uncertainty (within sampling error)', () => {
    // y = 3 x1 - 2 x2, u = (0.1, 0.2): u(y) = sqrt(0.09 + 0.16) = 0.5. With M = 2e5 the relative
    // standard error of a standard deviation is about 1/sqrt(2M) = 0.16 %, so 1 % is a wide margin.
    const mc = monteCarlo((x) => 3 * at(x, 0) - 2 * at(x, 1), [1, 1], [0.1, 0.2], { trials: 200_000, seed: 7 });
    expectClose(at(mc.mean, 0), 1, { atol: 0.005 });
    expectClose(at(mc.u, 0), 0.5, { rtol: 0.01 });
    // normal output: the 95 % interval is mean +- z_0.975 u (JCGM 101:2008 7.7; z from scipy,
    // scripts/distributions-reference.py). The 2.5 % and 97.5 % order statistics of 2e5 normal draws
    // have a standard error of about 0.2 % of the interval's width, so 2 % is a wide margin.
    const z975 = distributions.normalQuantiles.find((q) => q.p === 0.975)!.z;
    expectClose(at(mc.high, 0) - at(mc.low, 0), 2 * z975 * 0.5, { rtol: 0.02 });
  });

  it('JCGM 101:2008 vs JCGM 100:2008: a moderately nonlinear model agrees within 10 %', () => {
    // y = exp(x1) x2^2 / x3, relative uncertainties 5 %..8 %: first-order is an approximation.
    const f = (x: Float64Array) => (Math.exp(at(x, 0)) * at(x, 1) * at(x, 1)) / at(x, 2);
    const x0 = [0.5, 2, 3];
    const u = [0.05, 0.1, 0.24];
    const lin = propagate(f, x0, u);
    const mc = monteCarlo(f, x0, u, { trials: 200_000, seed: 42 });
    expectClose(at(mc.u, 0), at(lin.u, 0), { rtol: 0.1 });
    // and they are not identical: the nonlinearity shows (a test that would pass for a linear model only
    // if the two methods were the same code path)
    expect(Math.abs(at(mc.u, 0) - at(lin.u, 0)) / at(lin.u, 0)).toBeGreaterThan(1e-4);
  });

  it('self-consistency: the same seed reproduces a run exactly; another seed does not', () => {
    const f = (x: Float64Array) => at(x, 0) * at(x, 1);
    const a = monteCarlo(f, [1, 2], [0.1, 0.1], { trials: 1000, seed: 3 });
    const b = monteCarlo(f, [1, 2], [0.1, 0.1], { trials: 1000, seed: 3 });
    const c = monteCarlo(f, [1, 2], [0.1, 0.1], { trials: 1000, seed: 4 });
    expect(at(a.u, 0)).toBe(at(b.u, 0));
    expect(at(a.u, 0)).not.toBe(at(c.u, 0));
  });

  it('self-consistency: the generator gives uniforms on [0,1) and normals with mean 0, sd 1', () => {
    const rng = createRng(2024);
    const N = 100_000;
    let s = 0;
    let ss = 0;
    let umin = 1;
    let umax = 0;
    for (let i = 0; i < N; i++) {
      const u = rng.uniform();
      umin = Math.min(umin, u);
      umax = Math.max(umax, u);
      const z = rng.normal();
      s += z;
      ss += z * z;
    }
    expect(umin).toBeGreaterThanOrEqual(0);
    expect(umax).toBeLessThan(1);
    // standard error of the mean 1/sqrt(N) = 0.0032; of the variance sqrt(2/N) = 0.0045
    expectClose(s / N, 0, { atol: 0.015 });
    expectClose(ss / N, 1, { rtol: 0.02 });
  });
});
