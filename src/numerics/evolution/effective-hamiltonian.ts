/**
 * Effective (Floquet) Hamiltonian with a chosen branch cut:
 *     H_ε^eff = (i/T) log_ε U(T),   U(T) = exp(−i H_ε^eff T),
 * where every eigenvalue of H_ε^eff lies in the window (ε − 2π/T, ε]. The cut ε is
 * the quasienergy inside the gap under study, in absolute units (not units of
 * π/T); this is the operator entering the Rudner–Lindner–Berg–Levin construction
 * V = U(t) exp(+i H_ε^eff t) (Rudner, Lindner, Berg, Levin, PRX 3, 031005 (2013)).
 * Eigenvalues of U are e^{iφ} = e^{−iεT}, so a quasienergy is ε = −φ/T mod 2π/T.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import { zeros } from '../linalg/complex-matrix.ts';
import { UnitaryEigen } from '../linalg/unitary-eigen.ts';

/** Quasienergy in (cut − 2π/T, cut] for the eigenphase φ of U(T). */
export function quasienergyBelowCut(phase: number, period: number, cutQuasienergy: number): number {
  const zone = (2 * Math.PI) / period;
  const x = cutQuasienergy + phase / period;
  let r = x - zone * Math.floor(x / zone);
  if (r >= zone) r -= zone;
  return cutQuasienergy - r;
}

export function effectiveHamiltonian(u: ComplexMatrix, period: number, cutQuasienergy: number): ComplexMatrix {
  if (!(period > 0) || !Number.isFinite(period)) throw new RangeError(`effectiveHamiltonian: period must be a positive number, got ${period}`);
  if (!Number.isFinite(cutQuasienergy)) throw new RangeError(`effectiveHamiltonian: cut quasienergy must be finite, got ${cutQuasienergy}`);
  const eig = new UnitaryEigen(u);
  const n = u.rows;
  const eps = new Float64Array(n);
  for (let j = 0; j < n; j++) eps[j] = quasienergyBelowCut(eig.phases[j], period, cutQuasienergy);
  return spectralSum(eig.vectors, eps);
}

/** V diag(λ) V†, made exactly Hermitian. */
export function spectralSum(v: ComplexMatrix, lambda: ArrayLike<number>): ComplexMatrix {
  const n = v.rows;
  const h = zeros(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let sr = 0, si = 0;
      for (let k = 0; k < n; k++) {
        const ar = v.re[i * n + k], ai = v.im[i * n + k];
        const br = v.re[j * n + k], bi = -v.im[j * n + k];
        const l = lambda[k];
        sr += l * (ar * br - ai * bi);
        si += l * (ar * bi + ai * br);
      }
      h.re[i * n + j] = sr;
      h.im[i * n + j] = si;
      h.re[j * n + i] = sr;
      h.im[j * n + i] = -si;
    }
    h.im[i * n + i] = 0;
  }
  return h;
}

/** ε = −φ/T folded into (−π/T, π/T], element by element (same order as `phases`). */
export function quasienergiesFromPhases(phases: ArrayLike<number>, period: number): Float64Array {
  const out = new Float64Array(phases.length);
  for (let j = 0; j < phases.length; j++) out[j] = quasienergyBelowCut(phases[j], period, Math.PI / period);
  return out;
}
