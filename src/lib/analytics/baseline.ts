/**
 * Baselines: ordinary least squares of a unit's efficiency (or exergy destruction) on load and
 * ambient temperature over a reference period, with fit quality per ASHRAE Guideline 14-2014 and a
 * prediction interval ("expected band") for a new hour.
 *
 * Solved by Householder QR (./least-squares.ts) on a centred and scaled design (each regressor is replaced by
 * z = (x - mean) / sd before the polynomial terms are formed), which keeps the problem well
 * conditioned even for T_amb^2 in kelvin; coefficients are reported back in the raw variables.
 *
 * Units: `load` is in whatever unit the caller uses consistently (fraction of rating, W, kg/s);
 * ambient temperature in K; y in its own unit (efficiency [-] or destruction [W]).
 *
 * @see ISO 50006:2014, energy baselines and energy performance indicators.
 * @see ASHRAE Guideline 14-2014, Measurement of Energy, Demand, and Water Savings (CV(RMSE), NMBE).
 * @see G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed. (2013), 5.2 and 5.3 (Householder QR
 *      for least squares).
 */
import { fitAr1 } from './autocorrelation';
import { coverageFactor } from './distributions';
import { householderLeastSquares, inverseGram, meanSd } from './least-squares';

/** Regression terms besides the intercept. */
export type BaselineTerm = 'load' | 'T_amb' | 'load^2' | 'T_amb^2' | 'load*T_amb';

/** Linear model: y = b0 + b1 load + b2 T_amb. */
export const LINEAR_TERMS: readonly BaselineTerm[] = ['load', 'T_amb'];
/** Quadratic model: adds load^2, T_amb^2 and load*T_amb. */
export const QUADRATIC_TERMS: readonly BaselineTerm[] = ['load', 'T_amb', 'load^2', 'T_amb^2', 'load*T_amb'];

export interface BaselineData {
  /** Load per hour [caller's unit]. */
  load: ArrayLike<number>;
  /** Ambient temperature per hour [K]. */
  T_amb_K: ArrayLike<number>;
  /** Regressed value per hour (efficiency [-] or destruction [W]). */
  y: ArrayLike<number>;
  /**
   * Start of each hour [ms], oldest first. When given, the residuals' lag-one autocorrelation is
   * fitted too (stats.phi, stats.sInnovation; ./autocorrelation.ts), on pairs of hours one hour apart.
   */
  hourStartMs?: ArrayLike<number>;
}

/** Fit statistics. Fractions, not percent: cvRmse 0.12 means 12 %. */
export interface FitStats {
  /** Number of observations. */
  n: number;
  /** Number of model parameters (intercept included). */
  p: number;
  /** Residual degrees of freedom n - p. */
  dof: number;
  /** Sum of squared residuals [y^2]. */
  sse: number;
  /** Residual standard deviation sqrt(SSE/(n - p)) [y]. */
  s: number;
  /** Coefficient of determination 1 - SSE/SST [-]. */
  r2: number;
  /** Mean of the observed values [y]. */
  ybar: number;
  /** CV(RMSE) = sqrt(SSE/(n - p)) / ybar [-]. */
  cvRmse: number;
  /** NMBE = sum(y - yhat) / ((n - p) ybar) [-]; zero on the fitting data of a model with intercept. */
  nmbe: number;
  /**
   * Lag-one autoregression coefficient of the residuals [-] (AR(1), ./autocorrelation.ts fitAr1), fitted
   * on pairs of consecutive steady hours of the reference period. Absent in baselines fitted before it
   * was stored, and when the hours were not given: the drift check then takes phi = 0.
   */
  phi?: number;
  /** Spread of the AR(1) innovations r_t - phi r_(t-1) [y]; absent with phi. */
  sInnovation?: number;
  /** Pairs of consecutive hours phi was fitted on. */
  ar1Pairs?: number;
}

export interface BaselineModel {
  terms: BaselineTerm[];
  /** Centre and scale of the regressors used in the internal (scaled) basis. */
  centre: { load: number; T_amb_K: number };
  scale: { load: number; T_amb_K: number };
  /** Coefficients in the scaled basis, [intercept, ...terms]. */
  beta: number[];
  /** (Z^T Z)^-1 in the scaled basis, for prediction intervals. */
  zTzInv: number[][];
  /** Coefficients in the raw variables (load, T_amb_K) [y per unit of the term]. */
  coefficients: { intercept: number } & Partial<Record<BaselineTerm, number>>;
  stats: FitStats;
}

export interface FitOptions {
  /** 'linear', 'quadratic' or an explicit list of terms; default 'linear'. */
  terms?: 'linear' | 'quadratic' | readonly BaselineTerm[];
}

export class BaselineError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'BaselineError';
  }
}

const ALL_TERMS: readonly BaselineTerm[] = QUADRATIC_TERMS;

function resolveTerms(t: FitOptions['terms']): BaselineTerm[] {
  const list = t === undefined || t === 'linear' ? LINEAR_TERMS : t === 'quadratic' ? QUADRATIC_TERMS : t;
  for (const term of list) {
    if (!ALL_TERMS.includes(term)) throw new BaselineError(`unknown baseline term '${term}'; use ${ALL_TERMS.join(', ')}`);
  }
  if (new Set(list).size !== list.length) throw new BaselineError(`baseline terms repeat: ${list.join(', ')}`);
  return [...list];
}

function termValue(term: BaselineTerm, zL: number, zT: number): number {
  switch (term) {
    case 'load':
      return zL;
    case 'T_amb':
      return zT;
    case 'load^2':
      return zL * zL;
    case 'T_amb^2':
      return zT * zT;
    case 'load*T_amb':
      return zL * zT;
  }
}

function designRow(model: Pick<BaselineModel, 'terms' | 'centre' | 'scale'>, load: number, T_amb_K: number): number[] {
  const zL = (load - model.centre.load) / model.scale.load;
  const zT = (T_amb_K - model.centre.T_amb_K) / model.scale.T_amb_K;
  return [1, ...model.terms.map((t) => termValue(t, zL, zT))];
}

/**
 * Fit statistics of predictions against observations, per ASHRAE Guideline 14-2014:
 * CV(RMSE) = sqrt(sum (y - yhat)^2 / (n - p)) / ybar and NMBE = sum (y - yhat) / ((n - p) ybar),
 * both with n - p in the denominator (as implemented here; the Guideline's wording is from memory).
 * Also usable on a validation period other than the one fitted (pass the model's p).
 *
 * @param y observed values [y]
 * @param yhat predicted values [y]
 * @param p number of model parameters, intercept included
 * @see ASHRAE Guideline 14-2014, clause 4.3 and Annex B (statistical indices), from memory.
 */
export function goodnessOfFit(y: ArrayLike<number>, yhat: ArrayLike<number>, p: number): FitStats {
  const n = y.length;
  if (yhat.length !== n) throw new BaselineError(`y has ${n} values but yhat has ${yhat.length}`);
  if (!(n > p)) throw new BaselineError(`need more observations (n = ${n}) than parameters (p = ${p})`);
  let sy = 0;
  for (let i = 0; i < n; i++) sy += y[i];
  const ybar = sy / n;
  let sse = 0;
  let sst = 0;
  let bias = 0;
  for (let i = 0; i < n; i++) {
    const e = y[i] - yhat[i];
    sse += e * e;
    bias += e;
    sst += (y[i] - ybar) ** 2;
  }
  const dof = n - p;
  const s = Math.sqrt(sse / dof);
  return {
    n,
    p,
    dof,
    sse,
    s,
    r2: sst > 0 ? 1 - sse / sst : NaN,
    ybar,
    cvRmse: s / ybar,
    nmbe: bias / (dof * ybar),
  };
}

/**
 * Fits a baseline y = f(load, T_amb) by ordinary least squares.
 *
 * @param data load [caller's unit], T_amb_K [K], y [y] per hour, equal lengths, finite
 * @param options terms: 'linear' (1, load, T_amb), 'quadratic' (+ load^2, T_amb^2, load*T_amb) or a list
 * @returns the model (JSON-serialisable) with raw-variable coefficients and fit statistics
 * @throws BaselineError on unequal lengths, non-finite values, too few hours, or a term that does
 *         not vary (e.g. constant ambient temperature)
 */
export function fitBaseline(data: BaselineData, options: FitOptions = {}): BaselineModel {
  const terms = resolveTerms(options.terms);
  const n = data.y.length;
  if (data.load.length !== n || data.T_amb_K.length !== n) {
    throw new BaselineError(`load (${data.load.length}), T_amb_K (${data.T_amb_K.length}) and y (${n}) differ in length`);
  }
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(data.load[i]) || !Number.isFinite(data.T_amb_K[i]) || !Number.isFinite(data.y[i])) {
      throw new BaselineError(`hour ${i} has a non-finite load, T_amb_K or y; keep only steady hours with values`);
    }
  }
  const p = terms.length + 1;
  if (!(n > p)) throw new BaselineError(`need more hours (n = ${n}) than parameters (p = ${p})`);
  const usesLoad = terms.some((t) => t.includes('load'));
  const usesT = terms.some((t) => t.includes('T_amb'));
  const mL = meanSd(data.load);
  const mT = meanSd(data.T_amb_K);
  if (usesLoad && !(mL.sd > 0)) throw new BaselineError('load does not vary over the reference period; drop the load terms');
  if (usesT && !(mT.sd > 0)) throw new BaselineError('T_amb_K does not vary over the reference period; drop the T_amb terms');
  const frame = {
    terms,
    centre: { load: mL.mean, T_amb_K: mT.mean },
    scale: { load: mL.sd > 0 ? mL.sd : 1, T_amb_K: mT.sd > 0 ? mT.sd : 1 },
  };
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) rows.push(designRow(frame, data.load[i], data.T_amb_K[i]));
  const names = ['intercept', ...terms];
  const { b: beta, R } = householderLeastSquares(
    rows,
    data.y,
    (j) =>
      new BaselineError(
        `the term '${names[j]}' is (nearly) a combination of the other terms over this reference period; ` +
          `choose fewer terms or a period with more varied load and ambient temperature`,
      ),
  );
  const yhat = rows.map((r) => r.reduce((acc, v, j) => acc + v * beta[j], 0));
  const stats: FitStats = goodnessOfFit(data.y, yhat, p);
  if (data.hourStartMs) {
    if (data.hourStartMs.length !== n) throw new BaselineError(`hourStartMs (${data.hourStartMs.length}) and y (${n}) differ in length`);
    const ar = fitAr1(
      yhat.map((v, i) => data.y[i] - v),
      data.hourStartMs,
    );
    stats.phi = ar.phi;
    // With phi = 0 (too few consecutive hours) the innovations are the residuals: keep the
    // regression's own spread (n - p degrees of freedom), so the drift check sees residual / s.
    stats.sInnovation = ar.phi === 0 ? stats.s : ar.sInnovation;
    stats.ar1Pairs = ar.pairs;
  }
  return {
    ...frame,
    beta,
    zTzInv: inverseGram(R),
    coefficients: rawCoefficients(frame, beta),
    stats,
  };
}

/** Re-expresses scaled-basis coefficients in the raw variables (load, T_amb_K). */
function rawCoefficients(
  frame: Pick<BaselineModel, 'terms' | 'centre' | 'scale'>,
  beta: number[],
): BaselineModel['coefficients'] {
  // z = a x + c with a = 1/sd, c = -mean/sd
  const aL = 1 / frame.scale.load;
  const cL = -frame.centre.load / frame.scale.load;
  const aT = 1 / frame.scale.T_amb_K;
  const cT = -frame.centre.T_amb_K / frame.scale.T_amb_K;
  const b: Record<string, number> = { intercept: beta[0] };
  frame.terms.forEach((t, j) => (b[t] = beta[j + 1]));
  const g = (t: BaselineTerm): number => b[t] ?? 0;
  const out: BaselineModel['coefficients'] = {
    intercept:
      b.intercept +
      g('load') * cL +
      g('T_amb') * cT +
      g('load^2') * cL * cL +
      g('T_amb^2') * cT * cT +
      g('load*T_amb') * cL * cT,
  };
  const has = (t: BaselineTerm) => frame.terms.includes(t);
  if (has('load') || has('load^2') || has('load*T_amb')) out.load = g('load') * aL + 2 * g('load^2') * aL * cL + g('load*T_amb') * aL * cT;
  if (has('T_amb') || has('T_amb^2') || has('load*T_amb')) out.T_amb = g('T_amb') * aT + 2 * g('T_amb^2') * aT * cT + g('load*T_amb') * aT * cL;
  if (has('load^2')) out['load^2'] = g('load^2') * aL * aL;
  if (has('T_amb^2')) out['T_amb^2'] = g('T_amb^2') * aT * aT;
  if (has('load*T_amb')) out['load*T_amb'] = g('load*T_amb') * aL * aT;
  return out;
}

/**
 * Expected value of y for an hour.
 * @param model fitted baseline
 * @param load load [caller's unit]
 * @param T_amb_K ambient temperature [K]
 * @returns expected y [y]
 */
export function predict(model: BaselineModel, load: number, T_amb_K: number): number {
  const z = designRow(model, load, T_amb_K);
  return z.reduce((acc, v, j) => acc + v * model.beta[j], 0);
}

export interface PredictionInterval {
  /** Expected value [y]. */
  yhat: number;
  /** Standard deviation of a new observation about yhat, s sqrt(1 + x0^T (X^T X)^-1 x0) [y]. */
  se: number;
  /** Coverage factor used [-]. */
  k: number;
  halfWidth: number;
  lower: number;
  upper: number;
}

/**
 * Prediction interval (the expected band) for a new hour: yhat +- k s sqrt(1 + x0^T (X^T X)^-1 x0).
 * k defaults to the two-sided Student t quantile for `coverage` (default 0.95) with n - p degrees of
 * freedom; pass k (e.g. 2) to fix it.
 *
 * @param model fitted baseline
 * @param load load [caller's unit]
 * @param T_amb_K ambient temperature [K]
 * @param options k [-] or coverage [-]
 * @see N. R. Draper and H. Smith, Applied Regression Analysis, 3rd ed. (1998), 3.1 (prediction of a new observation).
 */
export function predictionInterval(
  model: BaselineModel,
  load: number,
  T_amb_K: number,
  options: { k?: number; coverage?: number } = {},
): PredictionInterval {
  const z = designRow(model, load, T_amb_K);
  const G = model.zTzInv;
  let q = 0;
  for (let i = 0; i < z.length; i++) for (let j = 0; j < z.length; j++) q += z[i] * G[i][j] * z[j];
  const yhat = z.reduce((acc, v, j) => acc + v * model.beta[j], 0);
  const se = model.stats.s * Math.sqrt(1 + q);
  const k = options.k ?? coverageFactor(options.coverage ?? 0.95, model.stats.dof);
  const halfWidth = k * se;
  return { yhat, se, k, halfWidth, lower: yhat - halfWidth, upper: yhat + halfWidth };
}

/**
 * Residual of an hour normalised by the baseline's residual spread, (y - yhat) / s [-]: the input
 * of the drift detectors.
 */
export function normalisedResidual(model: BaselineModel, load: number, T_amb_K: number, y: number): number {
  return (y - predict(model, load, T_amb_K)) / model.stats.s;
}

/** Guideline 14 calibration limits (fractions). */
export const GUIDELINE14_LIMITS = {
  hourly: { cvRmseMax: 0.3, nmbeMax: 0.1 },
  monthly: { cvRmseMax: 0.15, nmbeMax: 0.05 },
} as const;

export interface Guideline14Check {
  meets: boolean;
  cvRmseOk: boolean;
  nmbeOk: boolean;
  cvRmseMax: number;
  nmbeMax: number;
}

/**
 * Checks fit statistics against ASHRAE Guideline 14-2014 calibration criteria: hourly CV(RMSE) <= 30 %
 * and |NMBE| <= 10 %; monthly 15 % and 5 % (limits from memory, as in docs/domain.md section 7;
 * confirm against the Guideline before relying on them).
 *
 * @param stats fit statistics (fractions)
 * @param period 'hourly' or 'monthly' data
 */
export function meetsGuideline14(stats: Pick<FitStats, 'cvRmse' | 'nmbe'>, period: 'hourly' | 'monthly'): Guideline14Check {
  const lim = GUIDELINE14_LIMITS[period];
  const cvRmseOk = Number.isFinite(stats.cvRmse) && stats.cvRmse >= 0 && stats.cvRmse <= lim.cvRmseMax;
  const nmbeOk = Number.isFinite(stats.nmbe) && Math.abs(stats.nmbe) <= lim.nmbeMax;
  return { meets: cvRmseOk && nmbeOk, cvRmseOk, nmbeOk, cvRmseMax: lim.cvRmseMax, nmbeMax: lim.nmbeMax };
}
