/**
 * Drift detection on baseline residuals: tabular CUSUM, streaming (state in, state out), so the
 * server can continue hour by hour from a saved state.
 *
 * Inputs are usually normalised residuals r = (y - yhat) / s of steady hours (mu0 = 0, sigma = 1,
 * the defaults); mu0 and sigma may be given to run the charts on raw values.
 *
 * CUSUM (tabular form):  C+_i = max(0, x_i - (mu0 + K) + C+_{i-1}),  C-_i = max(0, (mu0 - K) - x_i + C-_{i-1}),
 * K = k sigma, signal when C > H = h sigma. Defaults k = 0.5, h = 5 (docs/domain.md section 7:
 * typical k = 0.5 sigma, h = 4-5 sigma). On a signal, the onset estimate is the step after the last
 * step at which C was zero, and the shifted mean is estimated as mu0 + K + C+/N+ (up) or
 * mu0 - K - C-/N- (down), N the number of consecutive steps with C > 0.
 *
 * Steps are numbered from 1 (the first observation is step 1). A non-finite x (an hour that was not
 * steady) is counted as a step but leaves the statistics unchanged and is marked `skipped`.
 *
 * @see E. S. Page, "Continuous inspection schemes", Biometrika 41 (1954) 100-115.
 * @see D. C. Montgomery, Introduction to Statistical Quality Control, 6th ed. (Wiley, 2009), 9.1 (tabular
 *      CUSUM, Example 9.1).
 */

/**
 * Lossline's drift-check defaults, on the standardised AR(1) innovations of the hourly residuals
 * (./autocorrelation.ts; docs/domain.md section 7): k = 0.5 and h = 8 spreads of the innovations,
 * a signal only once the run has lasted 3 steady hours. Two-sided in-control ARL of the plain
 * CUSUM at k = 0.5, h = 8: about 9,480 observations (Brook & Evans chain, ./arl.ts), so at most about
 * one chance notice per unit per 8,760 steady hours; `npm run bench:drift` prints what they give.
 * The server (src/server/services/drift.ts DRIFT_DEFAULTS, SUSTAINED_HOURS) takes them from here.
 */
export const DRIFT_CHECK_DEFAULTS = { k: 0.5, h: 8, sustainedHours: 3 } as const;

export interface CusumOptions {
  /** Reference value k in units of sigma [-]; default 0.5. */
  k?: number;
  /** Decision interval h in units of sigma [-]; default 5. */
  h?: number;
  /** In-control mean [x]; default 0. */
  mu0?: number;
  /** Standard deviation of x in control [x]; default 1. */
  sigma?: number;
  /** Restart C+ and C- at zero after a signal (after the cause has been dealt with); default false. */
  resetOnSignal?: boolean;
  /**
   * Fewest consecutive steps with C > 0 (N in Montgomery's notation) before a crossing of h counts as
   * a signal [-]; default 1 (the plain tabular CUSUM). Above 1, one outlying observation that lifts C
   * over h on its own waits until the shift has lasted that long, and signals then if C is still
   * over h; a shift that does not last never signals.
   */
  minRunLength?: number;
}

/** Saved CUSUM state (JSON-friendly). */
export interface CusumState {
  /** Number of observations processed so far. */
  step: number;
  cPlus: number;
  cMinus: number;
  /** Consecutive steps with C+ > 0 (N+ in Montgomery's notation). */
  nPlus: number;
  nMinus: number;
}

export interface DriftSignal {
  direction: 'up' | 'down';
  /** Step at which the statistic first exceeded the decision interval. */
  step: number;
  /** Estimated first step of the shift (the step after C was last zero). */
  onsetStep: number;
  /** Estimated mean after the shift [x]. */
  shiftedMean: number;
  /** Estimated shift from mu0 in units of sigma [-] (signed). */
  shift_sigma: number;
}

export interface CusumPoint {
  step: number;
  x: number;
  cPlus: number;
  cMinus: number;
  nPlus: number;
  nMinus: number;
  skipped: boolean;
  /** Signals raised at this step (a crossing of H upward by C+ or C-). */
  signals: DriftSignal[];
}

/** A fresh CUSUM state (no observations yet). */
export function cusumInit(): CusumState {
  return { step: 0, cPlus: 0, cMinus: 0, nPlus: 0, nMinus: 0 };
}

function cusumParams(o: CusumOptions) {
  const k = o.k ?? 0.5;
  const h = o.h ?? 5;
  const mu0 = o.mu0 ?? 0;
  const sigma = o.sigma ?? 1;
  if (!(k >= 0) || !(h > 0) || !(sigma > 0) || !Number.isFinite(mu0)) {
    throw new RangeError(`CUSUM needs k >= 0, h > 0, sigma > 0 and finite mu0 (got k = ${k}, h = ${h}, sigma = ${sigma}, mu0 = ${mu0})`);
  }
  const minRun = o.minRunLength ?? 1;
  if (!(Number.isInteger(minRun) && minRun >= 1)) throw new RangeError(`CUSUM minRunLength must be a whole number >= 1 (got ${minRun})`);
  return { K: k * sigma, H: h * sigma, mu0, sigma, reset: o.resetOnSignal ?? false, minRun };
}

/**
 * One CUSUM step.
 * @param state state after the previous step (not modified)
 * @param x new observation [x] (normalised residual by default)
 * @param options k, h [-]; mu0, sigma [x]
 * @returns the new state and the point for this step, with any signal
 */
export function cusumStep(state: CusumState, x: number, options: CusumOptions = {}): { state: CusumState; point: CusumPoint } {
  const { K, H, mu0, sigma, reset, minRun } = cusumParams(options);
  const step = state.step + 1;
  if (!Number.isFinite(x)) {
    const next = { ...state, step };
    return { state: next, point: { step, x, cPlus: state.cPlus, cMinus: state.cMinus, nPlus: state.nPlus, nMinus: state.nMinus, skipped: true, signals: [] } };
  }
  const cPlus = Math.max(0, x - (mu0 + K) + state.cPlus);
  const cMinus = Math.max(0, mu0 - K - x + state.cMinus);
  const nPlus = cPlus > 0 ? state.nPlus + 1 : 0;
  const nMinus = cMinus > 0 ? state.nMinus + 1 : 0;
  const signals: DriftSignal[] = [];
  // A signal at the first step where C is over h AND the run has lasted minRun steps.
  const wasPlus = state.cPlus > H && state.nPlus >= minRun;
  const wasMinus = state.cMinus > H && state.nMinus >= minRun;
  if (cPlus > H && nPlus >= minRun && !wasPlus) {
    const shiftedMean = mu0 + K + cPlus / nPlus;
    signals.push({ direction: 'up', step, onsetStep: step - nPlus + 1, shiftedMean, shift_sigma: (shiftedMean - mu0) / sigma });
  }
  if (cMinus > H && nMinus >= minRun && !wasMinus) {
    const shiftedMean = mu0 - K - cMinus / nMinus;
    signals.push({ direction: 'down', step, onsetStep: step - nMinus + 1, shiftedMean, shift_sigma: (shiftedMean - mu0) / sigma });
  }
  const point: CusumPoint = { step, x, cPlus, cMinus, nPlus, nMinus, skipped: false, signals };
  const next: CusumState =
    reset && signals.length > 0 ? { step, cPlus: 0, cMinus: 0, nPlus: 0, nMinus: 0 } : { step, cPlus, cMinus, nPlus, nMinus };
  return { state: next, point };
}

/**
 * Runs CUSUM over a sequence, continuing from a saved state.
 * @param xs observations [x]
 * @param options k, h [-]; mu0, sigma [x]
 * @param state saved state (default: fresh)
 */
export function cusumRun(
  xs: ArrayLike<number>,
  options: CusumOptions = {},
  state: CusumState = cusumInit(),
): { points: CusumPoint[]; signals: DriftSignal[]; state: CusumState } {
  const points: CusumPoint[] = [];
  let s = state;
  for (let i = 0; i < xs.length; i++) {
    const r = cusumStep(s, xs[i], options);
    s = r.state;
    points.push(r.point);
  }
  return { points, signals: points.flatMap((p) => p.signals), state: s };
}
