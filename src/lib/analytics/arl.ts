/**
 * Average run length (ARL) of the tabular CUSUM for independent normal observations, by the Markov
 * chain method of Brook & Evans (1972): the interval [0, h) of the statistic is cut into m states
 * (state 0 holds C below w/2, state j holds C within w/2 of j w, w = 2h / (2m - 1)); C >= h is the
 * absorbing state. With R the transitions among the transient states, the ARLs from every start are
 * (I - R)^-1 1, and the ARL from a fresh start is its first entry. The error falls as 1/m^2, so two
 * sizes of m are combined by Richardson extrapolation.
 *
 * Observations are N(delta, 1) (in units of their standard deviation); the one-sided upper CUSUM
 * C_i = max(0, C_(i-1) + x_i - k) signals when C_i > h. The two-sided scheme's ARL follows from the
 * one-sided ones as 1/ARL = 1/ARL+ + 1/ARL- (Van Dobben de Bruyn 1968; a close approximation for the
 * usual k = 0.5, exact in the in-control case by symmetry only to that approximation; Montgomery 6th ed.
 * section 9.1, from memory). `npm run bench:drift` checks it by simulation.
 *
 * @see D. Brook and D. A. Evans, "An approach to the probability distribution of CUSUM run length",
 *      Biometrika 59 (1972) 539-549.
 * @see D. M. Hawkins and D. H. Olwell, Cumulative Sum Charts and Charting for Quality Improvement (Springer, 1998).
 */

/** Standard normal distribution function, 0.5 erfc(-x / sqrt 2) to about 1e-15. */
export function normalCdf(x: number): number {
  return 0.5 * erfc(-x / Math.SQRT2);
}

function erfc(x: number): number {
  // ARLs near 1e4 need tail probabilities to many digits: the Maclaurin series of erf below 2, the
  // continued fraction of erfc (Abramowitz & Stegun 7.1.14) above.
  const z = Math.abs(x);
  let r: number;
  if (z < 2) {
    // series of erf: erf z = 2/sqrt(pi) sum (-1)^n z^(2n+1) / (n! (2n+1))
    let sum = z;
    let term = z;
    for (let n = 1; n < 200; n++) {
      term *= (-z * z) / n;
      const add = term / (2 * n + 1);
      sum += add;
      if (Math.abs(add) < 1e-17 * Math.abs(sum)) break;
    }
    r = 1 - (2 / Math.sqrt(Math.PI)) * sum;
  } else {
    // continued fraction (Lentz) of erfc z = exp(-z^2)/sqrt(pi) * 1/(z + 1/2/(z + 1/(z + 3/2/(z + ...))))
    const tiny = 1e-300;
    let f = z;
    let C = z;
    let D = 0;
    for (let n = 1; n < 500; n++) {
      const a = n / 2;
      D = z + a * D;
      D = D === 0 ? tiny : D;
      C = z + a / C;
      C = C === 0 ? tiny : C;
      D = 1 / D;
      const delta = C * D;
      f *= delta;
      if (Math.abs(delta - 1) < 1e-16) break;
    }
    r = Math.exp(-z * z) / Math.sqrt(Math.PI) / f;
  }
  return x >= 0 ? r : 2 - r;
}

/** Solves A x = b in place by Gaussian elimination with partial pivoting (A n x n, row-major Float64Array). */
function solve(A: Float64Array, b: Float64Array, n: number): Float64Array {
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(A[r * n + c]) > Math.abs(A[piv * n + c])) piv = r;
    if (piv !== c) {
      for (let j = 0; j < n; j++) {
        const t = A[c * n + j];
        A[c * n + j] = A[piv * n + j];
        A[piv * n + j] = t;
      }
      const t = b[c];
      b[c] = b[piv];
      b[piv] = t;
    }
    const d = A[c * n + c];
    for (let r = c + 1; r < n; r++) {
      const f = A[r * n + c] / d;
      if (f === 0) continue;
      for (let j = c; j < n; j++) A[r * n + j] -= f * A[c * n + j];
      b[r] -= f * b[c];
    }
  }
  const x = new Float64Array(n);
  for (let r = n - 1; r >= 0; r--) {
    let s = b[r];
    for (let j = r + 1; j < n; j++) s -= A[r * n + j] * x[j];
    x[r] = s / A[r * n + r];
  }
  return x;
}

/** One-sided ARL by the Brook-Evans chain with m transient states (no extrapolation). */
export function cusumArlMarkovRaw(k: number, h: number, delta: number, m: number): number {
  const w = (2 * h) / (2 * m - 1);
  const A = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    // from state i (C = i w): next C = max(0, i w + x - k), x ~ N(delta, 1)
    const F = (c: number) => normalCdf(c - delta);
    A[i * m] -= F(k - i * w + w / 2);
    for (let j = 1; j < m; j++) A[i * m + j] -= F(k + (j - i + 0.5) * w) - F(k + (j - i - 0.5) * w);
    A[i * m + i] += 1;
  }
  const x = solve(A, new Float64Array(m).fill(1), m);
  return x[0];
}

/**
 * One-sided CUSUM ARL from a fresh start (C_0 = 0), Brook & Evans (1972) with Richardson extrapolation
 * over m and 2m states.
 * @param k reference value [sigma]
 * @param h decision interval [sigma]
 * @param delta mean shift of the observations [sigma] (0: in control)
 * @param m states of the coarser chain; default 100 (within about 4e-6 of a 1600-state chain for h <= 8)
 * @returns the average run length [observations]
 */
export function cusumArl(k: number, h: number, delta = 0, m = 100): number {
  if (!(k >= 0) || !(h > 0) || !Number.isFinite(delta)) throw new RangeError(`cusumArl needs k >= 0, h > 0 and a finite shift (got k = ${k}, h = ${h}, delta = ${delta})`);
  const a = cusumArlMarkovRaw(k, h, delta, m);
  const b = cusumArlMarkovRaw(k, h, delta, 2 * m);
  return (4 * b - a) / 3;
}

/**
 * Two-sided CUSUM ARL (upper and lower schemes together), from the one-sided ones:
 * 1/ARL = 1/ARL+(delta) + 1/ARL-(delta), with ARL-(delta) = ARL+(-delta).
 */
export function cusumArlTwoSided(k: number, h: number, delta = 0, m = 100): number {
  const up = cusumArl(k, h, delta, m);
  const down = cusumArl(k, h, -delta, m);
  return 1 / (1 / up + 1 / down);
}
