/**
 * Pfaffian of a real skew-symmetric matrix, Pf(A)² = det(A).
 *
 * Method: Parlett–Reid tridiagonalisation by Gauss transformations with
 * symmetric pivoting (B. N. Parlett and J. K. Reid, BIT 10, 386 (1970)), in the
 * Pfaffian form described by M. Wimmer, ACM Trans. Math. Softw. 38, 30 (2012):
 * eliminating column k below row k+1 with the multipliers of row k leaves the
 * Pfaffian unchanged, each row/column swap flips its sign, and the Pfaffian of
 * the final tridiagonal skew matrix is the product of its (k, k+1) entries for
 * even k. Cost n³/3 flops; stable with the pivoting.
 */

export class PfaffianInputError extends RangeError {
  override name = 'PfaffianInputError';
}

/**
 * Pf(A) for a real skew-symmetric n×n matrix given row-major. The input is
 * checked: square, finite, and ‖A + Aᵀ‖_max ≤ tolerance·max(1, ‖A‖_max).
 */
export function realSkewPfaffian(a: ArrayLike<number>, n: number, tolerance = 1e-10): number {
  if (!Number.isInteger(n) || n < 0 || a.length !== n * n) {
    throw new PfaffianInputError(`realSkewPfaffian: expected ${n}×${n} = ${n * n} entries, got ${a.length}`);
  }
  let scale = 0, skewDefect = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const x = a[i * n + j];
      if (!Number.isFinite(x)) throw new PfaffianInputError(`realSkewPfaffian: entry (${i}, ${j}) is ${x}`);
      scale = Math.max(scale, Math.abs(x));
      skewDefect = Math.max(skewDefect, Math.abs(x + a[j * n + i]));
    }
  }
  if (skewDefect > tolerance * Math.max(1, scale)) {
    throw new PfaffianInputError(`realSkewPfaffian: matrix is not skew-symmetric (max |A + Aᵀ| = ${skewDefect.toExponential(2)})`);
  }
  if (n === 0) return 1;
  if (n % 2 === 1) return 0;
  const m = Float64Array.from(a);
  let pf = 1;
  for (let k = 0; k < n - 1; k += 2) {
    // Pivot: the largest entry of column k below the diagonal moves to row k+1.
    let kp = k + 1, best = Math.abs(m[(k + 1) * n + k]);
    for (let i = k + 2; i < n; i++) {
      const v = Math.abs(m[i * n + k]);
      if (v > best) {
        best = v;
        kp = i;
      }
    }
    if (kp !== k + 1) {
      swapRowsAndColumns(m, n, k + 1, kp);
      pf = -pf;
    }
    const pivot = m[k * n + k + 1];
    if (pivot === 0) return 0;
    pf *= pivot;
    if (k + 2 < n) {
      // τ_j = A[k, j] / A[k, k+1];  A[i, j] += τ_i A[j, k+1] − A[i, k+1] τ_j  for i, j ≥ k+2.
      const tau = new Float64Array(n);
      for (let j = k + 2; j < n; j++) tau[j] = m[k * n + j] / pivot;
      for (let i = k + 2; i < n; i++) {
        const aik = m[i * n + k + 1];
        for (let j = k + 2; j < n; j++) m[i * n + j] += tau[i] * m[j * n + k + 1] - aik * tau[j];
      }
    }
  }
  return pf;
}

function swapRowsAndColumns(m: Float64Array, n: number, p: number, q: number): void {
  for (let j = 0; j < n; j++) {
    const t = m[p * n + j];
    m[p * n + j] = m[q * n + j];
    m[q * n + j] = t;
  }
  for (let i = 0; i < n; i++) {
    const t = m[i * n + p];
    m[i * n + p] = m[i * n + q];
    m[i * n + q] = t;
  }
}
