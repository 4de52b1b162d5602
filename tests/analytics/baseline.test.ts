import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import { at } from '../support/present';
import {
  BaselineError,
  fitBaseline,
  goodnessOfFit,
  meetsGuideline14,
  normalisedResidual,
  predict,
  predictionInterval,
  type BaselineTerm,
} from '~/lib/analytics/baseline';
import reference from '../fixtures/baseline-reference.json';
import distributions from '../fixtures/distributions-reference.json';

describe('fitBaseline: one regressor against closed-form simple linear regression', () => {
  // Invented hours: y against load only (T_amb varies but is not a term).
  const load = [0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1.0];
  const y = [0.31, 0.335, 0.352, 0.371, 0.38, 0.394, 0.399];
  const T_amb_K = [280, 281, 279, 283, 285, 284, 282];

  it('slope = Sxy/Sxx and intercept = ybar - slope xbar (closed form, computed independently here)', () => {
    const n = load.length;
    const xbar = load.reduce((a, b) => a + b) / n;
    const ybar = y.reduce((a, b) => a + b) / n;
    let sxy = 0;
    let sxx = 0;
    for (let i = 0; i < n; i++) {
      sxy += (at(load, i) - xbar) * (at(y, i) - ybar);
      sxx += (at(load, i) - xbar) ** 2;
    }
    const slope = sxy / sxx;
    const intercept = ybar - slope * xbar;
    let sse = 0;
    for (let i = 0; i < n; i++) sse += (at(y, i) - intercept - slope * at(load, i)) ** 2;
    const s = Math.sqrt(sse / (n - 2));

    const m = fitBaseline({ load, T_amb_K, y }, { terms: ['load'] });
    expectClose(m.coefficients.load!, slope, { rtol: 1e-12 });
    expectClose(m.coefficients.intercept, intercept, { rtol: 1e-12 });
    expect(m.coefficients.T_amb).toBeUndefined();
    expectClose(m.stats.s, s, { rtol: 1e-12 });
    expect(m.stats.dof).toBe(5);
    // Prediction of a new observation, simple regression: s sqrt(1 + 1/n + (x0 - xbar)^2 / Sxx)
    // (Draper & Smith, Applied Regression Analysis, 3rd ed., 3.1)
    const x0 = 0.75;
    const pi = predictionInterval(m, x0, 290, { k: 2 });
    expectClose(pi.yhat, intercept + slope * x0, { rtol: 1e-12 });
    expectClose(pi.se, s * Math.sqrt(1 + 1 / n + (x0 - xbar) ** 2 / sxx), { rtol: 1e-12 });
    expectClose(pi.upper - pi.lower, 4 * pi.se, { rtol: 1e-14 });
    // default: the two-sided 95 % t quantile with 5 dof (scipy, scripts/distributions-reference.py)
    const t975 = distributions.tQuantiles.find((q) => q.p === 0.975 && q.nu === 5)!.t;
    expectClose(predictionInterval(m, x0, 290).k, t975, { rtol: 1e-8 });
  });
});

describe(`fitBaseline against ${reference.library} ${reference.library_version} (${reference.generator})`, () => {
  const data = reference.data;
  for (const [name, ref] of Object.entries(reference.models)) {
    it(`${reference.library} ${reference.library_version} lstsq: ${name} model coefficients, statistics and prediction intervals`, () => {
      const m = fitBaseline(data, { terms: ref.terms as BaselineTerm[] });
      // Raw-basis coefficients with T_amb^2 in kelvin are less well conditioned than the predictions;
      // 1e-9 still leaves two orders of margin over the observed agreement (about 2e-11).
      for (const [term, c] of Object.entries(ref.coefficients)) {
        const got = term === 'intercept' ? m.coefficients.intercept : m.coefficients[term as BaselineTerm]!;
        expectClose(got, c, { rtol: 1e-9, label: term });
      }
      ref.yhat.forEach((v, i) => expectClose(predict(m, at(data.load, i), at(data.T_amb_K, i)), v, { rtol: 1e-9 }));
      expectClose(m.stats.sse, ref.sse, { rtol: 1e-8 });
      expectClose(m.stats.s, ref.s, { rtol: 1e-9 });
      expectClose(m.stats.r2, ref.r2, { rtol: 1e-9 });
      expectClose(m.stats.cvRmse, ref.cvRmse, { rtol: 1e-9 });
      expectClose(m.stats.nmbe, ref.nmbe, { atol: 1e-9 });
      for (const p of ref.predictions) {
        const pi = predictionInterval(m, p.load, p.T_amb_K, { k: 2 });
        expectClose(pi.yhat, p.yhat, { rtol: 1e-9 });
        expectClose(pi.se, p.se, { rtol: 1e-9 });
      }
    });
  }

  it('self-consistency: a model fitted through its raw coefficients predicts what the scaled model predicts', () => {
    const m = fitBaseline(data, { terms: 'quadratic' });
    const c = m.coefficients;
    const [L, T] = [0.66, 290.5];
    const raw =
      c.intercept + c.load! * L + c.T_amb! * T + c['load^2']! * L * L + c['T_amb^2']! * T * T + c['load*T_amb']! * L * T;
    expectClose(raw, predict(m, L, T), { rtol: 1e-9 });
    // the normalised residual is (y - yhat) / s
    expectClose(normalisedResidual(m, L, T, raw + 2 * m.stats.s), 2, { rtol: 1e-9 });
    // JSON round trip keeps the model usable (stored by the server)
    const back = JSON.parse(JSON.stringify(m));
    expectClose(predict(back, L, T), predict(m, L, T), { rtol: 1e-15 });
  });
});

describe('goodnessOfFit and meetsGuideline14', () => {
  it('ASHRAE Guideline 14-2014 forms (with n - p): CV(RMSE) and NMBE worked by hand', () => {
    // y = [10, 12, 14, 16], yhat = [11, 11, 15, 15], p = 2:
    //   residuals y - yhat = [-1, 1, -1, 1]; SSE = 4; sum = 0; ybar = 13; n - p = 2
    //   CV(RMSE) = sqrt(4/2)/13 = 0.108786...; NMBE = 0
    const a = goodnessOfFit([10, 12, 14, 16], [11, 11, 15, 15], 2);
    expectClose(a.cvRmse, Math.SQRT2 / 13, { rtol: 1e-14 });
    expect(a.nmbe).toBe(0);
    // yhat = [9, 11, 13, 15]: residuals all +1, SSE = 4, sum = 4: NMBE = 4 / (2 x 13) = 0.153846...
    const b = goodnessOfFit([10, 12, 14, 16], [9, 11, 13, 15], 2);
    expectClose(b.nmbe, 4 / 26, { rtol: 1e-14 });
    expectClose(b.cvRmse, Math.SQRT2 / 13, { rtol: 1e-14 });
  });

  it('ASHRAE Guideline 14-2014 (limits from memory, docs/domain.md section 7): hourly 30 % / +-10 %, monthly 15 % / +-5 %', () => {
    expect(meetsGuideline14({ cvRmse: 0.29, nmbe: -0.09 }, 'hourly').meets).toBe(true);
    expect(meetsGuideline14({ cvRmse: 0.31, nmbe: 0 }, 'hourly')).toMatchObject({ meets: false, cvRmseOk: false, nmbeOk: true });
    expect(meetsGuideline14({ cvRmse: 0.1, nmbe: 0.11 }, 'hourly')).toMatchObject({ meets: false, nmbeOk: false });
    expect(meetsGuideline14({ cvRmse: 0.16, nmbe: 0 }, 'monthly').meets).toBe(false);
    expect(meetsGuideline14({ cvRmse: 0.14, nmbe: -0.06 }, 'monthly').meets).toBe(false);
    expect(meetsGuideline14({ cvRmse: 0.14, nmbe: 0.04 }, 'monthly').meets).toBe(true);
    expect(meetsGuideline14({ cvRmse: NaN, nmbe: 0 }, 'hourly').meets).toBe(false);
  });

  it('refuses too few hours, non-finite values and a term that does not vary', () => {
    expect(() => fitBaseline({ load: [1, 2, 3], T_amb_K: [280, 281, 282], y: [1, 2, 3] })).toThrow(/n = 3/);
    expect(() => fitBaseline({ load: [1, 2, 3, NaN, 5], T_amb_K: [280, 281, 282, 283, 284], y: [1, 2, 3, 4, 5] })).toThrow(
      BaselineError,
    );
    expect(() =>
      fitBaseline({ load: [1, 2, 3, 4, 5], T_amb_K: [280, 280, 280, 280, 280], y: [1, 2, 3, 4, 5] }, { terms: 'linear' }),
    ).toThrow(/T_amb_K does not vary/);
    // load and load^2 are exactly collinear when load takes only two values
    expect(() =>
      fitBaseline({ load: [1, 2, 1, 2, 1, 2], T_amb_K: [280, 281, 282, 283, 284, 285], y: [1, 2, 3, 4, 5, 6] }, { terms: ['load', 'load^2'] }),
    ).toThrow(/load\^2/);
  });
});
