/**
 * The whole eigen-decomposition of a Hermitian band matrix (a static ribbon
 * Hamiltonian) in O(n² b²): eigenvalues from the band-preserving reduction to
 * tridiagonal form and QL (band-tridiagonal.ts), eigenvectors by banded
 * inverse iteration (banded-inverse-iteration.ts), groups of eigenvalues
 * closer than CLUSTER_SEPARATION re-diagonalised through V_g†HV_g.
 *
 * Certificate, as for the unitary route (banded-unitary-eigen.ts): accepted
 * when ‖HV − VΛ‖_F ≤ RESIDUAL_TARGET·n·max(1, ‖H‖) and the bound on
 * ‖V†V − 1‖_F (explicit Gram entries for eigenvalues closer than
 * GRAM_WINDOW·max(1, ‖H‖), (r_i + r_j)/|λ_i − λ_j| for the other pairs, valid
 * for any Hermitian H) is below RESIDUAL_TARGET·n; otherwise the dense
 * Householder route (hermitian-eigen.ts) is taken.
 */
import type { ComplexMatrix } from './complex-matrix.ts';
import type { BandedMatrix } from './banded-matrix.ts';
import { bandHermitianEigenvalues } from './band-tridiagonal.ts';
import { bandedInverseIteration, closeGroups } from './banded-inverse-iteration.ts';
import { multiplyBandedDense, rediagonaliseGroup } from './banded-unitary-eigen.ts';
import { HermitianEigen } from './hermitian-eigen.ts';
import { columnsAsRows, gramDefectBound, innerProductInto } from './complex-rows.ts';
import { BANDED_MAX_FRACTION, RESIDUAL_TARGET } from './unitary-eigen.ts';

const GRAM_WINDOW = 0.05;

export interface BandedHermitianResult {
  /** Eigenvalues, ascending. */
  values: Float64Array;
  /** Orthonormal eigenvectors (dense n×n, columns in the order of `values`). */
  vectors: ComplexMatrix;
  /** ‖HV − VΛ‖_F. */
  residual: number;
  route: 'band' | 'dense';
}

export function bandedHermitianEigen(h: BandedMatrix): BandedHermitianResult {
  const n = h.n;
  const dense = (): BandedHermitianResult => {
    const e = new HermitianEigen(h.toDense(), { hermiticityTolerance: Infinity });
    return { values: e.values, vectors: e.vectors, residual: residualNorm(multiplyBandedDense(h, e.vectors), e.vectors, e.values), route: 'dense' };
  };
  if (n <= 2 || h.b * BANDED_MAX_FRACTION > n) return dense();
  const scale = Math.max(1, h.normBound());
  const values = bandHermitianEigenvalues(h);
  const groups = closeGroups(values);
  if (groups.reduce((m, g) => Math.max(m, g.length), 0) * 2 > n) return dense();
  const v = bandedInverseIteration({ banded: h }, values, new Float64Array(n), Array.from({ length: n }, (_, j) => j));
  const hv = multiplyBandedDense(h, v);
  for (const g of groups) if (g.length > 1) rediagonaliseGroup(v, hv, g, true);
  // Rayleigh quotients, then ascending order.
  const rayleigh = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let r = 0; r < n; r++) s += v.re[r * n + j] * hv.re[r * n + j] + v.im[r * n + j] * hv.im[r * n + j];
    rayleigh[j] = s;
  }
  const order = Array.from({ length: n }, (_, j) => j).sort((a, b) => rayleigh[a] - rayleigh[b]);
  const permute = (m: ComplexMatrix): ComplexMatrix => {
    const out = { rows: n, cols: n, re: new Float64Array(n * n), im: new Float64Array(n * n) };
    for (let r = 0; r < n; r++) {
      for (let c = 0; c < n; c++) {
        out.re[r * n + c] = m.re[r * n + order[c]];
        out.im[r * n + c] = m.im[r * n + order[c]];
      }
    }
    return out;
  };
  const vectors = permute(v), hvs = permute(hv);
  const sorted = Float64Array.from(order, (j) => rayleigh[j]);
  const residual = residualNorm(hvs, vectors, sorted);
  if (!(residual <= RESIDUAL_TARGET * n * scale)) return dense();
  if (!(orthogonalityBound(vectors, hvs, sorted, scale) <= RESIDUAL_TARGET * n)) return dense();
  return { values: sorted, vectors, residual, route: 'band' };
}

function columnResiduals(hv: ComplexMatrix, v: ComplexMatrix, values: Float64Array): Float64Array {
  const n = v.rows, m = v.cols;
  const out = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    let s = 0;
    for (let r = 0; r < n; r++) {
      const p = r * m + j;
      const dr = hv.re[p] - values[j] * v.re[p], di = hv.im[p] - values[j] * v.im[p];
      s += dr * dr + di * di;
    }
    out[j] = Math.sqrt(s);
  }
  return out;
}

function residualNorm(hv: ComplexMatrix, v: ComplexMatrix, values: Float64Array): number {
  let s = 0;
  for (const r of columnResiduals(hv, v, values)) s += r * r;
  return Math.sqrt(s);
}

/** Upper bound on ‖V†V − 1‖_F for ascending eigenvalues (see the file comment). */
function orthogonalityBound(v: ComplexMatrix, hv: ComplexMatrix, values: Float64Array, scale: number): number {
  const n = v.rows;
  const rows = columnsAsRows(v);
  const self = new Float64Array(2);
  const norm2 = Float64Array.from({ length: v.cols }, (_, j) => {
    innerProductInto(self, rows.re, rows.im, j * n, rows.re, rows.im, j * n, n);
    return self[0];
  });
  return gramDefectBound(rows.re, rows.im, n, norm2, columnResiduals(hv, v, values), (i, j) => values[j] - values[i], GRAM_WINDOW * scale);
}
