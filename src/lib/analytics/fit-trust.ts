/**
 * Whether a baseline fit can be trusted, and whether it may be accepted at all. An hourly regression
 * on a day or two of hours can show R² near 1 and CV(RMSE) far inside the ASHRAE Guideline 14-2014
 * limits (docs/domain.md section 7) simply because it saw little: few hours against its number of
 * coefficients, or a load that hardly moved. Guideline 14 asks that the baseline period cover the
 * full range of the independent variables; it gives no fixed count of hours for hourly models, so
 * the figures here are *common practice* defaults, named as such on the page. Pure; no I/O.
 */
import type { BaselineModel } from './baseline';
import { fixed } from '../format';

export const FIT_TRUST = {
  /**
   * Fewest steady hours per fitted coefficient (intercept included) to accept a baseline at all
   * [h]: the rule of thumb of about ten observations per estimated parameter, *common practice*.
   */
  minHoursPerCoefficient: 10,
  /** Fewest steady hours to accept a baseline at all [h]: one full day of the daily cycle, *common practice*. */
  minAcceptHours: 24,
  /**
   * Fewest steady hours for a fit to be trusted without a warning [h]: one week, so that every hour
   * of the day and every day of the week is in it, *common practice*.
   */
  trustedHours: 168,
  /** Least spread of load, its standard deviation over its mean [-], for a trusted fit: 5 %, *common practice*. */
  minLoadCv: 0.05,
} as const;

export interface FitTrust {
  /** The fit may be accepted (enough hours for its coefficients). */
  acceptable: boolean;
  /** No warning at all: enough hours and enough spread of load. */
  trusted: boolean;
  /** Fewest hours this fit needs to be accepted [h]. */
  minHours: number;
  /** Load spread, standard deviation over mean [-]; null when the mean load is zero. */
  loadCv: number | null;
  /** Sentences a page shows, one per concern (empty when trusted). */
  warnings: string[];
}

const pct = (x: number) => `${fixed(100 * x, 1)} %`;
const hoursOf = (n: number) => fixed(n, 0);

/** The trust of a fitted model (its observation count, coefficient count and load spread). */
export function fitTrust(model: Pick<BaselineModel, 'stats' | 'centre' | 'scale' | 'terms'>): FitTrust {
  const { n, p } = model.stats;
  const minHours = Math.max(FIT_TRUST.minAcceptHours, FIT_TRUST.minHoursPerCoefficient * p);
  const mean = Math.abs(model.centre.load);
  // The scale is the load's standard deviation when the model has load terms (without them the fit
  // stores 1 for a load that did not vary, which says nothing: no load check then).
  const usesLoad = model.terms.some((t) => t.includes('load'));
  const loadCv = usesLoad && mean > 0 ? model.scale.load / mean : null;
  const warnings: string[] = [];
  const acceptable = n >= minHours;
  if (!acceptable) {
    warnings.push(
      `Fitted on ${hoursOf(n)} steady hours for ${p} coefficients: at least ${hoursOf(minHours)} are needed to accept it (${FIT_TRUST.minHoursPerCoefficient} hours per coefficient, and no fewer than ${FIT_TRUST.minAcceptHours}; common practice). Choose a longer reference period.`,
    );
  } else if (n < FIT_TRUST.trustedHours) {
    warnings.push(
      `Fitted on only ${hoursOf(n)} steady hours, less than a week (${FIT_TRUST.trustedHours} h; common practice): R² and the Guideline 14 figures look better than the baseline will do on new hours.`,
    );
  }
  if (loadCv !== null && loadCv < FIT_TRUST.minLoadCv) {
    warnings.push(
      `The load hardly varied in the reference period (spread ${pct(loadCv)} of its mean, under ${pct(FIT_TRUST.minLoadCv)}; common practice): the baseline says little about other loads.`,
    );
  }
  return { acceptable, trusted: warnings.length === 0, minHours, loadCv, warnings };
}

/** The trust of a baseline: the weaker of its models (destruction, and efficiency when it has one). */
export function baselineTrust(destruction: Pick<BaselineModel, 'stats' | 'centre' | 'scale' | 'terms'>, efficiency: Pick<BaselineModel, 'stats' | 'centre' | 'scale' | 'terms'> | null): FitTrust {
  const d = fitTrust(destruction);
  if (!efficiency) return d;
  const e = fitTrust(efficiency);
  return {
    acceptable: d.acceptable && e.acceptable,
    trusted: d.trusted && e.trusted,
    minHours: Math.max(d.minHours, e.minHours),
    loadCv: d.loadCv,
    warnings: [...new Set([...d.warnings, ...e.warnings])],
  };
}
