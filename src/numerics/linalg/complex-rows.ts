/**
 * Complex vectors stored as rows of split real/imaginary arrays (row k of a
 * group at offset k·n), the layout of the eigenvector groups of the banded
 * routes: inner product, norm and the projection that Gram–Schmidt repeats.
 */

/** out ← (a†b) for the rows at offsets ao of (ar, ai) and bo of (br, bi), length n. */
export function innerProductInto(out: Float64Array, ar: Float64Array, ai: Float64Array, ao: number, br: Float64Array, bi: Float64Array, bo: number, n: number): void {
  let sr = 0, si = 0;
  for (let r = 0; r < n; r++) {
    const xr = ar[ao + r], xi = ai[ao + r], yr = br[bo + r], yi = bi[bo + r];
    sr += xr * yr + xi * yi;
    si += xr * yi - xi * yr;
  }
  out[0] = sr;
  out[1] = si;
}

/** Euclidean norm of the row at offset o, length n. */
export function rowNorm(re: Float64Array, im: Float64Array, o: number, n: number): number {
  let s = 0;
  for (let r = 0; r < n; r++) s += re[o + r] * re[o + r] + im[o + r] * im[o + r];
  return Math.sqrt(s);
}

/** x ← x − q (q†x) for the unit row q at offset qo of (qr, qi) and the row x at offset xo of (xr, xi). */
export function projectOut(qr: Float64Array, qi: Float64Array, qo: number, xr: Float64Array, xi: Float64Array, xo: number, n: number): void {
  // q†x summed here rather than through innerProductInto: this runs once per vector pair of every
  // inverse iteration (the hottest loop of the ribbon spectra), where the extra call measurably costs.
  let sr = 0, si = 0;
  for (let r = 0; r < n; r++) {
    const ar = qr[qo + r], ai = qi[qo + r], br = xr[xo + r], bi = xi[xo + r];
    sr += ar * br + ai * bi;
    si += ar * bi - ai * br;
  }
  for (let r = 0; r < n; r++) {
    const ar = qr[qo + r], ai = qi[qo + r];
    xr[xo + r] -= ar * sr - ai * si;
    xi[xo + r] -= ar * si + ai * sr;
  }
}

/** The columns of v (n × m, row-major) as m contiguous rows of length n. */
export function columnsAsRows(v: { rows: number; cols: number; re: Float64Array; im: Float64Array }): { re: Float64Array; im: Float64Array } {
  const n = v.rows, m = v.cols;
  const re = new Float64Array(m * n), im = new Float64Array(m * n);
  for (let r = 0; r < n; r++) {
    for (let j = 0; j < m; j++) {
      re[j * n + r] = v.re[r * m + j];
      im[j * n + r] = v.im[r * m + j];
    }
  }
  return { re, im };
}

/**
 * Upper bound on ‖V†V − 1‖_F for approximate eigenvectors of a normal matrix,
 * stored as rows: the explicit Gram entry for pairs whose eigenvalues lie closer
 * than `window`, and (r_i + r_j)/d_ij for every other pair (d_ij the distance of
 * the eigenvalues, r the residuals); `norm2` holds the squared row norms.
 * The callers certify eigenvectors of the banded routes with it
 * (unitary-eigen.ts, banded-hermitian-eigen.ts).
 */
export function gramDefectBound(
  re: Float64Array,
  im: Float64Array,
  n: number,
  norm2: Float64Array,
  residuals: Float64Array,
  distance: (i: number, j: number) => number,
  window: number,
): number {
  const m = norm2.length;
  const g = new Float64Array(2);
  let total = 0;
  for (let i = 0; i < m; i++) {
    total += (norm2[i] - 1) ** 2;
    for (let j = i + 1; j < m; j++) {
      const d = distance(i, j);
      let g2: number;
      if (d < window) {
        innerProductInto(g, re, im, i * n, re, im, j * n, n);
        g2 = g[0] * g[0] + g[1] * g[1];
      } else {
        const bound = (residuals[i] + residuals[j]) / d;
        g2 = bound * bound;
      }
      total += 2 * g2;
    }
  }
  return Math.sqrt(total);
}
