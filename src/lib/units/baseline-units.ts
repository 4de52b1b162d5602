/**
 * A baseline's coefficients in the site's display units. The fit is kept in SI (load in W or kg/s,
 * T_amb = T0 in K, destruction in W, efficiency as a fraction); the page shows the same curve with
 * load, T_amb and the result in the units the engineer reads (kW per t/h, per °C, %), by substituting
 * load = load' / a and T = T' - o into the polynomial and collecting terms. Pure.
 */
import type { BaselineTerm } from '../analytics/baseline';

export type Coefficients = Partial<Record<BaselineTerm | 'intercept', number>>;

/**
 * @param c coefficients in SI, per term ('intercept', 'load', 'T_amb', 'load^2', 'T_amb^2', 'load*T_amb')
 * @param a load' = a * load (display per SI unit of load)
 * @param o T' = T + o (offset of the shown temperature scale: -273.15 for °C, 0 for K)
 * @param b y' = b * y (display per SI unit of the result)
 * @returns the coefficients of the same polynomial in load', T' and y'; a term that gets a non-zero
 *          coefficient only by the shift (load when load*T_amb is fitted) is included
 */
export function coefficientsInDisplay(c: Coefficients, a: number, o: number, b: number): Coefficients {
  const k = (t: BaselineTerm | 'intercept') => c[t] ?? 0;
  const out: Coefficients = {
    intercept: b * (k('intercept') - k('T_amb') * o + k('T_amb^2') * o * o),
    load: (b * (k('load') - k('load*T_amb') * o)) / a,
    T_amb: b * (k('T_amb') - 2 * k('T_amb^2') * o),
    'load^2': (b * k('load^2')) / (a * a),
    'T_amb^2': b * k('T_amb^2'),
    'load*T_amb': (b * k('load*T_amb')) / a,
  };
  for (const t of Object.keys(out) as (keyof Coefficients)[]) if (c[t] === undefined && out[t] === 0) delete out[t];
  return out;
}

/** The polynomial's value at (load, T) for checks: c in any consistent units. */
export function evaluate(c: Coefficients, load: number, T: number): number {
  const k = (t: BaselineTerm | 'intercept') => c[t] ?? 0;
  return k('intercept') + k('load') * load + k('T_amb') * T + k('load^2') * load * load + k('T_amb^2') * T * T + k('load*T_amb') * load * T;
}
