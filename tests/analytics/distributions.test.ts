import { describe, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import { coverageFactor, incompleteBeta, lnGamma, studentTCdf, studentTQuantile } from '~/lib/analytics/distributions';

describe('special functions for coverage factors', () => {
  it('self-consistency: Gamma(n) = (n-1)!, Gamma(1/2) = sqrt(pi)', () => {
    expectClose(Math.exp(lnGamma(5)), 24, { rtol: 1e-13 });
    expectClose(Math.exp(lnGamma(11)), 3628800, { rtol: 1e-13 });
    expectClose(Math.exp(lnGamma(0.5)), Math.sqrt(Math.PI), { rtol: 1e-13 });
    expectClose(Math.exp(lnGamma(0.25)) * Math.exp(lnGamma(0.75)), Math.PI / Math.sin(Math.PI / 4), { rtol: 1e-13 });
  });

  it('self-consistency: I_x(1, 1) = x and I_x(a, b) = 1 - I_(1-x)(b, a)', () => {
    expectClose(incompleteBeta(0.3, 1, 1), 0.3, { rtol: 1e-13 });
    expectClose(incompleteBeta(0.3, 2.5, 4), 1 - incompleteBeta(0.7, 4, 2.5), { rtol: 1e-13 });
  });

  it('self-consistency: t with 1 degree of freedom is Cauchy, F(t) = 1/2 + atan(t)/pi', () => {
    for (const t of [-3, -0.5, 0, 0.7, 4]) expectClose(studentTCdf(t, 1), 0.5 + Math.atan(t) / Math.PI, { rtol: 1e-12 });
  });

  // Two-sided 95 % critical values t_(0.975, nu), printed to 3 decimals in the NIST/SEMATECH
  // e-Handbook of Statistical Methods, 1.3.6.7.2 (from memory).
  it.each([
    [1, 12.706],
    [2, 4.303],
    [5, 2.571],
    [10, 2.228],
    [30, 2.042],
    [100, 1.984],
  ])('NIST/SEMATECH e-Handbook 1.3.6.7.2 (from memory): t_0.975 with nu = %i is %f', (nu, t) => {
    expectClose(studentTQuantile(0.975, nu), t, { atol: 0.0005 });
    expectClose(studentTQuantile(0.025, nu), -t, { atol: 0.0005 });
  });

  it('JCGM 100:2008 Table G.2: k for 95.45 % with nu = infinity is 2.00; for 95 % it is 1.96', () => {
    expectClose(coverageFactor(0.9545, Infinity), 2.0, { atol: 0.005 });
    expectClose(coverageFactor(0.95, Infinity), 1.96, { atol: 0.005 });
    // Table G.2, nu = 10, p = 95.45 %: 2.28 (from memory)
    expectClose(coverageFactor(0.9545, 10), 2.28, { atol: 0.005 });
  });
});
