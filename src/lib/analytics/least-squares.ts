/**
 * The linear algebra of the baselines (./baseline.ts): mean and spread of a regressor, least squares
 * by Householder QR and the inverse Gram matrix (R^T R)^-1 the prediction interval needs.
 *
 * @see G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed. (2013), 5.2 and 5.3 (Householder QR
 *      for least squares).
 */

/** Mean and population standard deviation of x. */
export function meanSd(x: ArrayLike<number>): { mean: number; sd: number } {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i];
  const mean = s / x.length;
  let ss = 0;
  for (let i = 0; i < x.length; i++) ss += (x[i] - mean) ** 2;
  return { mean, sd: Math.sqrt(ss / x.length) };
}

/**
 * Least squares by Householder QR: minimises ||A b - y||. A is n x p, row-major in rows.
 * Returns b and R (upper triangular p x p).
 * @param deficient the error to throw when column j is (nearly) a combination of the columns before it
 */
export function householderLeastSquares(rows: number[][], y: ArrayLike<number>, deficient: (j: number) => Error): { b: number[]; R: number[][] } {
  const n = rows.length;
  const p = rows[0].length;
  const A = rows.map((r) => r.slice());
  const q = Array.from(y);
  const colNorms = Array.from({ length: p }, (_, j) => Math.sqrt(A.reduce((acc, r) => acc + r[j] * r[j], 0)));
  for (let j = 0; j < p; j++) {
    let norm = 0;
    for (let i = j; i < n; i++) norm += A[i][j] * A[i][j];
    norm = Math.sqrt(norm);
    if (norm <= 1e-12 * (colNorms[j] || 1)) throw deficient(j);
    const alpha = A[j][j] > 0 ? -norm : norm;
    // v = a_j - alpha e_j (stored in column j below and on the diagonal)
    const v = new Float64Array(n - j);
    for (let i = j; i < n; i++) v[i - j] = A[i][j];
    v[0] -= alpha;
    let vv = 0;
    for (let i = 0; i < v.length; i++) vv += v[i] * v[i];
    if (vv > 0) {
      for (let c = j; c < p; c++) {
        let dot = 0;
        for (let i = j; i < n; i++) dot += v[i - j] * A[i][c];
        const f = (2 * dot) / vv;
        for (let i = j; i < n; i++) A[i][c] -= f * v[i - j];
      }
      let dot = 0;
      for (let i = j; i < n; i++) dot += v[i - j] * q[i];
      const f = (2 * dot) / vv;
      for (let i = j; i < n; i++) q[i] -= f * v[i - j];
    }
  }
  const R = Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, c) => (c >= i ? A[i][c] : 0)));
  const b = new Array<number>(p).fill(0);
  for (let i = p - 1; i >= 0; i--) {
    let s = q[i];
    for (let c = i + 1; c < p; c++) s -= R[i][c] * b[c];
    b[i] = s / R[i][i];
  }
  return { b, R };
}

/** (R^T R)^-1 = R^-1 R^-T for upper-triangular R. */
export function inverseGram(R: number[][]): number[][] {
  const p = R.length;
  const Rinv = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let c = 0; c < p; c++) {
    Rinv[c][c] = 1 / R[c][c];
    for (let i = c - 1; i >= 0; i--) {
      let s = 0;
      for (let k = i + 1; k <= c; k++) s += R[i][k] * Rinv[k][c];
      Rinv[i][c] = -s / R[i][i];
    }
  }
  const G = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < p; j++) {
      let s = 0;
      for (let k = Math.max(i, j); k < p; k++) s += Rinv[i][k] * Rinv[j][k];
      G[i][j] = s;
    }
  }
  return G;
}
