import { describe, expect, it } from 'vitest';
import { HermitianEigen } from '../../../src/numerics/linalg/hermitian-eigen.ts';
import type { ComplexMatrix } from '../../../src/numerics/linalg/complex-matrix.ts';
import { distance, frobeniusNorm, fromArrays, identity, multiply, multiplyAdjointLeft, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import { hermitianWithValues, randomHermitian, randomUnitary, seededRandom } from '../../support/random.ts';
import { expectBelow, expectWithin, fixtureMatrix, linalgFixtures, math, toMathjs } from './comparisons.ts';

/** ‖AV − VΛ‖_F and ‖V†V − 1‖_F. */
function defects(a: ComplexMatrix, e: HermitianEigen): { residual: number; orthogonality: number } {
  const n = a.rows;
  const v = e.vectors;
  const vl = zeros(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      vl.re[i * n + j] = v.re[i * n + j] * e.values[j];
      vl.im[i * n + j] = v.im[i * n + j] * e.values[j];
    }
  }
  return { residual: distance(multiply(a, v), vl), orthogonality: distance(multiplyAdjointLeft(v, v), identity(n)) };
}

describe('HermitianEigen', () => {
  it('matches mathjs eigs on seeded random Hermitian matrices (reference: mathjs)', () => {
    const random = seededRandom(11);
    for (const n of [3, 6, 12]) {
      const a = randomHermitian(random, n);
      const ours = new HermitianEigen(a).values;
      const raw = (math.eigs(toMathjs(a)).values as unknown as { toArray(): (number | { re: number; im: number })[] }).toArray();
      const ref = raw.map((v) => (typeof v === 'number' ? v : v.re)).sort((x, y) => x - y);
      const tol = 1e-12 * n * Math.max(1, frobeniusNorm(a));
      for (let k = 0; k < n; k++) expectWithin(`n=${n} eigenvalue ${k}`, ours[k], ref[k], tol);
    }
  });

  it('satisfies AV = VΛ and V†V = 1 to 1e-13·n·max(1, ‖A‖_F) (defining identities)', () => {
    const random = seededRandom(12);
    for (const n of [1, 2, 3, 4, 7, 16, 40, 90]) {
      const a = randomHermitian(random, n);
      const e = new HermitianEigen(a);
      const { residual, orthogonality } = defects(a, e);
      const tol = 1e-13 * n * Math.max(1, frobeniusNorm(a));
      expectBelow(`n=${n} ‖AV − VΛ‖_F`, residual, tol);
      expectBelow(`n=${n} ‖V†V − 1‖_F`, orthogonality, 1e-13 * n);
      for (let k = 1; k < n; k++) expect(e.values[k]).toBeGreaterThanOrEqual(e.values[k - 1]);
    }
  });

  it('reproduces the analytic spectrum of a tridiagonal Toeplitz matrix with complex hoppings', () => {
    // Common practice: a + b e^{iθ_j} on the sub-diagonal (and conjugate above) has
    // eigenvalues a + 2|b| cos(kπ/(n+1)), k = 1…n; the phases θ_j gauge away on an open chain.
    const n = 25, a0 = 0.3, b = 0.8;
    const h = zeros(n, n);
    for (let i = 0; i < n; i++) h.re[i * n + i] = a0;
    for (let i = 0; i + 1 < n; i++) {
      const th = 0.37 * i * i + 1;
      h.re[(i + 1) * n + i] = b * Math.cos(th);
      h.im[(i + 1) * n + i] = b * Math.sin(th);
      h.re[i * n + i + 1] = b * Math.cos(th);
      h.im[i * n + i + 1] = -b * Math.sin(th);
    }
    const expected = Array.from({ length: n }, (_, k) => a0 + 2 * b * Math.cos(((k + 1) * Math.PI) / (n + 1))).sort((x, y) => x - y);
    const values = new HermitianEigen(h).values;
    for (let k = 0; k < n; k++) expectWithin(`eigenvalue ${k}`, values[k], expected[k], 1e-13 * n);
  });

  it('matches numpy eigvalsh on the committed fixtures (reference: numpy)', () => {
    const fx = linalgFixtures();
    for (const c of fx.hermitian) {
      const a = fixtureMatrix(c.matrix);
      const values = new HermitianEigen(a, { vectors: false }).values;
      const tol = 1e-13 * a.rows * Math.max(1, frobeniusNorm(a));
      c.eigenvalues.forEach((ref, k) => expectWithin(`${c.name} (numpy ${fx.numpy}) eigenvalue ${k}`, values[k], ref, tol));
    }
  });

  it("resolves the close pairs of Wilkinson's W21+ matrix", () => {
    // Wilkinson, The Algebraic Eigenvalue Problem (1965): W21+ has its two largest eigenvalues
    // equal to about 10.7461941829034, apart by ~1e-14 (from memory; numpy's eigvalsh in the fixture agrees).
    const n = 21;
    const w = zeros(n, n);
    for (let i = 0; i < n; i++) {
      w.re[i * n + i] = Math.abs(10 - i);
      if (i + 1 < n) w.re[i * n + i + 1] = w.re[(i + 1) * n + i] = 1;
    }
    const e = new HermitianEigen(w);
    expectWithin('largest eigenvalue', e.values[n - 1], 10.7461941829034, 1e-12);
    expectWithin('second largest', e.values[n - 2], 10.7461941829034, 1e-12);
    const { residual, orthogonality } = defects(w, e);
    expectBelow('‖AV − VΛ‖_F', residual, 1e-13 * n * 10);
    expectBelow('‖V†V − 1‖_F', orthogonality, 1e-13 * n);
  });

  it('keeps eigenvectors orthonormal for exactly and nearly degenerate eigenvalues', () => {
    const random = seededRandom(13);
    const n = 12;
    const q = randomUnitary(random, n);
    for (const values of [
      [1, 1, 1, 1, 2, 2, 2, 3, 3, 3, 3, 3],
      [0, 1e-9, 2e-9, 1, 1 + 1e-13, 1 + 2e-13, -1, -1, -1, 5, 5 + 1e-11, 5],
    ]) {
      const a = hermitianWithValues(q, values);
      const e = new HermitianEigen(a);
      const { residual, orthogonality } = defects(a, e);
      expectBelow('‖AV − VΛ‖_F', residual, 1e-13 * n * 10);
      expectBelow('‖V†V − 1‖_F', orthogonality, 1e-13 * n);
      const sorted = [...values].sort((x, y) => x - y);
      sorted.forEach((v, k) => expectWithin(`eigenvalue ${k}`, e.values[k], v, 1e-14 * n * 10));
    }
  });

  it('stays accurate when entries decay into the subnormal range away from the diagonal (reference: mathjs)', () => {
    // Like the Cayley transform of a banded unitary: |A_ij| ~ 10^(−40|i−j|), reaching subnormal numbers.
    const random = seededRandom(15);
    const n = 10;
    const a = zeros(n, n);
    for (let i = 0; i < n; i++) {
      a.re[i * n + i] = 4 * random() - 2;
      for (let j = 0; j < i; j++) {
        const f = 10 ** (-40 * (i - j)), x = f * (random() - 0.5), y = f * (random() - 0.5);
        a.re[i * n + j] = x; a.im[i * n + j] = y;
        a.re[j * n + i] = x; a.im[j * n + i] = -y;
      }
    }
    const e = new HermitianEigen(a);
    const raw = (math.eigs(toMathjs(a)).values as unknown as { toArray(): (number | { re: number; im: number })[] }).toArray();
    const ref = raw.map((v) => (typeof v === 'number' ? v : v.re)).sort((x, y) => x - y);
    for (let k = 0; k < n; k++) expectWithin(`eigenvalue ${k}`, e.values[k], ref[k], 1e-13 * n);
    const { residual, orthogonality } = defects(a, e);
    expectBelow('‖AV − VΛ‖_F', residual, 1e-13 * n);
    expectBelow('‖V†V − 1‖_F', orthogonality, 1e-13 * n);
  });

  it('handles the identity, diagonal, 1×1 and 0×0 matrices', () => {
    const id = new HermitianEigen(identity(5));
    expect(Array.from(id.values)).toEqual([1, 1, 1, 1, 1]);
    expectBelow('identity eigenvectors orthonormal', distance(multiplyAdjointLeft(id.vectors, id.vectors), identity(5)), 1e-15);
    const d = new HermitianEigen(fromArrays([[3, 0, 0, 0], [0, -1, 0, 0], [0, 0, 2, 0], [0, 0, 0, -1]]));
    expect(Array.from(d.values)).toEqual([-1, -1, 2, 3]);
    const one = new HermitianEigen(fromArrays([[-4.5]]));
    expect(Array.from(one.values)).toEqual([-4.5]);
    expect(one.vectors.re[0] ** 2 + one.vectors.im[0] ** 2).toBe(1);
    const empty = new HermitianEigen(zeros(0, 0));
    expect(empty.values.length).toBe(0);
    expect(empty.vectors.rows).toBe(0);
  });

  it('returns the same eigenvalues with and without eigenvectors', () => {
    const a = randomHermitian(seededRandom(14), 20);
    const withV = new HermitianEigen(a).values, without = new HermitianEigen(a, { vectors: false }).values;
    for (let k = 0; k < 20; k++) expectWithin(`eigenvalue ${k}`, without[k], withV[k], 1e-13);
    expect(() => new HermitianEigen(a, { vectors: false }).vectors).toThrow(/eigenvectors were not computed/);
  });

  it('rejects bad input with precise messages', () => {
    expect(() => new HermitianEigen(zeros(2, 3))).toThrow('HermitianEigen: matrix is 2×3, expected a square matrix');
    const nan = identity(3);
    nan.im[5] = Number.NaN;
    expect(() => new HermitianEigen(nan)).toThrow(/HermitianEigen: entry \(1, 2\) is not finite/);
    // A − A† has 2i in both off-diagonal places: ‖A − A†‖_F = √8 = 2.828.
    const skew = fromArrays([[1, [0, 1]], [[0, 1], 2]]);
    expect(() => new HermitianEigen(skew)).toThrow(/HermitianEigen: matrix is not Hermitian: ‖A − A†‖_F = 2\.828e\+0.*A\[1\]\[0\]/);
  });
});
