/**
 * Eigenvectors of a band matrix for given approximate eigenvalues by inverse
 * iteration on the matrix itself (Wilkinson, The Algebraic Eigenvalue Problem,
 * §9.42; the cluster treatment follows LAPACK's stein): for each shift σ,
 * factor A − σ once (banded LU, O(n b²)), solve (A − σ)x = y from a seeded
 * start vector and repeat. Shifts closer than CLUSTER_SEPARATION are grouped;
 * inside a group every iterate is re-orthogonalised (modified Gram–Schmidt,
 * applied twice) against the group's vectors already found, so exact and near
 * degeneracies still yield an orthonormal basis of the invariant subspace.
 * Vectors of different groups are orthogonal up to (r_i + r_j)/|σ_i − σ_j| with
 * r the residuals when A is normal; the caller certifies that bound and the
 * residuals and falls back to a dense route when they are not met.
 * Cost: one factorisation and a few solves per vector, O(n² b²) for all n,
 * against O(n³) for the back-transform of a dense eigensolver. From a random
 * start two solves are taken (the second purifies the first against close
 * eigenvectors).
 *
 * Two users: a unitary U with eigenphases φ (shifts e^{iφ} on the circle,
 * unitary-eigen.ts) and a Hermitian band matrix with real eigenvalues
 * (banded-unitary-eigen.ts, where (W + W†)/2 stands in for W).
 */
import type { ComplexMatrix } from './complex-matrix.ts';
import { zeros } from './complex-matrix.ts';
import { BandedLu } from './banded-lu.ts';
import { BandedMatrix } from './banded-matrix.ts';
import { projectOut } from './complex-rows.ts';

/** Shifts closer than this are re-orthogonalised together. */
export const CLUSTER_SEPARATION = 1e-3;
/** Solves per eigenvector at most (LAPACK's stein uses five). */
const MAX_SOLVES = 5;

/** The matrix whose eigenvectors are wanted, in band storage. */
export type BandSource = { banded: BandedMatrix };

/**
 * Unit eigenvectors (columns, in the order of `shiftsRe`/`shiftsIm`) of the
 * matrix `source` for the approximate eigenvalues σ_j = shiftsRe[j] + i·shiftsIm[j].
 * `order` lists the shifts in the order to visit them, with neighbours in it
 * grouped when |σ − σ'| < CLUSTER_SEPARATION (the caller orders them so that
 * close shifts are adjacent).
 */
export function bandedInverseIteration(source: BandSource, shiftsRe: Float64Array, shiftsIm: Float64Array, order: ArrayLike<number>): ComplexMatrix {
  const n = source.banded.n;
  const b = source.banded.b;
  const m = shiftsRe.length;
  const eps = 2 ** -52;
  // A normalised iterate whose preimage grew beyond this has residual below 1/growth.
  const growthTarget = 1 / (n * eps);
  const lu = new BandedLu(n, b);
  // Row j of (tr, ti) is eigenvector j (contiguous for Gram–Schmidt).
  const tr = new Float64Array(m * n), ti = new Float64Array(m * n);
  const xr = new Float64Array(n), xi = new Float64Array(n);
  let seed = 0x2545f491;
  const random = () => {
    seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
    return seed / 4294967296 - 0.5;
  };
  const group: number[] = [];
  for (let step = 0; step < order.length; step++) {
    const j = order[step];
    if (step > 0) {
      const prev = order[step - 1];
      if (Math.hypot(shiftsRe[j] - shiftsRe[prev], shiftsIm[j] - shiftsIm[prev]) >= CLUSTER_SEPARATION) group.length = 0;
    }
    lu.factorBanded(source.banded, 1, 0, -shiftsRe[j], -shiftsIm[j], eps);
    for (let r = 0; r < n; r++) { xr[r] = random(); xi[r] = random(); }
    normalise(xr, xi);
    let extra = 1;
    for (let solve = 0; solve < MAX_SOLVES; solve++) {
      lu.solveInPlace(xr, xi);
      for (let pass = 0; pass < 2; pass++) for (const g of group) projectOut(tr, ti, g * n, xr, xi, 0, n);
      const growth = normalise(xr, xi);
      if (growth >= growthTarget && extra-- === 0) break;
    }
    tr.set(xr, j * n);
    ti.set(xi, j * n);
    group.push(j);
  }
  const v = zeros(n, m);
  for (let j = 0; j < m; j++) {
    for (let r = 0; r < n; r++) {
      v.re[r * m + j] = tr[j * n + r];
      v.im[r * m + j] = ti[j * n + r];
    }
  }
  return v;
}

/**
 * Unit eigenvectors (columns, in the order of `phases`) of the unitary `u`
 * with bandwidth `b`, for approximate eigenphases `phases`.
 */
export function unitaryInverseIteration(u: ComplexMatrix, b: number, phases: Float64Array): ComplexMatrix {
  const n = u.rows;
  const order = Array.from({ length: n }, (_, i) => i).sort((p, q) => phases[p] - phases[q]);
  // Begin after the largest circular gap so that no group wraps around ±π.
  let start = 0, widest = -1;
  for (let k = 0; k < n; k++) {
    const hi = k + 1 < n ? phases[order[k + 1]] : phases[order[0]] + 2 * Math.PI;
    if (hi - phases[order[k]] > widest) { widest = hi - phases[order[k]]; start = (k + 1) % n; }
  }
  const visit = Array.from({ length: n }, (_, k) => order[(start + k) % n]);
  return bandedInverseIteration({ banded: BandedMatrix.fromDense(u, b) }, Float64Array.from(phases, Math.cos), Float64Array.from(phases, Math.sin), visit);
}

/** Scales (xr, xi) to unit norm; returns the norm before scaling. */
function normalise(xr: Float64Array, xi: Float64Array): number {
  let s = 0;
  for (let r = 0; r < xr.length; r++) s += xr[r] * xr[r] + xi[r] * xi[r];
  const norm = Math.sqrt(s);
  const inv = norm > 0 ? 1 / norm : 0;
  for (let r = 0; r < xr.length; r++) { xr[r] *= inv; xi[r] *= inv; }
  return norm;
}

/** Indices 0 … n−1 of ascending values, grouped where neighbours lie closer than CLUSTER_SEPARATION (chained). */
export function closeGroups(values: ArrayLike<number>): number[][] {
  const groups: number[][] = [];
  for (let j = 0; j < values.length; j++) {
    if (j > 0 && values[j] - values[j - 1] < CLUSTER_SEPARATION) groups[groups.length - 1].push(j);
    else groups.push([j]);
  }
  return groups;
}
