/**
 * Serial correlation of hourly baseline residuals: a first-order autoregressive model AR(1),
 * r_t = phi r_(t-1) + e_t with e_t independent N(0, sigma_e^2), fitted on the reference period, and
 * what follows from it for the drift check and for the uncertainty of a mean of hourly residuals.
 *
 * Why: a baseline of load and ambient temperature does not explain every hour, so what it misses
 * (season, fouling state, control tuning) carries over from one hour to the next. A CUSUM designed
 * for independent observations then signals far more often than its nominal in-control run length.
 * The drift check therefore runs the CUSUM on the standardised one-step-ahead prediction errors
 * (innovations) of the fitted AR(1) model, which are independent when the model holds: the
 * "residual chart" approach (Montgomery, Introduction to Statistical Quality Control, 6th ed. 2009,
 * section 10.4, "SPC with autocorrelated process data"; Alwan & Roberts 1988; Lu & Reynolds 2001,
 * J. Quality Technology 33(3); from memory). See docs/domain.md section 7.
 *
 * Gaps: only steady hours are residuals. The fit uses pairs of steady hours exactly one hour apart
 * (a gap ends a segment; the first hour of each segment only starts the next pair). In the drift
 * check an hour whose previous steady hour is g hours back is predicted by phi^g r_prev with the
 * exact AR(1) g-step prediction variance sigma_e^2 (1 - phi^(2g)) / (1 - phi^2); after a long gap
 * (or with no previous hour) that is the stationary variance, so the hour is judged on its own.
 *
 * Pure: no I/O.
 */
import { HOUR_MS } from '../time';

/** AR(1) fit of hourly residuals. */
export interface Ar1Fit {
  /** Lag-one autoregression coefficient phi [-], clamped to [-PHI_MAX, PHI_MAX]; 0 when too few pairs. */
  phi: number;
  /** Innovation spread sigma_e, the standard deviation of r_t - phi r_(t-1) [unit of r]. */
  sInnovation: number;
  /** Pairs of consecutive steady hours the fit used. */
  pairs: number;
  /** Residuals given. */
  n: number;
}

/** Largest |phi| the fit returns: beyond it the series is close to a random walk and AR(1) is the wrong model. */
export const PHI_MAX = 0.95;
/** Fewest pairs of consecutive hours to fit phi on (two days); with fewer, phi = 0. Common practice. */
export const MIN_AR1_PAIRS = 48;

/**
 * Calls `f` with each pair of consecutive residuals that are an hour apart (when hour starts are
 * given) and both finite: the pairs the AR(1) fit and its innovation spread are taken over.
 */
function eachHourPair(residuals: ArrayLike<number>, hourStartMs: ArrayLike<number> | undefined, f: (a: number, b: number) => void): void {
  for (let i = 1; i < residuals.length; i++) {
    if (hourStartMs && hourStartMs[i] - hourStartMs[i - 1] !== HOUR_MS) continue;
    const a = residuals[i - 1];
    const b = residuals[i];
    if (Number.isFinite(a) && Number.isFinite(b)) f(a, b);
  }
}

/**
 * Fits AR(1) by least squares through the origin on pairs of consecutive hours:
 * phi = sum r_t r_(t-1) / sum r_(t-1)^2, sigma_e^2 = sum (r_t - phi r_(t-1))^2 / (m - 1), m pairs
 * (conditional least squares; the residuals of a baseline with an intercept have mean zero, so no
 * mean is fitted). With fewer than MIN_AR1_PAIRS pairs, phi = 0 and sigma_e is the root mean square
 * of the residuals (n - 1 in the denominator).
 *
 * @param residuals hourly residuals of steady hours, oldest first [unit of r]
 * @param hourStartMs the hours' starts [ms]; omitted: the hours are taken as consecutive
 * @returns phi [-], sigma_e [unit of r], pairs used
 * @see G. E. P. Box, G. M. Jenkins, G. C. Reinsel, Time Series Analysis, 4th ed. (2008), 7.1 (conditional
 *      least squares for autoregressive models), from memory.
 */
export function fitAr1(residuals: ArrayLike<number>, hourStartMs?: ArrayLike<number>): Ar1Fit {
  const n = residuals.length;
  if (hourStartMs && hourStartMs.length !== n) throw new RangeError(`fitAr1: ${n} residuals but ${hourStartMs.length} hour starts`);
  let sxy = 0;
  let sxx = 0;
  let pairs = 0;
  eachHourPair(residuals, hourStartMs, (a, b) => {
    sxy += a * b;
    sxx += a * a;
    pairs++;
  });
  if (pairs < MIN_AR1_PAIRS || !(sxx > 0)) {
    let ss = 0;
    let m = 0;
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(residuals[i])) continue;
      ss += residuals[i] ** 2;
      m++;
    }
    return { phi: 0, sInnovation: m > 1 ? Math.sqrt(ss / (m - 1)) : NaN, pairs, n };
  }
  const phi = Math.max(-PHI_MAX, Math.min(PHI_MAX, sxy / sxx));
  let sse = 0;
  eachHourPair(residuals, hourStartMs, (a, b) => {
    sse += (b - phi * a) ** 2;
  });
  return { phi, sInnovation: Math.sqrt(sse / (pairs - 1)), pairs, n };
}

/** What the pre-whitening needs of a fit. */
export interface Ar1Model {
  phi: number;
  sInnovation: number;
}

/**
 * The standardised innovation of one hour: (r - phi^g r_prev) / (sigma_e sqrt((1 - phi^(2g)) / (1 - phi^2))),
 * g the hours since the previous steady hour. With phi = 0, or no previous hour, it is r over the
 * stationary spread sigma_e / sqrt(1 - phi^2).
 *
 * @param r the hour's residual [unit of r]
 * @param prev the previous steady hour's residual and how many hours back it is (>= 1), or null
 * @param model phi [-] and sigma_e [unit of r]
 * @returns the innovation in units of its own spread [-]: N(0, 1) in control when the model holds
 */
export function ar1Innovation(r: number, prev: { r: number; hoursBack: number } | null, model: Ar1Model): number {
  const { phi, sInnovation } = model;
  if (!(sInnovation > 0)) throw new RangeError(`ar1Innovation needs a positive innovation spread (got ${sInnovation})`);
  if (!(Math.abs(phi) < 1)) throw new RangeError(`ar1Innovation needs |phi| < 1 (got ${phi})`);
  const stationaryVar = 1 / (1 - phi * phi);
  if (!prev || phi === 0 || !Number.isFinite(prev.r)) return r / (sInnovation * Math.sqrt(stationaryVar));
  const g = Math.max(1, Math.round(prev.hoursBack));
  const pg = phi ** g;
  const v = (1 - pg * pg) * stationaryVar;
  return (r - pg * prev.r) / (sInnovation * Math.sqrt(v));
}

/**
 * Standardised innovations of a series of steady hours (see ar1Innovation).
 * @param residuals residuals, oldest first [unit of r]
 * @param hourStartMs their hour starts [ms]; omitted: consecutive hours
 * @param model phi [-], sigma_e [unit of r]
 */
export function prewhiten(residuals: ArrayLike<number>, hourStartMs: ArrayLike<number> | undefined, model: Ar1Model): number[] {
  const out: number[] = [];
  for (let i = 0; i < residuals.length; i++) {
    const prev = i === 0 ? null : { r: residuals[i - 1], hoursBack: hourStartMs ? (hourStartMs[i] - hourStartMs[i - 1]) / HOUR_MS : 1 };
    out.push(ar1Innovation(residuals[i], prev, model));
  }
  return out;
}

/**
 * Effective number of independent hours in a mean of n consecutive hourly residuals of an AR(1)
 * series: n_eff = sigma^2 / Var(mean) with the exact variance of the mean,
 * Var(mean) = sigma^2 / n [ (1 + phi) / (1 - phi) - 2 phi (1 - phi^n) / (n (1 - phi)^2) ],
 * which tends to n (1 - phi) / (1 + phi) for large n.
 *
 * For hours that are not consecutive (gaps between steady hours) the correlation is weaker, so the
 * figure is on the safe side (too few effective hours, too wide an uncertainty).
 *
 * @param n hours in the mean (>= 1)
 * @param phi lag-one autocorrelation [-], |phi| < 1; 0 gives n
 * @returns n_eff [-], between 0 and n for phi >= 0
 * @see G. E. P. Box, G. M. Jenkins, G. C. Reinsel, Time Series Analysis, 4th ed. (2008), 2.1.6 (variance of the
 *      mean of an autocorrelated series), from memory; D. C. Montgomery, Introduction to Statistical Quality
 *      Control, 6th ed. (2009), 10.4, from memory.
 */
export function ar1EffectiveSampleSize(n: number, phi: number): number {
  if (!(n >= 1)) throw new RangeError(`ar1EffectiveSampleSize needs n >= 1 (got ${n})`);
  if (!(Math.abs(phi) < 1)) throw new RangeError(`ar1EffectiveSampleSize needs |phi| < 1 (got ${phi})`);
  if (phi === 0) return n;
  const factor = (1 + phi) / (1 - phi) - (2 * phi * (1 - phi ** n)) / (n * (1 - phi) ** 2);
  return n / factor;
}

/**
 * Standard uncertainty of the mean of n consecutive hourly residuals of spread sigma with lag-one
 * autocorrelation phi: sigma / sqrt(n_eff) (ar1EffectiveSampleSize). Multiply by a coverage factor
 * (k = 2, docs/domain.md section 7) for an expanded uncertainty.
 *
 * @param n hours in the mean (>= 1)
 * @param sigma spread of one hour's residual (the baseline's residual spread s) [unit of r]
 * @param phi lag-one autocorrelation [-] (the baseline's stats.phi; 0 when the baseline has none)
 * @returns standard uncertainty of the mean [unit of r]
 */
export function ar1MeanUncertainty(n: number, sigma: number, phi: number): number {
  return sigma / Math.sqrt(ar1EffectiveSampleSize(n, phi));
}
