/**
 * Seeded pseudo-random numbers for tests: mulberry32 (a 32-bit generator in
 * common use for reproducible test data), plus random complex matrices built
 * from it. The same seed always gives the same matrices on every platform.
 */
import type { ComplexMatrix } from '../../src/numerics/linalg/complex-matrix.ts';
import { zeros } from '../../src/numerics/linalg/complex-matrix.ts';

export type Random = () => number;

/** Uniform numbers in [0, 1) from a 32-bit seed. */
export function seededRandom(seed: number): Random {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviates (Box–Muller). */
export function gaussian(random: Random): number {
  const u = 1 - random();
  const v = random();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

/** Dense complex matrix with independent uniform entries in [−1, 1) (real and imaginary parts). */
export function randomComplexMatrix(random: Random, rows: number, cols: number = rows): ComplexMatrix {
  const m = zeros(rows, cols);
  for (let p = 0; p < rows * cols; p++) {
    m.re[p] = 2 * random() - 1;
    m.im[p] = 2 * random() - 1;
  }
  return m;
}

/** Random Hermitian matrix (A + A†)/2 of a uniform complex A; diagonal real. */
export function randomHermitian(random: Random, n: number): ComplexMatrix {
  const a = randomComplexMatrix(random, n);
  const h = zeros(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      h.re[i * n + j] = 0.5 * (a.re[i * n + j] + a.re[j * n + i]);
      h.im[i * n + j] = 0.5 * (a.im[i * n + j] - a.im[j * n + i]);
    }
  }
  return h;
}

/**
 * Haar-distributed random unitary: Gram–Schmidt (twice, for orthogonality to
 * rounding) on the columns of a complex Gaussian matrix (Mezzadri, Notices AMS 54,
 * 592 (2007), from memory). Built independently of the code under test.
 */
export function randomUnitary(random: Random, n: number): ComplexMatrix {
  const q = zeros(n, n);
  for (let p = 0; p < n * n; p++) {
    q.re[p] = gaussian(random);
    q.im[p] = gaussian(random);
  }
  for (let j = 0; j < n; j++) {
    for (let pass = 0; pass < 2; pass++) {
      for (let k = 0; k < j; k++) {
        let sr = 0, si = 0; // ⟨q_k, q_j⟩
        for (let i = 0; i < n; i++) {
          const ar = q.re[i * n + k], ai = -q.im[i * n + k], br = q.re[i * n + j], bi = q.im[i * n + j];
          sr += ar * br - ai * bi;
          si += ar * bi + ai * br;
        }
        for (let i = 0; i < n; i++) {
          const kr = q.re[i * n + k], ki = q.im[i * n + k];
          q.re[i * n + j] -= sr * kr - si * ki;
          q.im[i * n + j] -= sr * ki + si * kr;
        }
      }
    }
    let norm = 0;
    for (let i = 0; i < n; i++) norm += q.re[i * n + j] ** 2 + q.im[i * n + j] ** 2;
    norm = Math.sqrt(norm);
    for (let i = 0; i < n; i++) {
      q.re[i * n + j] /= norm;
      q.im[i * n + j] /= norm;
    }
  }
  return q;
}

/** Q diag(e^{iφ}) Q† for prescribed eigenphases φ and a unitary Q. */
export function unitaryWithPhases(q: ComplexMatrix, phases: ArrayLike<number>): ComplexMatrix {
  const n = q.rows;
  const u = zeros(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let sr = 0, si = 0;
      for (let k = 0; k < n; k++) {
        const cr = Math.cos(phases[k]), ci = Math.sin(phases[k]);
        // Q_ik e^{iφ_k} conj(Q_jk)
        const ar = q.re[i * n + k] * cr - q.im[i * n + k] * ci, ai = q.re[i * n + k] * ci + q.im[i * n + k] * cr;
        const br = q.re[j * n + k], bi = -q.im[j * n + k];
        sr += ar * br - ai * bi;
        si += ar * bi + ai * br;
      }
      u.re[i * n + j] = sr;
      u.im[i * n + j] = si;
    }
  }
  return u;
}

/** Q diag(λ) Q† for prescribed real eigenvalues λ. */
export function hermitianWithValues(q: ComplexMatrix, values: ArrayLike<number>): ComplexMatrix {
  const n = q.rows;
  const h = zeros(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let sr = 0, si = 0;
      for (let k = 0; k < n; k++) {
        const ar = q.re[i * n + k] * values[k], ai = q.im[i * n + k] * values[k];
        const br = q.re[j * n + k], bi = -q.im[j * n + k];
        sr += ar * br - ai * bi;
        si += ar * bi + ai * br;
      }
      h.re[i * n + j] = sr;
      h.im[i * n + j] = i === j ? 0 : si;
    }
  }
  return h;
}
