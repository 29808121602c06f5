/**
 * How many eigenvalues a banded unitary U has on an arc of the unit circle,
 * without computing them: Sylvester's law of inertia applied to a banded
 * Hermitian matrix congruent to the Cayley transform of U. (And, directly, how
 * many a banded Hermitian H has in an interval: eigenvaluesInInterval.)
 *
 * With W = e^{−iθ}U (θ the centre of the arc), the Cayley transform
 * A = i(1 − W)(1 + W)⁻¹ is Hermitian with eigenvalues tan(ψ/2) for the
 * eigenvalues e^{iψ} of W, ψ ∈ (−π, π) (unitary-eigen.ts uses the same map). A
 * is dense, but it is congruent to a band matrix: for unitary W,
 *     (1 + W)†(A − t)(1 + W) = i(W† − W) − t(2 + W + W†) =: B(t),
 * (using (1 + W)†(1 − W) = W† − W and (1 + W)†(1 + W) = 2 + W + W†), so B(t)
 * has the bandwidth of U and, by Sylvester's law, as many negative eigenvalues
 * as A − t: the number of eigenphases ψ with tan(ψ/2) < t. The number of
 * eigenphases in (−h, h) is therefore ν(B(tan(h/2))) − ν(B(−tan(h/2))), ν the
 * number of negative pivots of the LDL† factorisation of B (common practice
 * for band matrices; a pivot that vanishes is replaced by a tiny one of the
 * same scale, which counts the inertia of a matrix within rounding of B, as in
 * Sturm-sequence bisection). Cost O(n b²) per count, memory O(n b).
 *
 * The count is exact for the banded operator given; the caller compares it
 * with the eigenpairs its iterative search found (banded-shift-invert.ts): two
 * independent routes agreeing is the certificate that no state was missed.
 * Eigenvalues within rounding of the arc's ends may be counted on either side.
 */
import type { BandedMatrix } from './banded-matrix.ts';

/** Number of negative eigenvalues of the Hermitian band matrix given by (re, im) rows of width 2b + 1, by unpivoted LDL† (overwrites re, im). */
export function negativePivots(n: number, b: number, re: Float64Array, im: Float64Array, scale: number): number {
  return ldlInertia(n, b, re, im, scale).negative;
}

/** Pivots below this (relative to the largest entry) make an inertia count suspect: B may be singular. */
const SUSPECT_PIVOT = 1e-8;

/** Negative pivots of the unpivoted LDL† and the smallest |pivot| relative to the scale. */
function ldlInertia(n: number, b: number, re: Float64Array, im: Float64Array, scale: number): { negative: number; smallest: number } {
  const w = 2 * b + 1;
  const tiny = 1e-14 * scale;
  let negative = 0, smallest = Infinity;
  // Only the upper band is used: row k holds (k, k + d) at k·w + b + d. Elimination
  // of column k updates rows k+1 … k+b within their upper bands.
  const dRe = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    let d = re[k * w + b];
    smallest = Math.min(smallest, Math.abs(d) / scale);
    if (Math.abs(d) < tiny) d = d < 0 ? -tiny : tiny;
    dRe[k] = d;
    if (d < 0) negative++;
    const last = Math.min(n - 1, k + b);
    // l_i = conj(B_ki)/d for i in k+1 … last; B_ij −= l_i · B_kj  (j ≥ i, within band).
    for (let i = k + 1; i <= last; i++) {
      const pki = k * w + b + (i - k);
      const lr = re[pki] / d, li = -im[pki] / d;
      if (lr === 0 && li === 0) continue;
      for (let j = i; j <= last; j++) {
        const pkj = k * w + b + (j - k);
        const pij = i * w + b + (j - i);
        const xr = re[pkj], xi = im[pkj];
        re[pij] -= lr * xr - li * xi;
        im[pij] -= lr * xi + li * xr;
      }
    }
  }
  return { negative, smallest };
}

/** B(t) = i(W† − W) − t(2 + W + W†), W = e^{−iθ}U, as upper-band rows (re, im) of width 2b + 1. */
function congruentPencil(u: BandedMatrix, theta: number, t: number): { re: Float64Array; im: Float64Array; scale: number } {
  const { n, b } = u;
  const w = 2 * b + 1;
  const re = new Float64Array(n * w), im = new Float64Array(n * w);
  const cr = Math.cos(theta), ci = -Math.sin(theta);
  let scale = 0;
  for (let i = 0; i < n; i++) {
    const hi = Math.min(n - 1, i + b);
    for (let j = i; j <= hi; j++) {
      const p = u.index(i, j), q = u.index(j, i);
      // W_ij and W_ji.
      const aR = cr * u.re[p] - ci * u.im[p], aI = cr * u.im[p] + ci * u.re[p];
      const bR = cr * u.re[q] - ci * u.im[q], bI = cr * u.im[q] + ci * u.re[q];
      // i(conj W_ji − W_ij) and (W_ij + conj W_ji).
      const dR = bR - aR, dI = -bI - aI; // conj(W_ji) − W_ij
      const kR = -dI, kI = dR; // times i
      const sR = aR + bR, sI = aI - bI;
      let xR = kR - t * sR, xI = kI - t * sI;
      if (i === j) {
        xR -= 2 * t;
        xI = 0;
      }
      re[i * w + b + (j - i)] = xR;
      im[i * w + b + (j - i)] = xI;
      scale = Math.max(scale, Math.abs(xR) + Math.abs(xI));
    }
  }
  return { re, im, scale: Math.max(scale, 1e-300) };
}

/**
 * The count with the Cayley cut at θ + π (θ − centre = offset): ν(B(tan(ψ₊/2))) − ν(B(tan(ψ₋/2))),
 * and whether a pivot came near zero (then B may be singular and the count is suspect).
 */
function countWithCut(u: BandedMatrix, centre: number, halfWidth: number, offset: number): { count: number; suspect: boolean } {
  const theta = centre + offset;
  const upper = congruentPencil(u, theta, Math.tan((halfWidth - offset) / 2));
  const lower = congruentPencil(u, theta, Math.tan((-halfWidth - offset) / 2));
  const a = ldlInertia(u.n, u.b, upper.re, upper.im, upper.scale), b = ldlInertia(u.n, u.b, lower.re, lower.im, lower.scale);
  return { count: a.negative - b.negative, suspect: Math.min(a.smallest, b.smallest) < SUSPECT_PIVOT };
}

/**
 * Number of eigenvalues e^{iφ} of the unitary band matrix `u` with
 * |φ − centre| < halfWidth (radians, on the circle; halfWidth < π).
 * An eigenvalue on the Cayley cut (φ = θ + π) makes B(t) singular for every t,
 * which shows as a pivot near zero: such a count is taken again with the cut
 * moved (by a third of the room left between the arc and the opposite point)
 * and accepted when two cuts agree; null when no two agree.
 */
export function eigenvaluesOnArc(u: BandedMatrix, centre: number, halfWidth: number): number | null {
  if (!(halfWidth > 0 && halfWidth < Math.PI)) throw new RangeError(`eigenvaluesOnArc: half-width must lie in (0, π), got ${halfWidth}`);
  const room = Math.min(halfWidth, Math.PI - halfWidth) / 3;
  const counts: number[] = [];
  for (const offset of [0, room, -room / 2, room / 3]) {
    const { count, suspect } = countWithCut(u, centre, halfWidth, offset);
    // A clean factorisation stands on its own; a suspect one needs a second cut to agree.
    if (count >= 0 && (!suspect || counts.includes(count))) return count;
    counts.push(count);
  }
  return null;
}

/**
 * Number of eigenvalues of the Hermitian band matrix `h` in the open interval
 * (lower, upper): ν(H − upper) − ν(H − lower), the same inertia count (H − E
 * is band storage already, no congruence needed).
 */
export function eigenvaluesInInterval(h: BandedMatrix, lower: number, upper: number): number {
  const { n, b } = h;
  const w = 2 * b + 1;
  const shifted = (e: number) => {
    const re = Float64Array.from(h.re), im = Float64Array.from(h.im);
    let scale = 0;
    for (let i = 0; i < n; i++) {
      re[i * w + b] -= e;
      im[i * w + b] = 0;
      for (let d = 0; d < w; d++) scale = Math.max(scale, Math.abs(re[i * w + d]) + Math.abs(im[i * w + d]));
    }
    return negativePivots(n, b, re, im, Math.max(scale, 1e-300));
  };
  return shifted(upper) - shifted(lower);
}
