/**
 * The whole eigen-decomposition of a banded unitary U (a ribbon's or an open
 * chain's Floquet operator), in O(n² b²) work instead of the O(n³) of a dense
 * Householder reduction.
 *
 * Method. With W = e^{−iθ}U, the Hermitian part A = (W + W†)/2 is banded
 * (same bandwidth b) and, U being normal, A = Σ cos(φ_j − θ) P_j: A has the
 * eigenvectors of U and the eigenvalues cos(φ_j − θ). So
 *  1. the eigenvalues of A come from the band-preserving reduction to
 *     tridiagonal form and QL (band-tridiagonal.ts), O(n² b);
 *  2. its eigenvectors from banded inverse iteration on A
 *     (banded-inverse-iteration.ts), O(n² b²);
 *  3. eigenvalues of A closer than CLUSTER_SEPARATION are grouped (two
 *     eigenphases mirror-symmetric about θ share a cosine, and so does a
 *     degenerate pair); each group spans an invariant subspace of U and is
 *     re-diagonalised through the small matrix V_g†UV_g (unitary-eigen.ts);
 *  4. the eigenphases are Rayleigh quotients arg v†Uv, accurate to rounding in
 *     U, and near-degenerate phases are re-diagonalised as in unitary-eigen.ts.
 * θ is placed where A is steepest for the spectrum at hand: θ and θ + π are
 * put as far as possible from every eigenphase of a previous, nearby spectrum
 * (`rotationFor`), so that cos(φ − θ) separates the phases well; a poor θ
 * costs time (large groups), never correctness.
 *
 * Certificate: the result is accepted when ‖UV − VΛ‖_F ≤ RESIDUAL_TARGET·n and
 * the bound on ‖V†V − 1‖_F (unitary-eigen.ts, orthogonalityBound) is below the
 * same; otherwise the dense route of UnitaryEigen is taken.
 */
import type { ComplexMatrix } from './complex-matrix.ts';
import { projectColumns, rotateColumnsInPlace, zeros } from './complex-matrix.ts';
import { BandedMatrix } from './banded-matrix.ts';
import { bandHermitianEigenvalues } from './band-tridiagonal.ts';
import { bandedInverseIteration, CLUSTER_SEPARATION, closeGroups } from './banded-inverse-iteration.ts';
import { BANDED_MAX_FRACTION, finish, foldPhase, orthogonalityBound, RESIDUAL_TARGET, UnitaryEigen } from './unitary-eigen.ts';
import { HermitianEigen } from './hermitian-eigen.ts';
import { narrowingOrder, permuteBanded } from './band-reordering.ts';
import { MatrixInputError } from './checks.ts';

/** The golden angle: no eigenphase commonly sits there. */
const DEFAULT_ROTATION = Math.PI * (3 - Math.sqrt(5));

export interface BandedEigenResult {
  /** Eigenphases φ in (−π, π], ascending. */
  phases: Float64Array;
  /** Orthonormal eigenvectors (dense n×n, columns in the order of `phases`). */
  vectors: ComplexMatrix;
  /** ‖UV − V diag(e^{iφ})‖_F. */
  residual: number;
  /** 'band': the route above; 'dense': certification failed and UnitaryEigen took over. */
  route: 'band' | 'dense';
}

/** Number of states in groups of cosines cos(φ − θ) closer than CLUSTER_SEPARATION (the work of step 3). */
function groupedStates(phases: ArrayLike<number>, theta: number): number {
  const c = Float64Array.from(phases, (p) => Math.cos(p - theta)).sort();
  let grouped = 0;
  for (let j = 1; j < c.length; j++) if (c[j] - c[j - 1] < CLUSTER_SEPARATION) grouped += j > 1 && c[j - 1] - c[j - 2] < CLUSTER_SEPARATION ? 1 : 2;
  return grouped;
}

/**
 * A rotation θ for the phases of a nearby spectrum: among the midpoints of the
 * widest gaps of the phases merged with the phases − π (where θ and θ + π both
 * keep clear of every phase, so cos(φ − θ) is steep at every phase), the one
 * that leaves the fewest cosines in groups (a spectrum symmetric about θ would
 * pair every phase with its mirror image).
 */
export function rotationFor(phases: ArrayLike<number>): number {
  const n = phases.length;
  if (n === 0) return DEFAULT_ROTATION;
  const merged = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    merged[i] = foldPhase(phases[i]);
    merged[n + i] = foldPhase(phases[i] - Math.PI);
  }
  merged.sort();
  const gaps: { width: number; at: number }[] = [];
  for (let k = 0; k < merged.length; k++) {
    const hi = k + 1 < merged.length ? merged[k + 1] : merged[0] + 2 * Math.PI;
    gaps.push({ width: hi - merged[k], at: foldPhase(merged[k] + 0.5 * (hi - merged[k])) });
  }
  gaps.sort((a, b) => b.width - a.width);
  // Candidates: the widest gaps first, then evenly spaced angles (a flat band is best met where the cosine is steepest).
  const candidates = [...gaps.slice(0, 8).map((g) => g.at), ...Array.from({ length: 24 }, (_, k) => foldPhase(DEFAULT_ROTATION + (k * Math.PI) / 24))];
  let best = DEFAULT_ROTATION, fewest = Infinity;
  for (const theta of candidates) {
    const grouped = groupedStates(phases, theta);
    if (grouped < fewest) {
      fewest = grouped;
      best = theta;
    }
    if (fewest === 0) break;
  }
  return best;
}

/** C = U·V for a banded U and a dense V (n × m). */
export function multiplyBandedDense(u: BandedMatrix, v: ComplexMatrix): ComplexMatrix {
  const n = u.n, m = v.cols, b = u.b, w = u.width;
  const out = zeros(n, m);
  for (let i = 0; i < n; i++) {
    const lo = Math.max(0, i - b), hi = Math.min(n - 1, i + b);
    const o = i * w - i + b, row = i * m;
    for (let k = lo; k <= hi; k++) {
      const ar = u.re[o + k], ai = u.im[o + k];
      if (ar === 0 && ai === 0) continue;
      const vk = k * m;
      for (let j = 0; j < m; j++) {
        const br = v.re[vk + j], bi = v.im[vk + j];
        out.re[row + j] += ar * br - ai * bi;
        out.im[row + j] += ar * bi + ai * br;
      }
    }
  }
  return out;
}

/** (W + W†)/2 with W = e^{−iθ}U, in band storage. */
function hermitianPart(u: BandedMatrix, theta: number): BandedMatrix {
  const { n, b } = u;
  const a = new BandedMatrix(n, b);
  const cr = Math.cos(theta), ci = -Math.sin(theta);
  for (let i = 0; i < n; i++) {
    const hi = Math.min(n - 1, i + b);
    for (let j = i; j <= hi; j++) {
      const p = u.index(i, j), q = u.index(j, i);
      // W_ij = e^{−iθ}U_ij; A_ij = (W_ij + conj W_ji)/2.
      const wr = cr * u.re[p] - ci * u.im[p], wi = cr * u.im[p] + ci * u.re[p];
      const xr = cr * u.re[q] - ci * u.im[q], xi = cr * u.im[q] + ci * u.re[q];
      const sr = 0.5 * (wr + xr), si = 0.5 * (wi - xi);
      a.re[a.index(i, j)] = sr;
      a.im[a.index(i, j)] = i === j ? 0 : si;
      a.re[a.index(j, i)] = sr;
      a.im[a.index(j, i)] = i === j ? 0 : -si;
    }
  }
  return a;
}

/**
 * Eigen-decomposition of the banded unitary `u`; `rotation` is θ (see
 * rotationFor). The states are first reordered to narrow the band when that
 * helps (band-reordering.ts); the eigenvectors are returned in the original order.
 */
export function bandedUnitaryEigen(u: BandedMatrix, rotation: number = DEFAULT_ROTATION): BandedEigenResult {
  const order = narrowingOrder(u);
  if (order === null) return eigenInOrder(u, rotation);
  const result = eigenInOrder(permuteBanded(u, order), rotation);
  // Row k of the permuted eigenvectors is state order[k].
  const n = u.n, v = result.vectors;
  const re = new Float64Array(n * n), im = new Float64Array(n * n);
  for (let k = 0; k < n; k++) {
    re.set(v.re.subarray(k * n, k * n + n), order[k] * n);
    im.set(v.im.subarray(k * n, k * n + n), order[k] * n);
  }
  return { ...result, vectors: { rows: n, cols: n, re, im } };
}

function eigenInOrder(u: BandedMatrix, rotation: number): BandedEigenResult {
  const n = u.n;
  const dense = (): BandedEigenResult => {
    const e = new UnitaryEigen(u.toDense());
    return { phases: e.phases, vectors: e.vectors, residual: e.residual, route: 'dense' };
  };
  if (n <= 2 || u.b * BANDED_MAX_FRACTION > n) return dense();
  const a = hermitianPart(u, rotation);
  const values = bandHermitianEigenvalues(a);
  // Groups of close cosines; large groups (flat bands) are cheaper on the dense route.
  const groups = closeGroups(values);
  if (groups.reduce((m, g) => Math.max(m, g.length), 0) * 2 > n) return dense();
  const order = Array.from({ length: n }, (_, j) => j);
  const v = bandedInverseIteration({ banded: a }, values, new Float64Array(n), order);
  const uv = multiplyBandedDense(u, v);
  // A group whose inverse-iteration vectors do not span an invariant subspace (large, nearly degenerate groups,
  // e.g. the flat bands of a complete-transfer drive) projects to a non-unitary block: the dense route decides.
  try {
    for (const g of groups) if (g.length > 1) rediagonaliseGroup(v, uv, g);
  } catch (error) {
    if (error instanceof MatrixInputError) return dense();
    throw error;
  }
  const done = finish(v, uv);
  const certified = done.residual <= RESIDUAL_TARGET * n && orthogonalityBound(done.vectors, done.uv, done.phases) <= RESIDUAL_TARGET * n;
  if (!certified) return dense();
  return { phases: done.phases, vectors: done.vectors, residual: done.residual, route: 'band' };
}

/**
 * Replaces the columns `cols` of V (and of AV) by eigenvectors of A inside their
 * span (V_g†AV_g diagonalised), A unitary or, with `hermitian`, Hermitian.
 */
export function rediagonaliseGroup(v: ComplexMatrix, uv: ComplexMatrix, cols: number[], hermitian = false): void {
  const c = projectColumns(v, uv, cols);
  const z = hermitian ? new HermitianEigen(c, { hermiticityTolerance: Infinity }).vectors : new UnitaryEigen(c).vectors;
  rotateColumnsInPlace(v, cols, z);
  rotateColumnsInPlace(uv, cols, z);
}
