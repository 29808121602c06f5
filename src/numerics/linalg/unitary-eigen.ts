/**
 * Eigen-decomposition of a unitary matrix, U = V diag(e^{iφ}) V†, with
 * φ ∈ (−π, π] ascending and V unitary.
 *
 * Why a Hermitian route (and not Hessenberg + complex QR): U is normal, so any
 * method that returns orthonormal eigenvectors must treat degenerate eigenvalues
 * gracefully, and the Hermitian eigensolver already does (Householder + QL gives
 * an orthonormal V for any multiplicity). We map U to a Hermitian matrix by the
 * Cayley transform
 *     A = i(1 − W)(1 + W)⁻¹ = 2i(1 + W)⁻¹ − i,   W = e^{−iθ} U,
 * which sends an eigenvalue e^{iψ} of W to tan(ψ/2): strictly monotonic on
 * (−π, π), so distinct eigenphases can never merge. The cut (ψ = ±π, i.e. U
 * eigenphase θ + π) is first placed at a fixed, non-special angle; the rounding
 * error of the result grows like ε/δ with δ the distance of the nearest eigenphase
 * from the cut, so if δ < min(2e-3, largest gap/4) or the residual exceeds
 * 2e-14·n, the transform is redone with the cut in the middle of the largest
 * gap (≥ 2π/n wide).
 * Afterwards the eigenphases are taken as Rayleigh quotients arg(v†Uv), which
 * are accurate to rounding in U itself, and clusters of nearly degenerate
 * eigenphases are re-diagonalised from the small projected matrix V_c†UV_c.
 * The residual ‖UV − VΛ‖_F equals the off-diagonal part of V†UV and is reported.
 * The Hermitian route costs one LU inverse, one Hermitian eigensolve and one
 * product UV (for the Rayleigh quotients and the residual), with no iterative
 * non-Hermitian QR. 2×2 matrices use a closed form (see twoByTwoVectors).
 * Unitarity of the input is checked with O(n²) probes (checks.ts); the reported
 * residual exposes any remaining defect.
 */
import type { ComplexMatrix } from './complex-matrix.ts';
import { identity, multiply, projectColumns, rotateColumnsInPlace, scale, zeros } from './complex-matrix.ts';
import { assertUnitary, DEFAULT_UNITARITY_TOLERANCE } from './checks.ts';
import { HermitianEigen } from './hermitian-eigen.ts';
import { LuDecomposition } from './lu.ts';
import { columnsAsRows, gramDefectBound } from './complex-rows.ts';
import { BandedLu, bandwidth } from './banded-lu.ts';
import { CLUSTER_SEPARATION, unitaryInverseIteration } from './banded-inverse-iteration.ts';

export interface UnitaryEigenOptions {
  /** Accepted ‖U†U − 1‖_F / max(1, √n) (default 1e-8). */
  unitarityTolerance?: number;
}

/** Eigenphases closer than this are re-diagonalised together. */
export const CLUSTER_WIDTH = 1e-6;
/**
 * Rounding in the Cayley route grows like ε/δ with δ the distance of the nearest
 * eigenphase from the cut (measured: residual ≈ 1.5e-12 at δ = 1e-3 for n = 120),
 * so a cut closer than this to an eigenphase is moved into the largest gap.
 */
const MIN_CUT_CLEARANCE = 2e-3;
/** Per-dimension residual above which the cut is moved regardless of clearance. */
export const RESIDUAL_TARGET = 2e-14;
/** First position of the Cayley cut (the golden angle): no eigenphase commonly sits there. */
const FIRST_CUT = Math.PI * (3 - Math.sqrt(5));
/** Smallest n for which the banded route is tried (below it the dense route costs microseconds). */
const BANDED_MIN_SIZE = 16;
/** The banded route is tried when the bandwidth b satisfies b·BANDED_MAX_FRACTION ≤ n (its cost grows like n²b²). */
export const BANDED_MAX_FRACTION = 8;
/**
 * Certification of the banded route: Gram entries of eigenvectors whose eigenvalues lie
 * closer than this are computed; farther pairs are bounded by (r_i + r_j)/|λ_i − λ_j|,
 * at most 40·r here, so the bound stays near the rounding level.
 */
const GRAM_WINDOW = 0.05;

export class UnitaryEigen {
  /** Eigenphases φ in (−π, π], ascending; the eigenvalues are e^{iφ}. */
  readonly phases: Float64Array;
  /** Orthonormal eigenvectors as columns, in the order of `phases`. */
  readonly vectors: ComplexMatrix;
  /** ‖UV − V diag(e^{iφ})‖_F. */
  readonly residual: number;

  constructor(u: ComplexMatrix, options: UnitaryEigenOptions = {}) {
    const tolerance = options.unitarityTolerance ?? DEFAULT_UNITARITY_TOLERANCE;
    // 2×2: the exact defect costs less than the probes; anything doubtful goes through the full check and its message.
    const quick = u.rows === 2 && u.cols === 2 && unitarityDefect2(u) <= tolerance * Math.SQRT2;
    if (!quick) assertUnitary('UnitaryEigen', u, tolerance, true);
    const n = u.rows;
    if (n === 2) {
      const small = twoByTwo(u);
      if (small !== null) {
        this.phases = small.phases;
        this.vectors = small.vectors;
        this.residual = small.residual;
        return;
      }
    }
    if (n >= BANDED_MIN_SIZE) {
      const b = bandwidth(u);
      if (b * BANDED_MAX_FRACTION <= n) {
        const banded = bandedRoute(u, b);
        if (banded !== null) {
          this.phases = banded.phases;
          this.vectors = banded.vectors;
          this.residual = banded.residual;
          return;
        }
      }
    }
    let v: ComplexMatrix, uv: ComplexMatrix;
    if (n <= 2) {
      v = n === 2 ? twoByTwoVectors(u) : identity(n);
      uv = multiply(u, v);
    } else {
      // One Cayley pass with the cut at FIRST_CUT; a second with the cut in the largest
      // gap when an eigenphase came too close to the cut or the residual is poor.
      const first = cayleyPass(u, FIRST_CUT);
      v = first.vectors;
      uv = multiply(u, v);
      const { distance, gapCentre, gapWidth } = cutClearance(first.phases, first.cut);
      if (distance < Math.min(MIN_CUT_CLEARANCE, gapWidth / 4) || residualNorm(v, uv, rayleighPhases(v, uv)) > RESIDUAL_TARGET * n) {
        v = cayleyPass(u, gapCentre).vectors;
        uv = multiply(u, v);
      }
    }
    const done = finish(v, uv);
    this.phases = done.phases;
    this.vectors = done.vectors;
    this.residual = done.residual;
  }
}

/** Cluster refinement, Rayleigh phases, ascending order and residual of an eigenbasis V with UV. */
export function finish(v: ComplexMatrix, uv: ComplexMatrix): { phases: Float64Array; vectors: ComplexMatrix; uv: ComplexMatrix; residual: number } {
  const n = v.rows;
  // The Rayleigh phases change only where a cluster was re-diagonalised.
  const phases = refineClusters(v, uv) ?? rayleighPhases(v, uv);
  // Sort ascending, permuting columns.
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => phases[a] - phases[b]);
  const sorted = new Float64Array(n);
  const vs = zeros(n, n), uvs = zeros(n, n);
  for (let c = 0; c < n; c++) {
    const src = order[c];
    sorted[c] = phases[src];
    for (let r = 0; r < n; r++) {
      vs.re[r * n + c] = v.re[r * n + src];
      vs.im[r * n + c] = v.im[r * n + src];
      uvs.re[r * n + c] = uv.re[r * n + src];
      uvs.im[r * n + c] = uv.im[r * n + src];
    }
  }
  return { phases: sorted, vectors: vs, uv: uvs, residual: residualNorm(vs, uvs, sorted) };
}

/**
 * Banded U (bandwidth b ≪ n, e.g. the Floquet operator of a ribbon): the
 * eigenphases come from the Cayley matrix as in the dense route, but its
 * inverse from a banded LU (O(n² b)) and its Hermitian eigensolve without
 * eigenvectors (no QL rotations, no back-transform); the eigenvectors come from
 * inverse iteration on U itself (banded-inverse-iteration.ts). The result is
 * accepted only when it certifies itself: ‖UV − VΛ‖_F ≤ RESIDUAL_TARGET·n and
 * a bound on ‖V†V − 1‖_F ≤ RESIDUAL_TARGET·n, where the bound takes the Gram
 * entries explicitly inside groups of eigenvalues closer than GRAM_WINDOW and
 * (r_i + r_j)/|λ_i − λ_j| between groups (valid for any normal U, r the column
 * residuals). Otherwise null: the caller runs the dense
 * route (Householder + QL with eigenvectors).
 */
function bandedRoute(u: ComplexMatrix, b: number): { phases: Float64Array; vectors: ComplexMatrix; residual: number } | null {
  const n = u.rows;
  let pass = cayleyPass(u, FIRST_CUT, b);
  const { distance, gapCentre, gapWidth } = cutClearance(pass.phases, pass.cut);
  if (distance < Math.min(MIN_CUT_CLEARANCE, gapWidth / 4)) pass = cayleyPass(u, gapCentre, b);
  // Re-orthogonalisation costs O(n k²) per vector in a group of k close eigenvalues:
  // large groups (flat bands) are cheaper on the dense route.
  if (largestGroup(pass.phases, CLUSTER_SEPARATION) * BANDED_MAX_FRACTION > n) return null;
  const v = unitaryInverseIteration(u, b, pass.phases);
  const done = finish(v, multiply(u, v));
  if (!(done.residual <= RESIDUAL_TARGET * n)) return null;
  if (!(orthogonalityBound(done.vectors, done.uv, done.phases) <= RESIDUAL_TARGET * n)) return null;
  return done;
}

/** Size of the largest group of eigenphases chained by circular chords below `width`. */
export function largestGroup(phases: Float64Array, width: number): number {
  const sorted = Float64Array.from(phases).sort();
  const n = sorted.length;
  if (n === 0) return 0;
  const close = (a: number, c: number) => 2 * Math.abs(Math.sin(0.5 * (a - c))) < width;
  // Start after a wide gap so that no group wraps around ±π.
  const start = (largestGap(sorted).below + 1) % n;
  let best = 1, run = 1;
  for (let k = 1; k < n; k++) {
    run = close(sorted[(start + k) % n], sorted[(start + k - 1) % n]) ? run + 1 : 1;
    best = Math.max(best, run);
  }
  return best;
}

/**
 * Upper bound on ‖V†V − 1‖_F for columns with ascending phases: explicit Gram
 * entries for pairs whose eigenvalues lie closer than GRAM_WINDOW (on the
 * circle), (r_i + r_j)/|e^{iφ_i} − e^{iφ_j}| for every other pair, with
 * r_j = ‖Uv_j − e^{iφ_j}v_j‖ / ‖v_j‖ (the bound holds for normal U).
 */
export function orthogonalityBound(v: ComplexMatrix, uv: ComplexMatrix, phases: Float64Array): number {
  const n = v.rows, m = v.cols;
  if (m === 0) return 0;
  const res = new Float64Array(m), norm2 = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    const cr = Math.cos(phases[j]), ci = Math.sin(phases[j]);
    let s = 0, q = 0;
    for (let r = 0; r < n; r++) {
      const p = r * m + j;
      const xr = v.re[p], xi = v.im[p];
      const dr = uv.re[p] - (xr * cr - xi * ci), di = uv.im[p] - (xr * ci + xi * cr);
      s += dr * dr + di * di;
      q += xr * xr + xi * xi;
    }
    norm2[j] = q;
    res[j] = Math.sqrt(s / q);
  }
  // Columns as contiguous rows for the explicit inner products.
  const rows = columnsAsRows(v);
  // |e^{iφ_a} − e^{iφ_c}| from the unit vectors (no sine per pair).
  const cos = Float64Array.from(phases, Math.cos), sin = Float64Array.from(phases, Math.sin);
  const chord = (a: number, c: number) => Math.sqrt((cos[a] - cos[c]) ** 2 + (sin[a] - sin[c]) ** 2);
  return gramDefectBound(rows.re, rows.im, n, norm2, res, chord, GRAM_WINDOW);
}

/** Folds an angle into (−π, π]. */
export function foldPhase(phi: number): number {
  let p = phi - 2 * Math.PI * Math.round(phi / (2 * Math.PI));
  if (p <= -Math.PI) p += 2 * Math.PI;
  if (p > Math.PI) p -= 2 * Math.PI;
  return p;
}

/**
 * 2×2: with e^{2iα} = det U, M = e^{−iα}U lies in SU(2), M = cos β + i sin β n̂·σ,
 * and K = (M − M†)/2i = sin β n̂·σ shares its eigenvectors; K's eigenvalues ±sin β
 * are distinct unless M = ±1, where any basis is an eigenbasis.
 */
function twoByTwoVectors(u: ComplexMatrix): ComplexMatrix {
  const r = u.re, i = u.im;
  const detRe = r[0] * r[3] - i[0] * i[3] - (r[1] * r[2] - i[1] * i[2]);
  const detIm = r[0] * i[3] + i[0] * r[3] - (r[1] * i[2] + i[1] * r[2]);
  const alpha = 0.5 * Math.atan2(detIm, detRe);
  const cr = Math.cos(alpha), ci = -Math.sin(alpha);
  const m = zeros(2, 2);
  for (let p = 0; p < 4; p++) {
    m.re[p] = cr * r[p] - ci * i[p];
    m.im[p] = cr * i[p] + ci * r[p];
  }
  return new HermitianEigen(antiHermitianPart(m)).vectors;
}

/**
 * The whole 2×2 decomposition in scalars (a momentum grid of a two-band model
 * calls it 10⁴ times): the vectors of twoByTwoVectors, written out, then the
 * Rayleigh phases, the ordering and the residual of the general path. Returns
 * null when the two phases lie within CLUSTER_WIDTH, where the general path
 * (cluster re-diagonalisation) takes over.
 */
function twoByTwo(u: ComplexMatrix): { phases: Float64Array; vectors: ComplexMatrix; residual: number } | null {
  const r = u.re, i = u.im;
  const detRe = r[0] * r[3] - i[0] * i[3] - (r[1] * r[2] - i[1] * i[2]);
  const detIm = r[0] * i[3] + i[0] * r[3] - (r[1] * i[2] + i[1] * r[2]);
  const alpha = 0.5 * Math.atan2(detIm, detRe);
  const cr = Math.cos(alpha), ci = -Math.sin(alpha);
  // M = e^{−iα}U; K = (M − M†)/2i, entries as in antiHermitianPart.
  const m0r = cr * r[0] - ci * i[0], m0i = cr * i[0] + ci * r[0];
  const m1r = cr * r[1] - ci * i[1], m1i = cr * i[1] + ci * r[1];
  const m2r = cr * r[2] - ci * i[2], m2i = cr * i[2] + ci * r[2];
  const m3r = cr * r[3] - ci * i[3], m3i = cr * i[3] + ci * r[3];
  const k0 = 0.5 * (m0i + m0i), k3 = 0.5 * (m3i + m3i);
  const k1r = 0.5 * (m1i + m2i), k1i = -0.5 * (m1r - m2r);
  const k2r = 0.5 * (m2i + m1i), k2i = -0.5 * (m2r - m1r);
  // Eigenvectors of K = m + h·σ (closed form of HermitianEigen for n = 2).
  const br = 0.5 * (k2r + k1r), bi = 0.5 * (k2i - k1i);
  const h = 0.5 * (k0 - k3);
  const rad = Math.sqrt(h * h + (br * br + bi * bi));
  let v0r: number, v0i: number, v1r: number, v1i: number, v2r: number, v2i: number, v3r: number, v3i: number;
  if (rad === 0) {
    v0r = 1; v0i = 0; v1r = 0; v1i = 0; v2r = 0; v2i = 0; v3r = 1; v3i = 0;
  } else {
    let x0r: number, x0i: number, x1r: number, x1i: number;
    if (h >= 0) {
      x0r = h + rad; x0i = 0; x1r = br; x1i = bi;
    } else {
      x0r = br; x0i = -bi; x1r = rad - h; x1i = 0;
    }
    const norm = Math.sqrt(x0r * x0r + x0i * x0i + (x1r * x1r + x1i * x1i));
    x0r /= norm; x0i /= norm; x1r /= norm; x1i /= norm;
    v0r = -x1r; v0i = x1i; v2r = x0r; v2i = -x0i; v1r = x0r; v1i = x0i; v3r = x1r; v3i = x1i;
  }
  // UV, column by column.
  const w0r = r[0] * v0r - i[0] * v0i + (r[1] * v2r - i[1] * v2i), w0i = r[0] * v0i + i[0] * v0r + (r[1] * v2i + i[1] * v2r);
  const w2r = r[2] * v0r - i[2] * v0i + (r[3] * v2r - i[3] * v2i), w2i = r[2] * v0i + i[2] * v0r + (r[3] * v2i + i[3] * v2r);
  const w1r = r[0] * v1r - i[0] * v1i + (r[1] * v3r - i[1] * v3i), w1i = r[0] * v1i + i[0] * v1r + (r[1] * v3i + i[1] * v3r);
  const w3r = r[2] * v1r - i[2] * v1i + (r[3] * v3r - i[3] * v3i), w3i = r[2] * v1i + i[2] * v1r + (r[3] * v3i + i[3] * v3r);
  const p0 = foldPhase(Math.atan2(v0r * w0i - v0i * w0r + (v2r * w2i - v2i * w2r), v0r * w0r + v0i * w0i + (v2r * w2r + v2i * w2i)));
  const p1 = foldPhase(Math.atan2(v1r * w1i - v1i * w1r + (v3r * w3i - v3i * w3r), v1r * w1r + v1i * w1i + (v3r * w3r + v3i * w3i)));
  if (Math.abs(foldPhase(p1 - p0)) < CLUSTER_WIDTH) return null;
  const res = columnResidual2(v0r, v0i, v2r, v2i, w0r, w0i, w2r, w2i, p0) + columnResidual2(v1r, v1i, v3r, v3i, w1r, w1i, w3r, w3i, p1);
  const swap = p1 < p0;
  const vectors = swap
    ? { rows: 2, cols: 2, re: Float64Array.of(v1r, v0r, v3r, v2r), im: Float64Array.of(v1i, v0i, v3i, v2i) }
    : { rows: 2, cols: 2, re: Float64Array.of(v0r, v1r, v2r, v3r), im: Float64Array.of(v0i, v1i, v2i, v3i) };
  return { phases: swap ? Float64Array.of(p1, p0) : Float64Array.of(p0, p1), vectors, residual: Math.sqrt(res) };
}

/** ‖Uv − e^{iφ}v‖² for one column (v₀, v₁) with Uv = (w₀, w₁). */
function columnResidual2(v0r: number, v0i: number, v1r: number, v1i: number, w0r: number, w0i: number, w1r: number, w1i: number, phase: number): number {
  const c = Math.cos(phase), s = Math.sin(phase);
  const a = w0r - (v0r * c - v0i * s), b = w0i - (v0r * s + v0i * c);
  const d = w1r - (v1r * c - v1i * s), e = w1i - (v1r * s + v1i * c);
  return a * a + b * b + (d * d + e * e);
}

/** ‖U†U − 1‖_F of a 2×2 matrix in scalars (NaN for non-finite entries). */
function unitarityDefect2(u: ComplexMatrix): number {
  const r = u.re, i = u.im;
  const g00 = r[0] * r[0] + i[0] * i[0] + r[2] * r[2] + i[2] * i[2] - 1;
  const g11 = r[1] * r[1] + i[1] * i[1] + r[3] * r[3] + i[3] * i[3] - 1;
  // (U†U)₀₁ = conj(U₀₀)U₀₁ + conj(U₁₀)U₁₁
  const g01r = r[0] * r[1] + i[0] * i[1] + r[2] * r[3] + i[2] * i[3];
  const g01i = r[0] * i[1] - i[0] * r[1] + r[2] * i[3] - i[2] * r[3];
  return Math.sqrt(g00 * g00 + g11 * g11 + 2 * (g01r * g01r + g01i * g01i));
}

/** K = (M − M†)/(2i), Hermitian by construction. */
function antiHermitianPart(m: ComplexMatrix): ComplexMatrix {
  const n = m.rows;
  const k = zeros(n, n);
  for (let a = 0; a < n; a++) {
    for (let b = 0; b < n; b++) {
      // (M_ab − conj M_ba)/(2i): real part (Im M_ab + Im M_ba)/2, imaginary −(Re M_ab − Re M_ba)/2.
      k.re[a * n + b] = 0.5 * (m.im[a * n + b] + m.im[b * n + a]);
      k.im[a * n + b] = -0.5 * (m.re[a * n + b] - m.re[b * n + a]);
    }
  }
  return k;
}

/**
 * Eigenphases (and, for the dense route, eigenvectors) from the Cayley matrix with
 * the cut at `cut`. With `band` (the bandwidth of U) the inverse comes from a
 * banded LU and no eigenvectors are computed (`vectors` is then empty).
 */
function cayleyPass(u: ComplexMatrix, cut: number, band?: number): { phases: Float64Array; vectors: ComplexMatrix; cut: number } {
  const n = u.rows;
  const theta = cut - Math.PI;
  const wr = Math.cos(theta), wi = -Math.sin(theta);
  let inv: ComplexMatrix;
  if (band !== undefined) {
    const lu = new BandedLu(n, band).factor(u, wr, wi, 1, 0);
    if (lu.singular) return cayleyPass(u, cut + 0.1234567, band);
    inv = zeros(n, n);
    const xr = new Float64Array(n), xi = new Float64Array(n);
    for (let j = 0; j < n; j++) {
      xr.fill(0);
      xi.fill(0);
      xr[j] = 1;
      lu.solveInPlace(xr, xi);
      for (let r = 0; r < n; r++) {
        inv.re[r * n + j] = xr[r];
        inv.im[r * n + j] = xi[r];
      }
    }
  } else {
    const onePlusW = zeros(n, n);
    for (let p = 0; p < n * n; p++) {
      onePlusW.re[p] = wr * u.re[p] - wi * u.im[p];
      onePlusW.im[p] = wr * u.im[p] + wi * u.re[p];
    }
    for (let k = 0; k < n; k++) onePlusW.re[k * n + k] += 1;
    const lu = new LuDecomposition(onePlusW);
    if (lu.singular) {
      // An eigenvalue sits exactly on the cut; move the cut by a small irrational amount.
      return cayleyPass(u, cut + 0.1234567);
    }
    inv = lu.inverse();
  }
  // A = 2i X − i, then symmetrised inside HermitianEigen.
  const a = zeros(n, n);
  for (let p = 0; p < n * n; p++) {
    a.re[p] = -2 * inv.im[p];
    a.im[p] = 2 * inv.re[p];
  }
  for (let k = 0; k < n; k++) a.im[k * n + k] -= 1;
  const eig = new HermitianEigen(a, { hermiticityTolerance: Infinity, vectors: band === undefined });
  const phases = new Float64Array(n);
  for (let k = 0; k < n; k++) phases[k] = foldPhase(theta + 2 * Math.atan(eig.values[k]));
  return { phases, vectors: band === undefined ? eig.vectors : zeros(0, 0), cut };
}

/** Distance of the nearest eigenphase from the cut, and the centre and width of the largest gap. */
function cutClearance(phases: Float64Array, cut: number): { distance: number; gapCentre: number; gapWidth: number } {
  const sorted = Float64Array.from(phases).sort();
  let distance = Infinity;
  for (const p of sorted) distance = Math.min(distance, Math.abs(foldPhase(p - cut)));
  const { below, width } = largestGap(sorted);
  return { distance, gapCentre: foldPhase(sorted[below] + 0.5 * width), gapWidth: width };
}

/** Largest gap between circularly consecutive entries of ascending phases: index of the phase below it, and its width. */
function largestGap(sorted: ArrayLike<number>): { below: number; width: number } {
  const n = sorted.length;
  let below = 0, width = -1;
  for (let k = 0; k < n; k++) {
    const hi = k + 1 < n ? sorted[k + 1] : sorted[0] + 2 * Math.PI;
    if (hi - sorted[k] > width) {
      width = hi - sorted[k];
      below = k;
    }
  }
  return { below, width };
}

/** φ_j = arg(v_j† (U v_j)). */
function rayleighPhases(v: ComplexMatrix, uv: ComplexMatrix): Float64Array {
  const n = v.rows;
  const phases = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let sr = 0, si = 0;
    for (let r = 0; r < n; r++) {
      const p = r * n + j;
      sr += v.re[p] * uv.re[p] + v.im[p] * uv.im[p];
      si += v.re[p] * uv.im[p] - v.im[p] * uv.re[p];
    }
    phases[j] = foldPhase(Math.atan2(si, sr));
  }
  return phases;
}

/**
 * Re-diagonalises each cluster of eigenphases closer than CLUSTER_WIDTH (on the
 * circle) from C = V_c†UV_c: with φ̄ the cluster's phase, K = (e^{−iφ̄}C − h.c.)/2i
 * has eigenvalues sin(φ − φ̄), monotonic inside the cluster. Updates V and UV in place.
 */
/** Re-diagonalises clusters (see above); returns the Rayleigh phases when no cluster needed it (else null: they changed). */
function refineClusters(v: ComplexMatrix, uv: ComplexMatrix): Float64Array | null {
  const n = v.rows;
  if (n < 2) return null;
  const phases = rayleighPhases(v, uv);
  let changed = false;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => phases[a] - phases[b]);
  // Start the scan after the largest gap so no cluster wraps around the array end.
  const start = (largestGap(order.map((j) => phases[j])).below + 1) % n;
  let cluster: number[] = [order[start]];
  const flush = () => {
    if (cluster.length > 1) {
      rediagonalise(v, uv, cluster, phases[cluster[0]]);
      changed = true;
    }
  };
  for (let step = 1; step < n; step++) {
    const prev = order[(start + step - 1) % n], cur = order[(start + step) % n];
    if (Math.abs(foldPhase(phases[cur] - phases[prev])) < CLUSTER_WIDTH) cluster.push(cur);
    else {
      flush();
      cluster = [cur];
    }
  }
  flush();
  return changed ? null : phases;
}

function rediagonalise(v: ComplexMatrix, uv: ComplexMatrix, cols: number[], phase: number): void {
  const c = scale(projectColumns(v, uv, cols), Math.cos(phase), -Math.sin(phase));
  const z = new HermitianEigen(antiHermitianPart(c)).vectors;
  rotateColumnsInPlace(v, cols, z);
  rotateColumnsInPlace(uv, cols, z);
}

function residualNorm(v: ComplexMatrix, uv: ComplexMatrix, phases: Float64Array): number {
  const n = v.rows;
  let s = 0;
  for (let j = 0; j < n; j++) {
    const cr = Math.cos(phases[j]), ci = Math.sin(phases[j]);
    for (let r = 0; r < n; r++) {
      const p = r * n + j;
      const dr = uv.re[p] - (v.re[p] * cr - v.im[p] * ci);
      const di = uv.im[p] - (v.re[p] * ci + v.im[p] * cr);
      s += dr * dr + di * di;
    }
  }
  return Math.sqrt(s);
}
