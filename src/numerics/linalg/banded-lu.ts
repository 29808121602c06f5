/**
 * LU factorisation with partial pivoting of a complex band matrix
 * (Gaussian elimination restricted to the band, as LAPACK's gbtrf; Golub &
 * Van Loan, Matrix Computations, §4.3): with kl = ku = b nonzero diagonals
 * below and above the main one, row interchanges widen U to b + b superdiagonals
 * and factorisation costs O(n b²) instead of O(n³).
 *
 * Storage: row p keeps columns p − b … p + 2b at positions 0 … 3b (width 3b + 1);
 * the multipliers of L overwrite the eliminated entries.
 * `pivotFloor` > 0 replaces pivots smaller in modulus by that value (the
 * perturbation inverse iteration wants for a shift on an exact eigenvalue);
 * with 0 a zero pivot marks the matrix singular.
 */
import type { ComplexMatrix } from './complex-matrix.ts';
import { BandedMatrix } from './banded-matrix.ts';

/** Largest |i − j| over the nonzero entries of a square matrix (0 for a diagonal matrix). */
export function bandwidth(a: ComplexMatrix): number {
  const n = a.rows;
  let b = 0;
  for (let i = 0; i < n; i++) {
    const row = i * n;
    // Only entries beyond the current bandwidth can change it.
    for (let j = 0; j < i - b; j++) if (a.re[row + j] !== 0 || a.im[row + j] !== 0) { b = i - j; break; }
    for (let j = n - 1; j > i + b; j--) if (a.re[row + j] !== 0 || a.im[row + j] !== 0) { b = j - i; break; }
  }
  return b;
}

export class BandedLu {
  readonly n: number;
  readonly b: number;
  private readonly width: number;
  private readonly re: Float64Array;
  private readonly im: Float64Array;
  private readonly pivot: Int32Array;
  /** True when a pivot was exactly zero (only without a pivot floor). */
  singular = false;

  constructor(n: number, b: number) {
    this.n = n;
    this.b = b;
    this.width = 3 * b + 1;
    this.re = new Float64Array(n * this.width);
    this.im = new Float64Array(n * this.width);
    this.pivot = new Int32Array(n);
  }

  /** Factorises zA + shift·1 restricted to the band b of the dense A (zr + i·zi a complex scale, shift complex). */
  factor(a: ComplexMatrix, zr: number, zi: number, shiftRe: number, shiftIm: number, pivotFloor = 0): this {
    return this.factorBanded(BandedMatrix.fromDense(a, this.b), zr, zi, shiftRe, shiftIm, pivotFloor);
  }

  /** Factorises zA + shift·1 for A held in band storage (its bandwidth must not exceed b). */
  factorBanded(a: BandedMatrix, zr: number, zi: number, shiftRe: number, shiftIm: number, pivotFloor = 0): this {
    const { n, b, width: w, re, im } = this;
    if (a.n !== n || a.b > b) throw new RangeError(`BandedLu: a ${a.n}×${a.n} matrix of bandwidth ${a.b} does not fit a factorisation of size ${n}, bandwidth ${b}`);
    const ab = a.b, aw = a.width;
    if (zr === 1 && zi === 0 && ab === b) {
      // Same band: each row of A is the first 2b + 1 positions of the factor's row (columns i − b … i + b).
      const ar = a.re, ai = a.im;
      for (let i = 0; i < n; i++) {
        const src = i * aw, dst = i * w;
        for (let d = 0; d < aw; d++) {
          re[dst + d] = ar[src + d];
          im[dst + d] = ai[src + d];
        }
        for (let d = aw; d < w; d++) {
          re[dst + d] = 0;
          im[dst + d] = 0;
        }
        re[dst + b] += shiftRe;
        im[dst + b] += shiftIm;
      }
      return this.eliminate(pivotFloor);
    }
    re.fill(0);
    im.fill(0);
    for (let i = 0; i < n; i++) {
      const lo = Math.max(0, i - ab), hi = Math.min(n - 1, i + ab);
      const src = i * aw - i + ab, dst = i * w - i + b;
      for (let j = lo; j <= hi; j++) {
        const xr = a.re[src + j], xi = a.im[src + j];
        re[dst + j] = zr * xr - zi * xi;
        im[dst + j] = zr * xi + zi * xr;
      }
      re[dst + i] += shiftRe;
      im[dst + i] += shiftIm;
    }
    return this.eliminate(pivotFloor);
  }

  private eliminate(pivotFloor: number): this {
    const { n, b, width: w, re, im, pivot } = this;
    this.singular = false;
    for (let k = 0; k < n; k++) {
      const last = Math.min(n - 1, k + b);
      // Partial pivoting among rows k … k + b (column k).
      let p = k, best = -1;
      for (let i = k; i <= last; i++) {
        const q = i * w - i + b + k;
        const m = Math.abs(re[q]) + Math.abs(im[q]);
        if (m > best) { best = m; p = i; }
      }
      pivot[k] = p;
      const cEnd = Math.min(n - 1, k + 2 * b);
      if (p !== k) {
        const ok = k * w - k + b, op = p * w - p + b;
        for (let c = k; c <= cEnd; c++) {
          let t = re[ok + c]; re[ok + c] = re[op + c]; re[op + c] = t;
          t = im[ok + c]; im[ok + c] = im[op + c]; im[op + c] = t;
        }
      }
      const ok = k * w - k + b;
      let pr = re[ok + k], pi = im[ok + k];
      if (pr === 0 && pi === 0) {
        if (pivotFloor > 0) { pr = pivotFloor; re[ok + k] = pr; }
        else { this.singular = true; continue; }
      } else if (pivotFloor > 0 && pr * pr + pi * pi < pivotFloor * pivotFloor) {
        const s = pivotFloor / Math.sqrt(pr * pr + pi * pi);
        pr *= s; pi *= s;
        re[ok + k] = pr; im[ok + k] = pi;
      }
      const den = pr * pr + pi * pi, ir = pr / den, ii = -pi / den;
      for (let i = k + 1; i <= last; i++) {
        const oi = i * w - i + b;
        const xr = re[oi + k], xi = im[oi + k];
        if (xr === 0 && xi === 0) continue;
        const lr = xr * ir - xi * ii, li = xr * ii + xi * ir;
        re[oi + k] = lr;
        im[oi + k] = li;
        for (let c = k + 1; c <= cEnd; c++) {
          const yr = re[ok + c], yi = im[ok + c];
          re[oi + c] -= lr * yr - li * yi;
          im[oi + c] -= lr * yi + li * yr;
        }
      }
    }
    return this;
  }

  /** Solves (factored matrix)·x = y in place on (xr, xi). */
  solveInPlace(xr: Float64Array, xi: Float64Array): void {
    const { n, b, width: w, re, im, pivot } = this;
    for (let k = 0; k < n; k++) {
      const p = pivot[k];
      if (p !== k) {
        let t = xr[k]; xr[k] = xr[p]; xr[p] = t;
        t = xi[k]; xi[k] = xi[p]; xi[p] = t;
      }
      const yr = xr[k], yi = xi[k];
      if (yr === 0 && yi === 0) continue;
      const last = Math.min(n - 1, k + b);
      for (let i = k + 1; i <= last; i++) {
        const q = i * w - i + b + k;
        const lr = re[q], li = im[q];
        xr[i] -= lr * yr - li * yi;
        xi[i] -= lr * yi + li * yr;
      }
    }
    for (let k = n - 1; k >= 0; k--) {
      const ok = k * w - k + b;
      let sr = xr[k], si = xi[k];
      const cEnd = Math.min(n - 1, k + 2 * b);
      for (let c = k + 1; c <= cEnd; c++) {
        const ur = re[ok + c], ui = im[ok + c], yr = xr[c], yi = xi[c];
        sr -= ur * yr - ui * yi;
        si -= ur * yi + ui * yr;
      }
      const pr = re[ok + k], pi = im[ok + k];
      const den = pr * pr + pi * pi;
      xr[k] = (sr * pr + si * pi) / den;
      xi[k] = (si * pr - sr * pi) / den;
    }
  }
}
