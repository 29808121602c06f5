/**
 * Eigen-decomposition of a complex Hermitian matrix, A = V Λ V†.
 *
 * Method (common practice, cf. Golub & Van Loan, Matrix Computations, §8.3):
 * 1. Householder reduction to Hermitian tridiagonal form T = Q† A Q, one
 *    reflector H = 1 − τ v v† per column, applied as the rank-2 update
 *    B ← B − v w† − w v† (w = p − (τ v†p/2) v, p = τ B v).
 * 2. A diagonal unitary D makes the subdiagonal real and non-negative:
 *    S = D† T D is real symmetric tridiagonal.
 * 3. Implicit QL with Wilkinson shifts on S (tridiagonal-ql.ts): S = Z Λ Zᵀ.
 * 4. Back-transform: V = Q D Z.
 * 1×1 and 2×2 matrices use closed forms. The input is checked at the boundary
 * (square, finite, Hermitian to a relative tolerance) and then symmetrised.
 */
import type { ComplexMatrix } from './complex-matrix.ts';
import { zeros } from './complex-matrix.ts';
import { assertHermitian, DEFAULT_HERMITICITY_TOLERANCE } from './checks.ts';
import { tridiagonalQl } from './tridiagonal-ql.ts';

export interface HermitianEigenOptions {
  /** Compute eigenvectors (default true). */
  vectors?: boolean;
  /** Accepted ‖A − A†‖_F relative to max(1, ‖A‖_F) (default 1e-10). */
  hermiticityTolerance?: number;
}

export class HermitianEigen {
  /** Eigenvalues in ascending order. */
  readonly values: Float64Array;
  private readonly eigenvectors: ComplexMatrix | null;

  constructor(a: ComplexMatrix, options: HermitianEigenOptions = {}) {
    assertHermitian('HermitianEigen', a, options.hermiticityTolerance ?? DEFAULT_HERMITICITY_TOLERANCE);
    const wantVectors = options.vectors ?? true;
    const n = a.rows;
    if (n <= 2) {
      const { values, vectors } = smallHermitianEigen(a);
      this.values = values;
      this.eigenvectors = wantVectors ? vectors : null;
      return;
    }
    const result = householderQl(a, wantVectors);
    this.values = result.values;
    this.eigenvectors = result.vectors;
  }

  /** Orthonormal eigenvectors as columns, in the order of `values`. */
  get vectors(): ComplexMatrix {
    if (this.eigenvectors === null) {
      throw new RangeError('HermitianEigen: eigenvectors were not computed; construct with { vectors: true }');
    }
    return this.eigenvectors;
  }
}

/** Closed forms for n ≤ 2: A = m + h·σ has eigenvalues m ∓ |h|. */
function smallHermitianEigen(a: ComplexMatrix): { values: Float64Array; vectors: ComplexMatrix } {
  const n = a.rows;
  if (n === 0) return { values: new Float64Array(0), vectors: zeros(0, 0) };
  if (n === 1) return { values: Float64Array.of(a.re[0]), vectors: { rows: 1, cols: 1, re: Float64Array.of(1), im: new Float64Array(1) } };
  const p = a.re[0], q = a.re[3];
  // Symmetrised off-diagonal element b = A[1][0].
  const br = 0.5 * (a.re[2] + a.re[1]);
  const bi = 0.5 * (a.im[2] - a.im[1]);
  const m = 0.5 * (p + q), h = 0.5 * (p - q);
  const babs = Math.hypot(br, bi);
  const r = Math.hypot(h, babs);
  const v = zeros(2, 2);
  if (r === 0) {
    v.re[0] = 1;
    v.re[3] = 1;
    return { values: Float64Array.of(m, m), vectors: v };
  }
  // Upper eigenvector x = (x0, x1) for m + r, chosen to avoid cancellation.
  let x0r: number, x0i: number, x1r: number, x1i: number;
  if (h >= 0) {
    x0r = h + r; x0i = 0; x1r = br; x1i = bi;
  } else {
    x0r = br; x0i = -bi; x1r = r - h; x1i = 0;
  }
  const norm = Math.hypot(x0r, x0i, x1r, x1i);
  x0r /= norm; x0i /= norm; x1r /= norm; x1i /= norm;
  // Column 0: lower eigenvector (−conj x1, conj x0); column 1: x.
  v.re[0] = -x1r; v.im[0] = x1i;
  v.re[2] = x0r; v.im[2] = -x0i;
  v.re[1] = x0r; v.im[1] = x0i;
  v.re[3] = x1r; v.im[3] = x1i;
  return { values: Float64Array.of(m - r, m + r), vectors: v };
}

function householderQl(a: ComplexMatrix, wantVectors: boolean): { values: Float64Array; vectors: ComplexMatrix | null } {
  const n = a.rows;
  // Working copy, symmetrised: B = (A + A†)/2.
  const br = new Float64Array(n * n), bi = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      br[i * n + j] = 0.5 * (a.re[i * n + j] + a.re[j * n + i]);
      bi[i * n + j] = 0.5 * (a.im[i * n + j] - a.im[j * n + i]);
    }
    bi[i * n + i] = 0;
  }
  flushNegligible(br, bi);
  const vRe: Float64Array[] = [], vIm: Float64Array[] = [], taus: number[] = [];
  const pr = new Float64Array(n), pi = new Float64Array(n);
  const subRe = new Float64Array(n), subIm = new Float64Array(n);
  for (let k = 0; k < n - 2; k++) {
    const m = n - k - 1; // length of the column below the diagonal
    const off = k + 1;
    let sigma2 = 0;
    for (let i = 0; i < m; i++) {
      const q = (off + i) * n + k;
      sigma2 += br[q] * br[q] + bi[q] * bi[q];
    }
    const x0r = br[off * n + k], x0i = bi[off * n + k];
    const x0abs = Math.hypot(x0r, x0i);
    const sigma = Math.sqrt(sigma2);
    const vr = new Float64Array(m), vi = new Float64Array(m);
    if (sigma === 0 || sigma2 - x0abs * x0abs <= 0) {
      // Column already reduced: no reflection.
      vRe.push(vr); vIm.push(vi); taus.push(0);
      subRe[k] = x0r; subIm[k] = x0i;
      continue;
    }
    const phr = x0abs === 0 ? 1 : x0r / x0abs, phi = x0abs === 0 ? 0 : x0i / x0abs;
    // v = x + phase·σ e1, so that H x = −phase·σ e1.
    for (let i = 0; i < m; i++) {
      const q = (off + i) * n + k;
      vr[i] = br[q];
      vi[i] = bi[q];
    }
    vr[0] = phr * (x0abs + sigma);
    vi[0] = phi * (x0abs + sigma);
    const tau = 1 / (sigma * (sigma + x0abs));
    subRe[k] = -phr * sigma;
    subIm[k] = -phi * sigma;
    // p = τ B v over the trailing block, reading only its lower triangle: each stored
    // B_ij (j < i) contributes B_ij v_j to p_i and conj(B_ij) v_i to p_j (as in LAPACK's zhetd2).
    pr.fill(0, 0, m);
    pi.fill(0, 0, m);
    for (let i = 0; i < m; i++) {
      const row = (off + i) * n + off;
      const vir = vr[i], vii = vi[i];
      let sr = 0, si = 0;
      for (let j = 0; j < i; j++) {
        const xr = br[row + j], xi = bi[row + j];
        sr += xr * vr[j] - xi * vi[j];
        si += xr * vi[j] + xi * vr[j];
        pr[j] += xr * vir + xi * vii;
        pi[j] += xr * vii - xi * vir;
      }
      const dr = br[row + i];
      pr[i] += sr + dr * vir;
      pi[i] += si + dr * vii;
    }
    let kr = 0;
    for (let i = 0; i < m; i++) {
      pr[i] *= tau;
      pi[i] *= tau;
      kr += vr[i] * pr[i] + vi[i] * pi[i]; // Re(v† p)
    }
    const kk = 0.5 * tau * kr;
    for (let i = 0; i < m; i++) {
      pr[i] -= kk * vr[i];
      pi[i] -= kk * vi[i];
    }
    // B ← B − v w† − w v† on the lower triangle (the upper triangle is never read again).
    for (let i = 0; i < m; i++) {
      const row = (off + i) * n + off;
      const vir = vr[i], vii = vi[i], wir = pr[i], wii = pi[i];
      for (let j = 0; j <= i; j++) {
        // v_i conj(w_j) + w_i conj(v_j)
        br[row + j] -= vir * pr[j] + vii * pi[j] + wir * vr[j] + wii * vi[j];
        bi[row + j] -= vii * pr[j] - vir * pi[j] + wii * vr[j] - wir * vi[j];
      }
    }
    vRe.push(vr); vIm.push(vi); taus.push(tau);
  }
  subRe[n - 2] = br[(n - 1) * n + (n - 2)];
  subIm[n - 2] = bi[(n - 1) * n + (n - 2)];
  // Diagonal phases: D†TD real with non-negative subdiagonal.
  const d = new Float64Array(n), e = new Float64Array(n);
  const phRe = new Float64Array(n), phIm = new Float64Array(n);
  phRe[0] = 1;
  for (let i = 0; i < n; i++) d[i] = br[i * n + i];
  for (let k = 0; k < n - 1; k++) {
    const ab = Math.hypot(subRe[k], subIm[k]);
    e[k] = ab;
    if (ab === 0) {
      phRe[k + 1] = phRe[k];
      phIm[k + 1] = phIm[k];
    } else {
      const ur = subRe[k] / ab, ui = subIm[k] / ab;
      phRe[k + 1] = phRe[k] * ur - phIm[k] * ui;
      phIm[k + 1] = phRe[k] * ui + phIm[k] * ur;
    }
  }
  let z: Float64Array | null = null;
  if (wantVectors) {
    z = new Float64Array(n * n);
    for (let i = 0; i < n; i++) z[i * n + i] = 1;
  }
  tridiagonalQl(d, e, z);
  if (z === null) return { values: d, vectors: null };
  // Back-transform on the transpose: row j of (xr, xi) is eigenvector j, so every
  // reflector acts on contiguous rows (a dot product, then an update of the same
  // row while it is in cache). Start: X = D Z, i.e. row j holds phase_i · Z_ij.
  const xr = new Float64Array(n * n), xi = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    const pr = phRe[i], pi = phIm[i], row = i * n;
    for (let j = 0; j < n; j++) {
      const zz = z[row + j];
      xr[j * n + i] = pr * zz;
      xi[j * n + i] = pi * zz;
    }
  }
  // X ← H_0 H_1 … H_{n−3} X, innermost reflector first; H = 1 − τ v v†.
  for (let k = n - 3; k >= 0; k--) {
    const tau = taus[k];
    if (tau === 0) continue;
    const vr = vRe[k], vi = vIm[k];
    const m = n - k - 1, off = k + 1;
    for (let j = 0; j < n; j++) {
      const row = j * n + off;
      let sr = 0, si = 0;
      for (let i = 0; i < m; i++) {
        // conj(v_i) x_i
        const ar = xr[row + i], ai = xi[row + i], br = vr[i], bi = vi[i];
        sr += br * ar + bi * ai;
        si += br * ai - bi * ar;
      }
      if (sr === 0 && si === 0) continue;
      sr *= tau;
      si *= tau;
      for (let i = 0; i < m; i++) {
        const br = vr[i], bi = vi[i];
        xr[row + i] -= br * sr - bi * si;
        xi[row + i] -= br * si + bi * sr;
      }
    }
  }
  const x = zeros(n, n);
  for (let j = 0; j < n; j++) {
    const row = j * n;
    for (let i = 0; i < n; i++) {
      x.re[i * n + j] = xr[row + i];
      x.im[i * n + j] = xi[row + i];
    }
  }
  return { values: d, vectors: x };
}

/**
 * Entries below NEGLIGIBLE·max|B| are set to zero. Matrices such as the Cayley
 * transform of a banded unitary have entries decaying exponentially away from
 * the diagonal, down to subnormal numbers, and subnormal arithmetic is one to
 * two orders of magnitude slower on common hardware. The perturbation is at
 * most n·NEGLIGIBLE·max|B| in norm, far below the rounding of the reduction
 * itself (about n·ε·‖B‖).
 */
const NEGLIGIBLE = 2 ** -104;

function flushNegligible(re: Float64Array, im: Float64Array): void {
  let max = 0;
  for (let p = 0; p < re.length; p++) max = Math.max(max, Math.abs(re[p]), Math.abs(im[p]));
  const floor = NEGLIGIBLE * max;
  for (let p = 0; p < re.length; p++) {
    if (Math.abs(re[p]) < floor) re[p] = 0;
    if (Math.abs(im[p]) < floor) im[p] = 0;
  }
}
