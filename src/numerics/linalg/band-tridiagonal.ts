/**
 * Eigenvalues of a complex Hermitian band matrix without forming it densely:
 * reduction to real symmetric tridiagonal form by Givens rotations with bulge
 * chasing (H. R. Schwarz, Numer. Math. 12, 231 (1968); the scheme of LAPACK's
 * hbtrd), then the implicit QL algorithm (tridiagonal-ql.ts).
 *
 * Column j is cleared from the bottom of its band upwards: the rotation in the
 * plane (i − 1, i) that zeroes A[i][j] also creates one entry just outside the
 * band at (i + b, i − 1); that bulge is pushed down the band, b rows per
 * rotation, until it falls off the end. Each rotation touches O(b) entries and
 * there are about n²/2 of them, so the reduction costs O(n² b) (against the
 * O(n³) of a dense Householder reduction) and O(n b) memory. The rotations are
 * not kept: eigenvectors, when needed, come from inverse iteration on the band
 * matrix itself (banded-inverse-iteration.ts). A final diagonal phase change
 * makes the subdiagonal real and non-negative, which leaves the eigenvalues
 * unchanged.
 */
import { BandedMatrix } from './banded-matrix.ts';
import { tridiagonalQl } from './tridiagonal-ql.ts';

/**
 * Ascending eigenvalues of the Hermitian band matrix `a` (only its band is read;
 * the caller guarantees Hermiticity, e.g. (W + W†)/2 of a banded W).
 */
export function bandHermitianEigenvalues(a: BandedMatrix): Float64Array {
  const { d, e } = bandToTridiagonal(a);
  tridiagonalQl(d, e, null);
  return d;
}

/** Diagonal and (real, non-negative) subdiagonal of a tridiagonal matrix unitarily similar to `a`. */
export function bandToTridiagonal(a: BandedMatrix): { d: Float64Array; e: Float64Array } {
  const n = a.n, b = a.b;
  // Working copy with room for the bulge one diagonal outside the band.
  const w = new BandedMatrix(n, Math.min(b + 1, Math.max(0, n - 1)));
  const B = w.b, W = w.width, re = w.re, im = w.im;
  for (let i = 0; i < n; i++) {
    const lo = Math.max(0, i - b), hi = Math.min(n - 1, i + b);
    for (let j = lo; j <= hi; j++) {
      const src = a.index(i, j), dst = i * W + (j - i + B);
      re[dst] = a.re[src];
      im[dst] = a.im[src];
    }
  }
  const at = (i: number, j: number) => i * W + (j - i + B);
  /** A ← G A G† with G = [[c, s], [−s̄, c]] acting on the plane (p, p + 1). */
  const rotate = (p: number, c: number, sr: number, si: number) => {
    const q = p + 1;
    const first = Math.max(0, q - B), last = Math.min(n - 1, p + B);
    // Rows p, q (left multiplication): entry (row, col) sits at row·W + col − row + B.
    let x = p * W - p + B + first, y = q * W - q + B + first;
    for (let col = first; col <= last; col++, x++, y++) {
      const xr = re[x], xi = im[x], yr = re[y], yi = im[y];
      re[x] = c * xr + (sr * yr - si * yi);
      im[x] = c * xi + (sr * yi + si * yr);
      re[y] = c * yr - (sr * xr + si * xi);
      im[y] = c * yi - (sr * xi - si * xr);
    }
    // Columns p, q (right multiplication by G†): entry (row, p) at row·W + p − row + B, stride W − 1.
    x = first * W + p - first + B;
    y = x + 1;
    for (let row = first; row <= last; row++, x += W - 1, y += W - 1) {
      const xr = re[x], xi = im[x], yr = re[y], yi = im[y];
      // new_p = c x + s̄ y, new_q = −s x + c y
      re[x] = c * xr + (sr * yr + si * yi);
      im[x] = c * xi + (sr * yi - si * yr);
      re[y] = c * yr - (sr * xr - si * xi);
      im[y] = c * yi - (sr * xi + si * xr);
    }
  };
  /** Zeroes entry (q, col) against (q − 1, col) by a rotation in the plane (q − 1, q). */
  const annihilate = (q: number, col: number): void => {
    const px = at(q - 1, col), py = at(q, col);
    const xr = re[px], xi = im[px], yr = re[py], yi = im[py];
    if (yr === 0 && yi === 0) return;
    const ax = Math.sqrt(xr * xr + xi * xi), r = Math.sqrt(ax * ax + yr * yr + yi * yi);
    let c: number, sr: number, si: number;
    if (ax === 0) {
      // x = 0: c = 0, s = 1 swaps the pair, new (x, y) = (y, 0).
      c = 0;
      sr = 1;
      si = 0;
    } else {
      // c = |x|/r, s = (x/|x|)·ȳ/r: then −s̄x + c y = 0.
      c = ax / r;
      const ur = xr / ax, ui = xi / ax;
      sr = (ur * yr + ui * yi) / r;
      si = (ui * yr - ur * yi) / r;
    }
    rotate(q - 1, c, sr, si);
    // Exact zeros where the rotation was built to produce them.
    re[py] = 0;
    im[py] = 0;
    const pt = at(col, q);
    re[pt] = 0;
    im[pt] = 0;
  };
  if (b > 1) {
    for (let j = 0; j + 2 < n; j++) {
      for (let i = Math.min(j + b, n - 1); i >= j + 2; i--) {
        annihilate(i, j);
        // Chase the bulge at (k + b, k − 1) down the band.
        for (let k = i; k + b < n; k += b) annihilate(k + b, k - 1);
      }
    }
  }
  const d = new Float64Array(n), e = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    d[i] = re[at(i, i)];
    if (i + 1 < n && B >= 1) {
      const p = at(i + 1, i);
      e[i] = Math.hypot(re[p], im[p]);
    }
  }
  return { d, e };
}
