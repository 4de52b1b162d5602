/**
 * AR(1) fit, pre-whitening and the effective sample size of a mean, against an independent numpy
 * computation (tests/fixtures/ar1-reference.json, made by scripts/ar1-reference.py: lstsq fit,
 * Gaussian conditioning on all earlier hours, correlation-matrix sums).
 */
import { describe, expect, it } from 'vitest';
import reference from '../fixtures/ar1-reference.json';
import { expectClose } from '../support/expect-close';
import { at } from '../support/present';
import { MIN_AR1_PAIRS, ar1EffectiveSampleSize, ar1Innovation, ar1MeanUncertainty, fitAr1, prewhiten } from '~/lib/analytics/autocorrelation';
import { fitBaseline } from '~/lib/analytics/baseline';

const SRC = 'numpy reference (scripts/ar1-reference.py)';

describe('AR(1) of hourly residuals', () => {
  it(`${SRC}: phi and the innovation spread by least squares over pairs one hour apart`, () => {
    const fit = fitAr1(reference.residuals, reference.hourStartMs);
    expect(fit.pairs).toBe(reference.pairs);
    expect(fit.n).toBe(reference.residuals.length);
    expectClose(fit.phi, reference.phi, { rtol: 1e-10 });
    expectClose(fit.sInnovation, reference.sInnovation, { rtol: 1e-10 });
  });

  it(`${SRC}: standardised innovations, gaps included, equal Gaussian conditioning on every earlier hour`, () => {
    const model = { phi: reference.phi, sInnovation: reference.sInnovation };
    const x = prewhiten(reference.residuals, reference.hourStartMs, model);
    expect(x).toHaveLength(reference.innovations.length);
    // the reference solves a 60 x 60 system per hour; the two agree to about 1e-15 here, and 1e-9
    // leaves room for that solve's conditioning on other data
    x.forEach((v, i) => expectClose(v, at(reference.innovations, i), { atol: 1e-9, label: `hour ${i}` }));
    // some of those hours follow a gap (of up to 31 hours): the fixture covers the g-step rule
    const gaps = reference.hourStartMs.slice(1).map((t, i) => (t - at(reference.hourStartMs, i)) / 3_600_000);
    expect(Math.max(...gaps)).toBeGreaterThan(20);
    expect(gaps.filter((g) => g > 1).length).toBeGreaterThan(40);
  });

  it(`${SRC}: effective sample size of a mean of n consecutive hours`, () => {
    for (const c of reference.effectiveSampleSize) {
      expectClose(ar1EffectiveSampleSize(c.n, c.phi), c.nEff, { rtol: 1e-10, label: `n = ${c.n}, phi = ${c.phi}` });
      expectClose(ar1MeanUncertainty(c.n, 3, c.phi), 3 / Math.sqrt(c.nEff), { rtol: 1e-10 });
    }
    // large n: the familiar n (1 - phi) / (1 + phi) (self-consistency)
    expectClose(ar1EffectiveSampleSize(1e6, 0.5), 1e6 / 3, { rtol: 1e-5 });
  });

  it('self-consistency: with phi = 0 the innovation is the residual over its spread; a long gap forgets the previous hour', () => {
    expect(ar1Innovation(3, { r: 10, hoursBack: 1 }, { phi: 0, sInnovation: 2 })).toBe(1.5);
    const m = { phi: 0.5, sInnovation: Math.sqrt(0.75) }; // stationary spread 1
    expectClose(ar1Innovation(0.7, null, m), 0.7, { rtol: 1e-12 });
    expectClose(ar1Innovation(0.7, { r: 5, hoursBack: 200 }, m), 0.7, { rtol: 1e-12 });
    expectClose(ar1Innovation(0.7, { r: 1, hoursBack: 1 }, m), (0.7 - 0.5) / Math.sqrt(0.75), { rtol: 1e-12 });
  });

  it('too few consecutive pairs: phi = 0 and the spread of the residuals; no pair across a gap', () => {
    const r = Array.from({ length: 200 }, (_, i) => Math.sin(i)); // invented
    const every2h = r.map((_, i) => i * 7_200_000);
    const fit = fitAr1(r, every2h);
    expect(fit.pairs).toBe(0);
    expect(fit.phi).toBe(0);
    expectClose(fit.sInnovation, Math.sqrt(r.reduce((a, v) => a + v * v, 0) / 199), { rtol: 1e-12 });
    const few = fitAr1(r.slice(0, MIN_AR1_PAIRS));
    expect(few.pairs).toBe(MIN_AR1_PAIRS - 1);
    expect(few.phi).toBe(0);
    expect(() => fitAr1(r, every2h.slice(1))).toThrow(/hour starts/);
  });

  it('a baseline fitted with its hour starts keeps phi and the innovation spread of its residuals in stats', () => {
    const n = reference.residuals.length;
    const load = reference.residuals.map((_, i) => 0.5 + 0.4 * Math.sin(i / 7));
    const T = reference.residuals.map((_, i) => 280 + 10 * Math.cos(i / 50));
    const y = reference.residuals.map((r, i) => 1000 + 300 * at(load, i) - 2 * (at(T, i) - 280) + r);
    const m = fitBaseline({ load, T_amb_K: T, y, hourStartMs: reference.hourStartMs }, { terms: 'linear' });
    const res = y.map((v, i) => v - (m.coefficients.intercept + m.coefficients.load! * at(load, i) + m.coefficients.T_amb! * at(T, i)));
    const fit = fitAr1(res, reference.hourStartMs);
    expectClose(m.stats.phi!, fit.phi, { rtol: 1e-9 });
    expectClose(m.stats.sInnovation!, fit.sInnovation, { rtol: 1e-9 });
    expect(m.stats.ar1Pairs).toBe(reference.pairs);
    // the regression takes out little of an AR(1) with phi near 0.58
    expect(Math.abs(m.stats.phi! - reference.phi)).toBeLessThan(0.05);
    // without hour starts nothing is assumed about the order of the hours
    const plain = fitBaseline({ load, T_amb_K: T, y }, { terms: 'linear' });
    expect(plain.stats.phi).toBeUndefined();
    expect(n).toBeGreaterThan(500);
  });
});
