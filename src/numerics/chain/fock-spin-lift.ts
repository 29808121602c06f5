/**
 * Many-body (Fock-space) evolution of a quadratic fermion Hamiltonian at one
 * momentum, used to fix the sign of the spin lift of a real orthogonal
 * Floquet operator.
 *
 * n fermion modes, Fock dimension 2ⁿ, Jordan–Wigner ordering (common practice):
 * c_j = (Π_{i<j} (−1)^{n_i}) σ⁻_j. Majorana operators γ_j = c_j + c_j† and
 * γ_{n+j} = −i(c_j − c_j†) (j < n), {γ_a, γ_b} = 2δ_ab. A Majorana-basis
 * single-particle matrix H_M (2n×2n, purely imaginary antisymmetric for a
 * particle–hole symmetric BdG matrix) corresponds to Ĥ = ¼ Σ_ab (H_M)_ab γ_a γ_b.
 *
 * For Û = exp(½θ γ₁γ₂) (the lift of a rotation by θ in one plane) Tr Û = 2cos(θ/2),
 * so for a product of exponentials Tr Û = s · Π_j 2cos(θ_j/2) with the principal
 * angles |θ_j| < π of the single-particle rotation and s = ±1 the sign of the lift.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import { zeros } from '../linalg/complex-matrix.ts';

/** Largest number of fermion modes handled (Fock dimension 2⁸ = 256). */
export const MAX_FOCK_MODES = 8;

/** Majorana operators γ_0 … γ_{2n−1} as 2ⁿ×2ⁿ matrices. */
export function majoranaOperators(n: number): ComplexMatrix[] {
  if (!(Number.isInteger(n) && n >= 1 && n <= MAX_FOCK_MODES)) {
    throw new RangeError(`majoranaOperators: ${n} modes outside 1…${MAX_FOCK_MODES}`);
  }
  const d = 1 << n;
  const ops: ComplexMatrix[] = [];
  const lowered: ComplexMatrix[] = [];
  for (let j = 0; j < n; j++) {
    // c_j |b⟩ = (−1)^{popcount(b & (2^j − 1))} |b − 2^j⟩ when bit j is set.
    const c = zeros(d, d);
    for (let b = 0; b < d; b++) {
      if (((b >> j) & 1) === 0) continue;
      const sign = popcount(b & ((1 << j) - 1)) % 2 === 0 ? 1 : -1;
      c.re[(b ^ (1 << j)) * d + b] = sign;
    }
    lowered.push(c);
  }
  for (let j = 0; j < n; j++) {
    const g = zeros(d, d);
    const c = lowered[j];
    for (let r = 0; r < d; r++) for (let q = 0; q < d; q++) g.re[r * d + q] = c.re[r * d + q] + c.re[q * d + r];
    ops.push(g);
  }
  for (let j = 0; j < n; j++) {
    const g = zeros(d, d);
    const c = lowered[j];
    // −i(c − c†): real matrix (c − c†) times −i.
    for (let r = 0; r < d; r++) for (let q = 0; q < d; q++) g.im[r * d + q] = -(c.re[r * d + q] - c.re[q * d + r]);
    ops.push(g);
  }
  return ops;
}

/** Ĥ = ¼ Σ_ab (H_M)_ab γ_a γ_b, with the products γ_aγ_b precomputed by `prepareFockMap`. */
export function fockHamiltonian(hm: ComplexMatrix, products: ComplexMatrix[][]): ComplexMatrix {
  const m = hm.rows;
  const d = products[0][0].rows;
  const out = zeros(d, d);
  for (let a = 0; a < m; a++) {
    for (let b = 0; b < m; b++) {
      if (a === b) continue;
      const xr = 0.25 * hm.re[a * m + b], xi = 0.25 * hm.im[a * m + b];
      if (xr === 0 && xi === 0) continue;
      const p = products[a][b];
      for (let q = 0; q < d * d; q++) {
        const pr = p.re[q], pi = p.im[q];
        if (pr === 0 && pi === 0) continue;
        out.re[q] += xr * pr - xi * pi;
        out.im[q] += xr * pi + xi * pr;
      }
    }
  }
  return out;
}

/** γ_a γ_b for all a, b. */
export function majoranaProducts(ops: ComplexMatrix[]): ComplexMatrix[][] {
  return ops.map((ga) => ops.map((gb) => sparseProduct(ga, gb)));
}

function sparseProduct(a: ComplexMatrix, b: ComplexMatrix): ComplexMatrix {
  const d = a.rows;
  const c = zeros(d, d);
  for (let i = 0; i < d; i++) {
    for (let k = 0; k < d; k++) {
      const ar = a.re[i * d + k], ai = a.im[i * d + k];
      if (ar === 0 && ai === 0) continue;
      for (let j = 0; j < d; j++) {
        const br = b.re[k * d + j], bi = b.im[k * d + j];
        if (br === 0 && bi === 0) continue;
        c.re[i * d + j] += ar * br - ai * bi;
        c.im[i * d + j] += ar * bi + ai * br;
      }
    }
  }
  return c;
}

function popcount(x: number): number {
  let c = 0;
  while (x) {
    c += x & 1;
    x >>= 1;
  }
  return c;
}
