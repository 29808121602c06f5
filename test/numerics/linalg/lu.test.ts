import { describe, expect, it } from 'vitest';
import { LuDecomposition } from '../../../src/numerics/linalg/lu.ts';
import { distance, fromArrays, identity, multiply, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import { randomComplexMatrix, seededRandom } from '../../support/random.ts';
import { expectBelow, expectWithin, fixtureMatrix, fromMathjs, linalgFixtures, math, toMathjs } from './comparisons.ts';

describe('LuDecomposition', () => {
  it('matches mathjs det and lusolve on seeded random complex matrices (reference: mathjs)', () => {
    const random = seededRandom(41);
    for (const n of [1, 2, 4, 9]) {
      const a = randomComplexMatrix(random, n);
      const b = randomComplexMatrix(random, n, 3);
      const lu = new LuDecomposition(a);
      const det = math.det(toMathjs(a)) as unknown as { re: number; im: number } | number;
      const [dr, di] = typeof det === 'number' ? [det, 0] : [det.re, det.im];
      const scale = Math.max(1, Math.hypot(dr, di));
      expectWithin(`n=${n} Re det`, lu.determinant.re, dr, 1e-13 * n * scale);
      expectWithin(`n=${n} Im det`, lu.determinant.im, di, 1e-13 * n * scale);
      // mathjs lusolve takes one right-hand side at a time.
      const x = lu.solve(b);
      for (let c = 0; c < b.cols; c++) {
        const col = zeros(n, 1), ours = zeros(n, 1);
        for (let i = 0; i < n; i++) {
          col.re[i] = b.re[i * b.cols + c]; col.im[i] = b.im[i * b.cols + c];
          ours.re[i] = x.re[i * b.cols + c]; ours.im[i] = x.im[i * b.cols + c];
        }
        const ref = fromMathjs(math.lusolve(toMathjs(a), toMathjs(col)) as never);
        expectBelow(`n=${n} column ${c} solve vs mathjs`, distance(ours, ref), 1e-11 * n);
      }
    }
  });

  it('matches numpy det and solve on the committed fixtures (reference: numpy)', () => {
    const fx = linalgFixtures();
    for (const c of fx.lu) {
      const lu = new LuDecomposition(fixtureMatrix(c.matrix));
      const scale = Math.max(1, Math.hypot(...c.determinant));
      expectWithin(`${c.name} Re det`, lu.determinant.re, c.determinant[0], 1e-13 * c.matrix.rows * scale);
      expectWithin(`${c.name} Im det`, lu.determinant.im, c.determinant[1], 1e-13 * c.matrix.rows * scale);
      expectBelow(`${c.name} solve`, distance(lu.solve(fixtureMatrix(c.rhs)), fixtureMatrix(c.solution)), 1e-11 * c.matrix.rows);
    }
  });

  it('satisfies A·solve(B) = B (defining identity) and needs pivoting', () => {
    // Zero leading entry: fails without row exchange.
    const a = fromArrays([[0, [1, 1], 2], [[0, 2], 1, 0], [3, 0, [1, -1]]]);
    const b = randomComplexMatrix(seededRandom(42), 3, 2);
    expectBelow('‖A X − B‖_F', distance(multiply(a, new LuDecomposition(a).solve(b)), b), 1e-14 * 3);
    // det of this matrix by cofactor expansion: 0·… − (1+i)(2i·(1−i) − 0) + 2(0 − 3) = −(1+i)(2+2i) − 6 = −6 − 4i.
    const det = new LuDecomposition(a).determinant;
    expectWithin('Re det', det.re, -6, 1e-14);
    expectWithin('Im det', det.im, -4, 1e-14);
  });

  it('inverts: A·A⁻¹ = 1 and matches mathjs inv (reference: mathjs)', () => {
    const random = seededRandom(43);
    for (const n of [1, 3, 7, 15]) {
      const a = randomComplexMatrix(random, n);
      const inv = new LuDecomposition(a).inverse();
      expectBelow(`n=${n} ‖A A⁻¹ − 1‖_F`, distance(multiply(a, inv), identity(n)), 1e-12 * n);
      expectBelow(`n=${n} vs mathjs inv`, distance(inv, fromMathjs(math.inv(toMathjs(a)) as never)), 1e-11 * n);
    }
    expect(() => new LuDecomposition(fromArrays([[1, 1], [1, 1]])).inverse()).toThrow(/LuDecomposition.inverse: matrix is numerically singular/);
  });

  it('flags singular matrices and refuses to solve with them', () => {
    const s = fromArrays([[1, 2], [2, 4]]);
    const lu = new LuDecomposition(s);
    expect(lu.singular).toBe(true);
    expect(() => lu.solve(identity(2))).toThrow(/LuDecomposition.solve: matrix is numerically singular/);
    expect(new LuDecomposition(identity(3)).singular).toBe(false);
    const empty = new LuDecomposition(zeros(0, 0));
    expect(empty.determinant).toEqual({ re: 1, im: 0 });
  });

  it('rejects bad input with precise messages', () => {
    expect(() => new LuDecomposition(zeros(2, 3))).toThrow('LuDecomposition: matrix is 2×3, expected a square matrix');
    const nan = identity(2);
    nan.im[3] = Number.POSITIVE_INFINITY;
    expect(() => new LuDecomposition(nan)).toThrow(/LuDecomposition: entry \(1, 1\) is not finite/);
    expect(() => new LuDecomposition(identity(2)).solve(zeros(3, 1))).toThrow('LuDecomposition.solve: right-hand side has 3 rows, the matrix is 2×2');
  });
});
