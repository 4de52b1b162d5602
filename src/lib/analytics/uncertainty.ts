/**
 * Measurement uncertainty of a calculated result.
 *
 * `propagate`: first-order propagation (law of propagation of uncertainty) with sensitivities from
 * central differences:  u_c^2(y) = sum_i (c_i u(x_i))^2  for uncorrelated inputs (JCGM 100:2008
 * eq. 10), or  sum_i sum_j c_i c_j u(x_i) u(x_j) r_ij  with a correlation matrix (eq. 13), where
 * c_i = dy/dx_i. Expanded uncertainty U = k u_c with k = 2 by default (JCGM 100:2008, 6.2-6.3).
 *
 * `monteCarlo`: propagation of distributions (JCGM 101:2008): inputs drawn as independent normals
 * N(x_i, u_i^2) with a seeded generator; result mean, standard deviation and the probabilistically
 * symmetric 95 % coverage interval (JCGM 101:2008, 7.7).
 *
 * Inputs and outputs are plain vectors in SI; which element is what is the caller's model.
 *
 * @see JCGM 100:2008, Evaluation of measurement data - Guide to the expression of uncertainty in
 *      measurement (GUM), 5.1.2 eq. 10, 5.2.2 eq. 13.
 * @see JCGM 101:2008, Supplement 1 to the GUM - Propagation of distributions using a Monte Carlo method.
 * @see ASME PTC 19.1-2018, Test Uncertainty.
 */
import { createRng } from './rng';

/** A model y = f(x): input vector in SI, one or more outputs in SI. */
export type Model = (x: Float64Array) => Float64Array | number[] | number;

export interface PropagateOptions {
  /** Central-difference step relative to max(|x_i|, u_i) [-]; default 1e-6. */
  relStep?: number;
  /** Coverage factor for the expanded uncertainty [-]; default 2. */
  k?: number;
  /** Correlation coefficients r_ij (symmetric, unit diagonal); default none (uncorrelated). */
  correlation?: ReadonlyArray<ReadonlyArray<number>>;
}

export interface PropagationResult {
  /** Outputs at the estimate x0 [SI]. */
  y: Float64Array;
  /** Combined standard uncertainty per output [SI]. */
  u: Float64Array;
  /** Expanded uncertainty per output, U = k u [SI]. */
  U: Float64Array;
  /** Coverage factor used [-]. */
  k: number;
  /** Sensitivity coefficients c[j][i] = dy_j/dx_i [SI_y/SI_x]. */
  sensitivity: Float64Array[];
  /** Uncertainty contribution of input i to output j, |c_ji| u_i [SI]. */
  contributions: Float64Array[];
  /** Share of u_c^2 from input i alone, (c_ji u_i)^2 / u_c^2 [-] (sums to 1 without correlation). */
  varianceShare: Float64Array[];
}

function evaluate(f: Model, x: Float64Array): Float64Array {
  const out = f(x);
  if (typeof out === 'number') return Float64Array.of(out);
  return out instanceof Float64Array ? out : Float64Array.from(out);
}

function checkInputs(x0: ArrayLike<number>, u: ArrayLike<number>): void {
  if (x0.length !== u.length) {
    throw new RangeError(`x0 has ${x0.length} inputs but u has ${u.length} uncertainties`);
  }
  for (let i = 0; i < u.length; i++) {
    if (!Number.isFinite(x0[i])) throw new RangeError(`x0[${i}] = ${x0[i]} is not a finite number`);
    if (!(u[i] >= 0 && Number.isFinite(u[i]))) throw new RangeError(`u[${i}] = ${u[i]} must be a finite number >= 0`);
  }
}

/**
 * First-order propagation of standard uncertainties through a model, sensitivities by central
 * differences with step h_i = relStep * max(|x_i|, u_i) (relStep when both are zero).
 *
 * @param f model, inputs and outputs in SI
 * @param x0 input estimates [SI]
 * @param u standard uncertainties of the inputs [SI], >= 0
 * @param options relStep [-], k [-], correlation [-]
 * @returns outputs, standard and expanded uncertainties, sensitivities and contributions
 * @see JCGM 100:2008 (GUM) 5.1.2 eq. 10 (uncorrelated), 5.2.2 eq. 13 (correlated), 5.1.3 (c_i)
 */
export function propagate(
  f: Model,
  x0: ArrayLike<number>,
  u: ArrayLike<number>,
  options: PropagateOptions = {},
): PropagationResult {
  checkInputs(x0, u);
  const relStep = options.relStep ?? 1e-6;
  const k = options.k ?? 2;
  const n = x0.length;
  const r = options.correlation;
  if (r) {
    if (r.length !== n || r.some((row) => row.length !== n)) throw new RangeError(`correlation must be ${n} x ${n}`);
  }
  const x = Float64Array.from(x0);
  const y = evaluate(f, x);
  const m = y.length;
  const sensitivity = Array.from({ length: m }, () => new Float64Array(n));
  for (let i = 0; i < n; i++) {
    const scale = Math.max(Math.abs(x0[i]), u[i]);
    const h = relStep * (scale > 0 ? scale : 1);
    x[i] = x0[i] + h;
    const yp = evaluate(f, x);
    x[i] = x0[i] - h;
    const ym = evaluate(f, x);
    x[i] = x0[i];
    for (let j = 0; j < m; j++) sensitivity[j][i] = (yp[j] - ym[j]) / (2 * h);
  }
  const uc = new Float64Array(m);
  const contributions = Array.from({ length: m }, () => new Float64Array(n));
  const varianceShare = Array.from({ length: m }, () => new Float64Array(n));
  for (let j = 0; j < m; j++) {
    let v = 0;
    for (let i = 0; i < n; i++) {
      const ci = sensitivity[j][i] * u[i];
      contributions[j][i] = Math.abs(ci);
      if (r) {
        for (let l = 0; l < n; l++) v += ci * sensitivity[j][l] * u[l] * r[i][l];
      } else {
        v += ci * ci;
      }
    }
    uc[j] = Math.sqrt(Math.max(v, 0));
    for (let i = 0; i < n; i++) varianceShare[j][i] = v > 0 ? contributions[j][i] ** 2 / v : 0;
  }
  return { y, u: uc, U: uc.map((s) => k * s), k, sensitivity, contributions, varianceShare };
}

export interface MonteCarloOptions {
  /** Number of trials M; default 200 000 (JCGM 101:2008 7.2 suggests 1e6 for 95 % intervals). */
  trials?: number;
  /** Seed of the generator; the same seed reproduces the result exactly. Default 1. */
  seed?: number;
  /** Coverage probability of the reported interval [-]; default 0.95. */
  coverage?: number;
}

export interface MonteCarloResult {
  /** Mean of the output samples per output [SI]. */
  mean: Float64Array;
  /** Standard deviation of the output samples (standard uncertainty) [SI]. */
  u: Float64Array;
  /** Probabilistically symmetric coverage interval per output [SI]. */
  low: Float64Array;
  high: Float64Array;
  trials: number;
}

/**
 * Monte Carlo propagation of independent normal inputs N(x0_i, u_i^2) through a model.
 *
 * @param f model, inputs and outputs in SI
 * @param x0 input estimates [SI]
 * @param u standard uncertainties [SI]
 * @param options trials, seed, coverage
 * @see JCGM 101:2008 (GUM Supplement 1) 7.2-7.7
 */
export function monteCarlo(
  f: Model,
  x0: ArrayLike<number>,
  u: ArrayLike<number>,
  options: MonteCarloOptions = {},
): MonteCarloResult {
  checkInputs(x0, u);
  const M = options.trials ?? 200_000;
  if (!(Number.isInteger(M) && M >= 100)) throw new RangeError(`trials = ${M} must be an integer >= 100`);
  const coverage = options.coverage ?? 0.95;
  const rng = createRng(options.seed ?? 1);
  const n = x0.length;
  const x = new Float64Array(n);
  let samples: Float64Array[] = [];
  for (let t = 0; t < M; t++) {
    for (let i = 0; i < n; i++) x[i] = x0[i] + u[i] * rng.normal();
    const y = evaluate(f, x);
    if (t === 0) samples = Array.from({ length: y.length }, () => new Float64Array(M));
    for (let j = 0; j < y.length; j++) samples[j][t] = y[j];
  }
  const m = samples.length;
  const mean = new Float64Array(m);
  const sd = new Float64Array(m);
  const low = new Float64Array(m);
  const high = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    const s = samples[j];
    let acc = 0;
    for (let t = 0; t < M; t++) acc += s[t];
    const mu = acc / M;
    let ss = 0;
    for (let t = 0; t < M; t++) ss += (s[t] - mu) ** 2;
    mean[j] = mu;
    sd[j] = Math.sqrt(ss / (M - 1));
    s.sort();
    // JCGM 101:2008 7.7.2: the interval from the ((1-p)/2 M)-th to the ((1+p)/2 M)-th ordered value.
    const lo = Math.max(0, Math.round(((1 - coverage) / 2) * M) - 1);
    const hi = Math.min(M - 1, Math.round(((1 + coverage) / 2) * M) - 1);
    low[j] = s[lo];
    high[j] = s[hi];
  }
  return { mean, u: sd, low, high, trials: M };
}
