/**
 * Square complex band matrices: the representation of ribbon and open-chain
 * operators, whose entries vanish beyond a few cells of the diagonal.
 *
 * Storage: an n×n matrix with half-bandwidth b keeps, for every row i, the
 * columns i − b … i + b at positions 0 … 2b of that row (row-major, width
 * 2b + 1, split real and imaginary parts as in complex-matrix.ts). Positions
 * whose column falls outside 0 … n−1 stay zero. Memory and every product are
 * linear in n: a product of bandwidths b₁ and b₂ has bandwidth ≤ b₁ + b₂ and
 * costs O(n b₁ b₂).
 *
 * Truncation (`truncate`): an operator whose entries decay away from the
 * diagonal (the exponential of a banded Hamiltonian, a product of many
 * slices) is cut to the smallest bandwidth whose dropped part E has
 * ‖E‖₂ ≤ √(‖E‖₁‖E‖_∞) below a tolerance (the bound of spectralDistanceBound,
 * propagator.ts). The bound is returned so callers can add it to the error
 * they certify.
 */
import type { ComplexMatrix } from './complex-matrix.ts';
import { zeros } from './complex-matrix.ts';

export class BandedMatrix {
  readonly n: number;
  readonly b: number;
  /** Row stride, 2b + 1. */
  readonly width: number;
  readonly re: Float64Array;
  readonly im: Float64Array;

  constructor(n: number, b: number) {
    if (!Number.isInteger(n) || n < 0) throw new RangeError(`BandedMatrix: size must be a non-negative integer, got ${n}`);
    if (!Number.isInteger(b) || b < 0) throw new RangeError(`BandedMatrix: bandwidth must be a non-negative integer, got ${b}`);
    this.n = n;
    this.b = Math.min(b, Math.max(0, n - 1));
    this.width = 2 * this.b + 1;
    this.re = new Float64Array(n * this.width);
    this.im = new Float64Array(n * this.width);
  }

  static identity(n: number): BandedMatrix {
    const m = new BandedMatrix(n, 0);
    m.re.fill(1);
    return m;
  }

  /** The band |i − j| ≤ b of a dense matrix (entries beyond it are ignored). */
  static fromDense(a: ComplexMatrix, b: number): BandedMatrix {
    const n = a.rows;
    const m = new BandedMatrix(n, b);
    for (let i = 0; i < n; i++) {
      const lo = Math.max(0, i - m.b), hi = Math.min(n - 1, i + m.b);
      for (let j = lo; j <= hi; j++) {
        const p = m.index(i, j);
        m.re[p] = a.re[i * n + j];
        m.im[p] = a.im[i * n + j];
      }
    }
    return m;
  }

  /** Position of entry (i, j), |i − j| ≤ b, in re/im. */
  index(i: number, j: number): number {
    return i * this.width + (j - i + this.b);
  }

  get(i: number, j: number): { re: number; im: number } {
    if (Math.abs(i - j) > this.b) return { re: 0, im: 0 };
    const p = this.index(i, j);
    return { re: this.re[p], im: this.im[p] };
  }

  /** Adds re + i·im to entry (i, j), which must lie inside the band. */
  add(i: number, j: number, re: number, im: number): void {
    if (Math.abs(i - j) > this.b) throw new RangeError(`BandedMatrix: entry (${i}, ${j}) lies outside the band ${this.b}`);
    const p = this.index(i, j);
    this.re[p] += re;
    this.im[p] += im;
  }

  toDense(): ComplexMatrix {
    const n = this.n, out = zeros(n, n);
    for (let i = 0; i < n; i++) {
      const lo = Math.max(0, i - this.b), hi = Math.min(n - 1, i + this.b);
      for (let j = lo; j <= hi; j++) {
        const p = this.index(i, j);
        out.re[i * n + j] = this.re[p];
        out.im[i * n + j] = this.im[p];
      }
    }
    return out;
  }

  /** Largest |i − j| over the nonzero entries (≤ b). */
  effectiveBandwidth(): number {
    const { n, b, width: w, re, im } = this;
    let e = 0;
    for (let i = 0; i < n; i++) {
      for (let d = 0; d < b - e; d++) {
        // Offsets −(b − d) and +(b − d) from the diagonal.
        const lo = i * w + d, hi = i * w + (w - 1 - d);
        if (re[lo] !== 0 || im[lo] !== 0 || re[hi] !== 0 || im[hi] !== 0) {
          e = b - d;
          break;
        }
      }
    }
    return e;
  }

  /** A copy restricted to bandwidth `b` (entries beyond it dropped; no bound reported). */
  withBandwidth(b: number): BandedMatrix {
    const out = new BandedMatrix(this.n, b);
    const keep = Math.min(out.b, this.b);
    for (let i = 0; i < this.n; i++) {
      for (let d = -keep; d <= keep; d++) {
        const j = i + d;
        if (j < 0 || j >= this.n) continue;
        out.re[out.index(i, j)] = this.re[this.index(i, j)];
        out.im[out.index(i, j)] = this.im[this.index(i, j)];
      }
    }
    return out;
  }

  /**
   * The smallest bandwidth c whose dropped entries E (|i − j| > c) satisfy
   * √(‖E‖₁‖E‖_∞) ≤ tolerance, the matrix cut to it, and that bound.
   */
  truncate(tolerance: number): { matrix: BandedMatrix; dropped: number } {
    const { n, b, width: w, re, im } = this;
    if (b === 0) return { matrix: this, dropped: 0 };
    // rowTail[i·(b+1) + c]: Σ_{|d| > c} |A_{i,i+d}|, likewise for columns.
    const rowTail = new Float64Array(n * (b + 1));
    const colTail = new Float64Array(n * (b + 1));
    for (let i = 0; i < n; i++) {
      for (let c = b - 1; c >= 0; c--) {
        const d = c + 1;
        let s = 0;
        const pl = i * w + (b - d), ph = i * w + (b + d);
        s += Math.hypot(re[pl], im[pl]) + Math.hypot(re[ph], im[ph]);
        rowTail[i * (b + 1) + c] = rowTail[i * (b + 1) + c + 1] + s;
        const jl = i - d, jh = i + d;
        if (jl >= 0) colTail[jl * (b + 1) + c] += Math.hypot(re[pl], im[pl]);
        if (jh < n) colTail[jh * (b + 1) + c] += Math.hypot(re[ph], im[ph]);
      }
    }
    // Column tails: accumulate from the outermost offset inwards.
    for (let j = 0; j < n; j++) for (let c = b - 1; c >= 0; c--) colTail[j * (b + 1) + c] += colTail[j * (b + 1) + c + 1];
    let keep = b, bound = 0;
    for (let c = b - 1; c >= 0; c--) {
      let rmax = 0, cmax = 0;
      for (let i = 0; i < n; i++) {
        rmax = Math.max(rmax, rowTail[i * (b + 1) + c]);
        cmax = Math.max(cmax, colTail[i * (b + 1) + c]);
      }
      const e = Math.sqrt(rmax * cmax);
      if (e > tolerance) break;
      keep = c;
      bound = e;
    }
    if (keep === b) return { matrix: this, dropped: 0 };
    return { matrix: this.withBandwidth(keep), dropped: bound };
  }

  /** √(‖A‖₁‖A‖_∞), an upper bound on the spectral norm. */
  normBound(): number {
    const { n, b, width: w, re, im } = this;
    const cols = new Float64Array(n);
    let rmax = 0;
    for (let i = 0; i < n; i++) {
      let row = 0;
      const lo = Math.max(0, i - b), hi = Math.min(n - 1, i + b);
      for (let j = lo; j <= hi; j++) {
        const p = i * w + (j - i + b);
        const a = Math.hypot(re[p], im[p]);
        row += a;
        cols[j] += a;
      }
      rmax = Math.max(rmax, row);
    }
    let cmax = 0;
    for (let j = 0; j < n; j++) cmax = Math.max(cmax, cols[j]);
    return Math.sqrt(rmax * cmax);
  }

  /** y = A x for complex vectors given as split arrays (y must not alias x). */
  apply(xr: Float64Array, xi: Float64Array, yr: Float64Array, yi: Float64Array): void {
    const { n, b, width: w, re, im } = this;
    for (let i = 0; i < n; i++) {
      const lo = Math.max(0, i - b), hi = Math.min(n - 1, i + b);
      const o = i * w - i + b;
      let sr = 0, si = 0;
      for (let j = lo; j <= hi; j++) {
        const ar = re[o + j], ai = im[o + j], br = xr[j], bi = xi[j];
        sr += ar * br - ai * bi;
        si += ar * bi + ai * br;
      }
      yr[i] = sr;
      yi[i] = si;
    }
  }

  /** y = A† x (y must not alias x). */
  applyAdjoint(xr: Float64Array, xi: Float64Array, yr: Float64Array, yi: Float64Array): void {
    const { n, b, width: w, re, im } = this;
    yr.fill(0);
    yi.fill(0);
    for (let i = 0; i < n; i++) {
      const lo = Math.max(0, i - b), hi = Math.min(n - 1, i + b);
      const o = i * w - i + b;
      const br = xr[i], bi = xi[i];
      if (br === 0 && bi === 0) continue;
      for (let j = lo; j <= hi; j++) {
        // conj(A_ij) x_i
        const ar = re[o + j], ai = -im[o + j];
        yr[j] += ar * br - ai * bi;
        yi[j] += ar * bi + ai * br;
      }
    }
  }
}

/** C = A·B, of bandwidth min(a.b + b.b, n − 1); zero entries of A are skipped (block-sparse step factors). */
export function multiplyBanded(a: BandedMatrix, b: BandedMatrix): BandedMatrix {
  if (a.n !== b.n) throw new RangeError(`multiplyBanded: sizes ${a.n} and ${b.n} differ`);
  const n = a.n;
  const c = new BandedMatrix(n, a.b + b.b);
  const aw = a.width, bw = b.width, cw = c.width;
  const ab = a.b, bb = b.b, cb = c.b;
  const ar = a.re, ai = a.im, br = b.re, bi = b.im, cr = c.re, ci = c.im;
  for (let i = 0; i < n; i++) {
    const kLo = Math.max(0, i - ab), kHi = Math.min(n - 1, i + ab);
    const ci0 = i * cw - i + cb;
    for (let k = kLo; k <= kHi; k++) {
      const pa = i * aw + (k - i + ab);
      const xr = ar[pa], xi = ai[pa];
      if (xr === 0 && xi === 0) continue;
      const jLo = Math.max(0, k - bb), jHi = Math.min(n - 1, k + bb);
      const bk0 = k * bw - k + bb;
      for (let j = jLo; j <= jHi; j++) {
        const yr = br[bk0 + j], yi = bi[bk0 + j];
        cr[ci0 + j] += xr * yr - xi * yi;
        ci[ci0 + j] += xr * yi + xi * yr;
      }
    }
  }
  return c;
}

/** The band of a product cut back to its nonzero bandwidth (exact: only zeros are dropped). */
export function compactBandwidth(m: BandedMatrix): BandedMatrix {
  const e = m.effectiveBandwidth();
  return e === m.b ? m : m.withBandwidth(e);
}
