/**
 * LU decomposition with partial (row) pivoting, P A = L U, for complex square
 * matrices (Doolittle form, common practice: Golub & Van Loan, Matrix
 * Computations, §3.4). L has a unit diagonal; both factors share one array.
 *
 * `singular` is true when a pivot is numerically zero, |u_kk| ≤ n·ε·max|A_ij|
 * (ε = 2⁻⁵²): the factorisation then exists but solves would amplify rounding
 * beyond any meaning, so `solve` refuses.
 */
import type { Complex, ComplexMatrix } from './complex-matrix.ts';
import { maxAbs, zeros } from './complex-matrix.ts';
import { assertSquareFinite, MatrixInputError } from './checks.ts';

export class LuDecomposition {
  readonly singular: boolean;
  readonly determinant: Complex;
  /** Row permutation: row i of P A is row pivot[i] of A. */
  readonly pivot: Int32Array;
  private readonly lu: ComplexMatrix;
  private readonly smallestPivot: number;

  constructor(a: ComplexMatrix) {
    assertSquareFinite('LuDecomposition', a);
    const n = a.rows;
    const lu = { rows: n, cols: n, re: a.re.slice(), im: a.im.slice() };
    const r = lu.re, im = lu.im;
    const pivot = new Int32Array(n);
    for (let i = 0; i < n; i++) pivot[i] = i;
    const threshold = n * 2 ** -52 * maxAbs(a);
    let detRe = 1, detIm = 0;
    let smallest = Infinity;
    for (let k = 0; k < n; k++) {
      // Pivot by squared modulus (same order as the modulus, without a square root per candidate).
      let p = k, best2 = -1;
      for (let i = k; i < n; i++) {
        const x = r[i * n + k], y = im[i * n + k];
        const v2 = x * x + y * y;
        if (v2 > best2) {
          best2 = v2;
          p = i;
        }
      }
      if (!(best2 > 1e-290 && best2 < 1e290)) {
        // Squares under- or overflow: compare the moduli themselves.
        let bestAbs = -1;
        for (let i = k; i < n; i++) {
          const v = Math.hypot(r[i * n + k], im[i * n + k]);
          if (v > bestAbs) {
            bestAbs = v;
            p = i;
          }
        }
      }
      const best = Math.hypot(r[p * n + k], im[p * n + k]);
      if (p !== k) {
        for (let j = 0; j < n; j++) {
          const s = k * n + j, t = p * n + j;
          let x = r[s]; r[s] = r[t]; r[t] = x;
          x = im[s]; im[s] = im[t]; im[t] = x;
        }
        const x = pivot[k]; pivot[k] = pivot[p]; pivot[p] = x;
        detRe = -detRe;
        detIm = -detIm;
      }
      const ur = r[k * n + k], ui = im[k * n + k];
      smallest = Math.min(smallest, best);
      const nr = detRe * ur - detIm * ui;
      detIm = detRe * ui + detIm * ur;
      detRe = nr;
      if (best === 0) continue;
      const den = ur * ur + ui * ui;
      const invr = ur / den, invi = -ui / den;
      for (let i = k + 1; i < n; i++) {
        const q = i * n + k;
        const lr = r[q] * invr - im[q] * invi;
        const li = r[q] * invi + im[q] * invr;
        r[q] = lr;
        im[q] = li;
        if (lr === 0 && li === 0) continue;
        const ri = i * n, rk = k * n;
        for (let j = k + 1; j < n; j++) {
          const xr = r[rk + j], xi = im[rk + j];
          r[ri + j] -= lr * xr - li * xi;
          im[ri + j] -= lr * xi + li * xr;
        }
      }
    }
    this.lu = lu;
    this.pivot = pivot;
    this.smallestPivot = n === 0 ? Infinity : smallest;
    this.singular = n > 0 && smallest <= threshold;
    this.determinant = { re: detRe, im: detIm };
  }

  /** X with A X = B (B has n rows, any number of columns). */
  solve(b: ComplexMatrix): ComplexMatrix {
    const n = this.lu.rows;
    if (b.rows !== n) throw new MatrixInputError('LuDecomposition.solve', `right-hand side has ${b.rows} rows, the matrix is ${n}×${n}`);
    if (this.singular) {
      throw new MatrixInputError(
        'LuDecomposition.solve',
        `matrix is numerically singular (smallest pivot ${this.smallestPivot.toExponential(3)}); the system has no unique solution`,
      );
    }
    const m = b.cols;
    const x = zeros(n, m);
    const xr = x.re, xi = x.im, r = this.lu.re, im = this.lu.im;
    for (let i = 0; i < n; i++) {
      const src = this.pivot[i] * m;
      for (let j = 0; j < m; j++) {
        xr[i * m + j] = b.re[src + j];
        xi[i * m + j] = b.im[src + j];
      }
    }
    // Forward substitution with unit-diagonal L.
    for (let k = 0; k < n; k++) {
      for (let i = k + 1; i < n; i++) {
        const lr = r[i * n + k], li = im[i * n + k];
        if (lr === 0 && li === 0) continue;
        for (let j = 0; j < m; j++) {
          const yr = xr[k * m + j], yi = xi[k * m + j];
          xr[i * m + j] -= lr * yr - li * yi;
          xi[i * m + j] -= lr * yi + li * yr;
        }
      }
    }
    // Back substitution with U.
    for (let k = n - 1; k >= 0; k--) {
      const ur = r[k * n + k], ui = im[k * n + k];
      const den = ur * ur + ui * ui;
      const invr = ur / den, invi = -ui / den;
      for (let j = 0; j < m; j++) {
        const yr = xr[k * m + j], yi = xi[k * m + j];
        xr[k * m + j] = yr * invr - yi * invi;
        xi[k * m + j] = yr * invi + yi * invr;
      }
      for (let i = 0; i < k; i++) {
        const cr = r[i * n + k], ci = im[i * n + k];
        if (cr === 0 && ci === 0) continue;
        for (let j = 0; j < m; j++) {
          const yr = xr[k * m + j], yi = xi[k * m + j];
          xr[i * m + j] -= cr * yr - ci * yi;
          xi[i * m + j] -= cr * yi + ci * yr;
        }
      }
    }
    return x;
  }

  /**
   * A⁻¹. Solves L U Y = 1 (so Y = (PA)⁻¹) exploiting that L⁻¹ is lower triangular,
   * then permutes columns: A⁻¹ = Y P.
   */
  inverse(): ComplexMatrix {
    const n = this.lu.rows;
    if (this.singular) {
      throw new MatrixInputError(
        'LuDecomposition.inverse',
        `matrix is numerically singular (smallest pivot ${this.smallestPivot.toExponential(3)}); it has no inverse`,
      );
    }
    const yr = new Float64Array(n * n), yi = new Float64Array(n * n);
    const r = this.lu.re, im = this.lu.im;
    for (let i = 0; i < n; i++) yr[i * n + i] = 1;
    // Forward substitution: row i of L⁻¹ has entries only in columns ≤ i.
    for (let i = 1; i < n; i++) {
      const ri = i * n;
      for (let k = 0; k < i; k++) {
        const lr = r[ri + k], li = im[ri + k];
        if (lr === 0 && li === 0) continue;
        const rk = k * n;
        for (let j = 0; j <= k; j++) {
          const ar = yr[rk + j], ai = yi[rk + j];
          yr[ri + j] -= lr * ar - li * ai;
          yi[ri + j] -= lr * ai + li * ar;
        }
      }
    }
    // Back substitution with U, full rows.
    for (let k = n - 1; k >= 0; k--) {
      const rk = k * n;
      for (let c = k + 1; c < n; c++) {
        const ur = r[rk + c], ui = im[rk + c];
        if (ur === 0 && ui === 0) continue;
        const rc = c * n;
        for (let j = 0; j < n; j++) {
          const ar = yr[rc + j], ai = yi[rc + j];
          yr[rk + j] -= ur * ar - ui * ai;
          yi[rk + j] -= ur * ai + ui * ar;
        }
      }
      const ur = r[rk + k], ui = im[rk + k];
      const den = ur * ur + ui * ui;
      const invr = ur / den, invi = -ui / den;
      for (let j = 0; j < n; j++) {
        const ar = yr[rk + j], ai = yi[rk + j];
        yr[rk + j] = ar * invr - ai * invi;
        yi[rk + j] = ar * invi + ai * invr;
      }
    }
    const x = zeros(n, n);
    for (let row = 0; row < n; row++) {
      for (let i = 0; i < n; i++) {
        const dst = row * n + this.pivot[i];
        x.re[dst] = yr[row * n + i];
        x.im[dst] = yi[row * n + i];
      }
    }
    return x;
  }
}
