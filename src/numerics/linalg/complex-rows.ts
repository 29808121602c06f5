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

const coefficient = new Float64Array(2);

/** x ← x − q (q†x) for the unit row q at offset qo of (qr, qi) and the row x at offset xo of (xr, xi). */
export function projectOut(qr: Float64Array, qi: Float64Array, qo: number, xr: Float64Array, xi: Float64Array, xo: number, n: number): void {
  innerProductInto(coefficient, qr, qi, qo, xr, xi, xo, n);
  const sr = coefficient[0], si = coefficient[1];
  for (let r = 0; r < n; r++) {
    const ar = qr[qo + r], ai = qi[qo + r];
    xr[xo + r] -= ar * sr - ai * si;
    xi[xo + r] -= ar * si + ai * sr;
  }
}
