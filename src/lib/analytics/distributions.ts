/**
 * Special functions for coverage factors: log-gamma, the regularised incomplete beta function,
 * Student's t distribution function and its quantile.
 *
 * @see W. H. Press et al., Numerical Recipes, 3rd ed. (2007), sections 6.1 (Lanczos gamma) and
 *      6.4 (incomplete beta by continued fraction, modified Lentz).
 * @see C. Lanczos, SIAM J. Numer. Anal. B1 (1964) 86-96.
 */

const LANCZOS_G = 7;
const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** ln Gamma(x) for x > 0 (Lanczos, g = 7, n = 9; about 15 significant digits). */
export function lnGamma(x: number): number {
  if (!(x > 0)) throw new RangeError(`lnGamma: x = ${x} must be > 0`);
  if (x < 0.5) {
    // reflection: Gamma(x) Gamma(1 - x) = pi / sin(pi x)
    return Math.log(Math.PI / Math.sin(Math.PI * x)) - lnGamma(1 - x);
  }
  const z = x - 1;
  let s = LANCZOS[0];
  for (let i = 1; i < LANCZOS.length; i++) s += LANCZOS[i] / (z + i);
  const t = z + LANCZOS_G + 0.5;
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(s);
}

function betaContinuedFraction(a: number, b: number, x: number): number {
  const TINY = 1e-300;
  const EPS = 1e-15;
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 10_000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < EPS) return h;
  }
  throw new Error(`incomplete beta continued fraction did not converge (a = ${a}, b = ${b}, x = ${x})`);
}

/** Regularised incomplete beta function I_x(a, b), 0 <= x <= 1, a, b > 0. */
export function incompleteBeta(x: number, a: number, b: number): number {
  if (!(x >= 0 && x <= 1)) throw new RangeError(`incompleteBeta: x = ${x} must be in 0..1`);
  if (x === 0 || x === 1) return x;
  const lnFront = lnGamma(a + b) - lnGamma(a) - lnGamma(b) + a * Math.log(x) + b * Math.log(1 - x);
  const front = Math.exp(lnFront);
  if (x < (a + 1) / (a + b + 2)) return (front * betaContinuedFraction(a, b, x)) / a;
  return 1 - (front * betaContinuedFraction(b, a, 1 - x)) / b;
}

/**
 * Distribution function of Student's t with nu degrees of freedom.
 * F(t) = 1 - I_{nu/(nu+t^2)}(nu/2, 1/2) / 2 for t >= 0, and symmetric.
 */
export function studentTCdf(t: number, nu: number): number {
  if (!(nu > 0)) throw new RangeError(`studentTCdf: nu = ${nu} must be > 0`);
  const tail = 0.5 * incompleteBeta(nu / (nu + t * t), nu / 2, 0.5);
  return t >= 0 ? 1 - tail : tail;
}

/**
 * Quantile of Student's t: the t with F(t) = p. Bisection on a bracket then refined to 1e-12.
 * @param p probability, 0 < p < 1 (0.975 for a two-sided 95 % interval)
 * @param nu degrees of freedom, > 0
 */
export function studentTQuantile(p: number, nu: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`studentTQuantile: p = ${p} must be in (0, 1)`);
  if (!(nu > 0)) throw new RangeError(`studentTQuantile: nu = ${nu} must be > 0`);
  if (p === 0.5) return 0;
  if (p < 0.5) return -studentTQuantile(1 - p, nu);
  let lo = 0;
  let hi = 2;
  while (studentTCdf(hi, nu) < p) {
    lo = hi;
    hi *= 2;
    if (hi > 1e12) break;
  }
  for (let i = 0; i < 200 && hi - lo > 1e-12 * Math.max(1, hi); i++) {
    const mid = 0.5 * (lo + hi);
    if (studentTCdf(mid, nu) < p) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/**
 * Coverage factor k for a two-sided interval of the given coverage probability with nu degrees of
 * freedom (t distribution; JCGM 100:2008 Annex G.3). nu = Infinity gives the normal value.
 */
export function coverageFactor(coverage: number, nu: number): number {
  if (!(coverage > 0 && coverage < 1)) throw new RangeError(`coverage = ${coverage} must be in (0, 1)`);
  const p = 0.5 + coverage / 2;
  // Beyond 1e7 degrees of freedom t and normal quantiles agree to better than 1e-7.
  return studentTQuantile(p, Number.isFinite(nu) ? Math.min(nu, 1e7) : 1e7);
}
