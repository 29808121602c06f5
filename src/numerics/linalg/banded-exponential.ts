/**
 * exp(−iHt) of a banded Hermitian H (a ribbon's or open chain's step
 * Hamiltonian), as a band matrix or applied to a vector, with a stated error.
 *
 * Two routes.
 * 1. Disjoint blocks. When the bond graph of the step splits into small
 *    blocks (one bond direction per step: dimers; the common step drives),
 *    the exponential is block diagonal and exact to rounding: 1×1 and 2×2
 *    blocks in closed form (exponential.ts), larger ones spectrally. Its
 *    bandwidth is the largest index span of a block.
 * 2. Chebyshev expansion (Tal-Ezer & Kosloff, J. Chem. Phys. 81, 3967 (1984)):
 *    with the spectrum of H inside [a − ρ, a + ρ] (Gershgorin discs, so the
 *    interval is rigorous) and X = (H − a)/ρ,
 *        exp(−iHt) = e^{−iat} [J₀(ρt) + 2 Σ_{k≥1} (−i)^k J_k(ρt) T_k(X)],
 *    J_k the Bessel functions. Since ‖T_k(X)‖₂ ≤ 1, cutting after degree m
 *    leaves an error ≤ 2 Σ_{k>m} |J_k(ρt)| ≤ 2 (ρt/2)^{m+1}/(m+1)! · e^{ρt/2}
 *    (from |J_k(x)| ≤ (x/2)^k/k!), and m is the first degree that brings this
 *    below the tolerance. T_k(X) has bandwidth k·b, so the sum has bandwidth
 *    m·b; entries far from the diagonal are tiny and are cut off with their
 *    own bound (BandedMatrix.truncate). The reported error is the sum of both.
 */
import type { ComplexMatrix } from './complex-matrix.ts';
import { zeros } from './complex-matrix.ts';
import { BandedMatrix, multiplyBanded } from './banded-matrix.ts';
import { exp2x2Into, expMinusIHt } from './exponential.ts';

/** Default bound on the error of one exponential (spectral norm). */
export const DEFAULT_EXPONENTIAL_TOLERANCE = 1e-14;
/** Blocks up to this size are exponentiated exactly (spectral route); larger ones make the step take the Chebyshev route. */
export const MAX_EXACT_BLOCK = 64;

export interface BandedExponential {
  matrix: BandedMatrix;
  /** Upper bound on ‖matrix − exp(−iHt)‖₂ (0 up to rounding for the block route). */
  error: number;
  route: 'blocks' | 'chebyshev';
}

/** J₀(x) … J_m(x) for x ≥ 0 by Miller's backward recurrence, normalised by J₀ + 2ΣJ_{2k} = 1 (common practice). */
export function besselJ(m: number, x: number): Float64Array {
  const out = new Float64Array(m + 1);
  if (x === 0) {
    out[0] = 1;
    return out;
  }
  const start = 2 * Math.ceil((Math.max(m, x) + 15 + Math.sqrt(40 * Math.max(m, x))) / 2);
  let next = 0, cur = 1e-300, norm = 0;
  const values = new Float64Array(start + 1);
  values[start] = cur;
  for (let k = start; k >= 1; k--) {
    const prev = ((2 * k) / x) * cur - next;
    next = cur;
    cur = prev;
    values[k - 1] = cur;
    // Rescale to avoid overflow.
    if (Math.abs(cur) > 1e250) {
      for (let j = k - 1; j <= start; j++) values[j] *= 1e-250;
      cur *= 1e-250;
      next *= 1e-250;
    }
  }
  norm = values[0];
  for (let k = 2; k <= start; k += 2) norm += 2 * values[k];
  for (let k = 0; k <= m; k++) out[k] = values[k] / norm;
  return out;
}

/** Smallest degree m with 2(x/2)^{m+1}/(m+1)!·e^{x/2} ≤ tolerance, and that bound. */
export function chebyshevDegree(x: number, tolerance: number): { degree: number; tail: number } {
  let term = 1; // (x/2)^k / k!
  for (let k = 1; k < 100000; k++) {
    term *= x / 2 / k;
    const tail = 2 * term * Math.exp(x / 2);
    if (k > x / 2 && tail <= tolerance) return { degree: k - 1, tail };
  }
  throw new RangeError(`chebyshevDegree: no degree reaches ${tolerance} for ρt = ${x}`);
}

/** Centre a and half-width ρ of an interval containing the spectrum of a Hermitian band matrix (Gershgorin). */
export function spectralInterval(h: BandedMatrix): { centre: number; radius: number } {
  const { n, b, width: w, re, im } = h;
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < n; i++) {
    let r = 0;
    const jl = Math.max(0, i - b), jh = Math.min(n - 1, i + b);
    for (let j = jl; j <= jh; j++) if (j !== i) r += Math.hypot(re[i * w + j - i + b], im[i * w + j - i + b]);
    const d = re[i * w + b];
    lo = Math.min(lo, d - r);
    hi = Math.max(hi, d + r);
  }
  if (n === 0) return { centre: 0, radius: 0 };
  return { centre: 0.5 * (lo + hi), radius: 0.5 * (hi - lo) };
}

/** Largest index span max(block) − min(block) over a partition into blocks (each sorted ascending). */
export function blockSpan(blocks: readonly (readonly number[])[]): number {
  let span = 0;
  for (const idx of blocks) span = Math.max(span, idx[idx.length - 1] - idx[0]);
  return span;
}

/**
 * exp(−iHt) in band storage. `blocks`, when given, is a partition of the states
 * that the nonzero pattern of H respects (e.g. the bond graph of a drive step);
 * the block route is taken when every block has at most MAX_EXACT_BLOCK states.
 */
export function bandedExpMinusIHt(h: BandedMatrix, t: number, blocks?: readonly (readonly number[])[], tolerance = DEFAULT_EXPONENTIAL_TOLERANCE): BandedExponential {
  if (!Number.isFinite(t)) throw new RangeError(`bandedExpMinusIHt: time ${t} is not finite`);
  if (blocks !== undefined && blocks.every((idx) => idx.length <= MAX_EXACT_BLOCK)) return { matrix: blockExponential(h, t, blocks), error: 0, route: 'blocks' };
  return chebyshevExponential(h, t, tolerance);
}

function blockExponential(h: BandedMatrix, t: number, blocks: readonly (readonly number[])[]): BandedMatrix {
  const out = new BandedMatrix(h.n, blockSpan(blocks));
  for (const idx of blocks) {
    if (idx.length === 1) {
      const e = h.re[h.index(idx[0], idx[0])];
      const p = out.index(idx[0], idx[0]);
      out.re[p] = Math.cos(e * t);
      out.im[p] = -Math.sin(e * t);
    } else if (idx.length === 2) {
      const i = idx[0], j = idx[1];
      const pji = h.index(j, i), pij = h.index(i, j);
      const bRe = 0.5 * (h.re[pji] + h.re[pij]), bIm = 0.5 * (h.im[pji] - h.im[pij]);
      exp2x2Into(h.re[h.index(i, i)], h.re[h.index(j, j)], bRe, bIm, t, out.re, out.im, out.index(i, i), out.index(i, j), out.index(j, i), out.index(j, j));
    } else {
      const k = idx.length;
      const sub: ComplexMatrix = zeros(k, k);
      for (let r = 0; r < k; r++) {
        for (let c = 0; c < k; c++) {
          const g = h.get(idx[r], idx[c]);
          sub.re[r * k + c] = g.re;
          sub.im[r * k + c] = g.im;
        }
      }
      // Symmetrise: H is Hermitian by construction, rounding aside.
      for (let r = 0; r < k; r++) {
        for (let c = 0; c < r; c++) {
          const p = r * k + c, q = c * k + r;
          const ar = 0.5 * (sub.re[p] + sub.re[q]), ai = 0.5 * (sub.im[p] - sub.im[q]);
          sub.re[p] = ar; sub.im[p] = ai; sub.re[q] = ar; sub.im[q] = -ai;
        }
        sub.im[r * k + r] = 0;
      }
      const e = expMinusIHt(sub, t);
      for (let r = 0; r < k; r++) {
        for (let c = 0; c < k; c++) {
          const p = out.index(idx[r], idx[c]);
          out.re[p] = e.re[r * k + c];
          out.im[p] = e.im[r * k + c];
        }
      }
    }
  }
  return out;
}

/** X = (H − a)/ρ in band storage. */
function normalised(h: BandedMatrix, centre: number, radius: number): BandedMatrix {
  const x = new BandedMatrix(h.n, h.b);
  const inv = radius > 0 ? 1 / radius : 0;
  for (let p = 0; p < h.re.length; p++) {
    x.re[p] = h.re[p] * inv;
    x.im[p] = h.im[p] * inv;
  }
  for (let i = 0; i < h.n; i++) x.re[x.index(i, i)] -= centre * inv;
  return x;
}

/** Accumulates s += (cr + i·ci)·T into s (bandwidth of T ≤ that of s). */
function addScaled(s: BandedMatrix, t: BandedMatrix, cr: number, ci: number): void {
  const n = s.n;
  for (let i = 0; i < n; i++) {
    for (let d = -t.b; d <= t.b; d++) {
      const j = i + d;
      if (j < 0 || j >= n) continue;
      const p = t.index(i, j), q = s.index(i, j);
      const xr = t.re[p], xi = t.im[p];
      s.re[q] += cr * xr - ci * xi;
      s.im[q] += cr * xi + ci * xr;
    }
  }
}

/** T_{k+1} = 2X T_k − T_{k−1}, in band storage. */
function chebyshevStep(x: BandedMatrix, tk: BandedMatrix, tkm1: BandedMatrix): BandedMatrix {
  const next = multiplyBanded(x, tk);
  for (let p = 0; p < next.re.length; p++) {
    next.re[p] *= 2;
    next.im[p] *= 2;
  }
  addScaled(next, tkm1, -1, 0);
  return next;
}

function chebyshevExponential(h: BandedMatrix, t: number, tolerance: number): BandedExponential {
  const n = h.n;
  const { centre, radius } = spectralInterval(h);
  const x = Math.abs(radius * t);
  const { degree, tail } = chebyshevDegree(x, tolerance / 2);
  const coefficients = besselJ(degree, x);
  const sign = t >= 0 ? 1 : -1;
  const total = new BandedMatrix(n, Math.min(degree * h.b, Math.max(0, n - 1)));
  // (−i·sign)^k: T_k of X for exp(−i ρ t X) with t of either sign.
  const phase = (k: number): [number, number] => {
    const m = ((k % 4) + 4) % 4;
    const r = [1, 0, -1, 0][m], i = [0, -1, 0, 1][m] * sign;
    return [r, i];
  };
  const xm = normalised(h, centre, radius);
  let tkm1 = BandedMatrix.identity(n);
  addScaled(total, tkm1, coefficients[0], 0);
  let tk = xm;
  for (let k = 1; k <= degree; k++) {
    const [pr, pi] = phase(k);
    addScaled(total, tk, 2 * coefficients[k] * pr, 2 * coefficients[k] * pi);
    if (k < degree) {
      const next = chebyshevStep(xm, tk, tkm1);
      tkm1 = tk;
      tk = next;
    }
  }
  // Global phase e^{−i a t}.
  const gr = Math.cos(centre * t), gi = -Math.sin(centre * t);
  for (let p = 0; p < total.re.length; p++) {
    const r = total.re[p], i = total.im[p];
    total.re[p] = gr * r - gi * i;
    total.im[p] = gr * i + gi * r;
  }
  const cut = total.truncate(tolerance / 2);
  return { matrix: cut.matrix, error: tail + cut.dropped, route: 'chebyshev' };
}
