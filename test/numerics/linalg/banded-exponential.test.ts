import { describe, expect, it } from 'vitest';
import { bandedExpMinusIHt, besselJ, chebyshevDegree } from '../../../src/numerics/linalg/banded-exponential.ts';
import { BandedMatrix } from '../../../src/numerics/linalg/banded-matrix.ts';
import type { ComplexMatrix } from '../../../src/numerics/linalg/complex-matrix.ts';
import { distance, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import { seededRandom } from '../../support/random.ts';
import { expectBelow, expectWithin, fromMathjs, math, toMathjs } from './comparisons.ts';

/** Random Hermitian band matrix (bandwidth b). */
function hermitianBand(seed: number, n: number, b: number): ComplexMatrix {
  const random = seededRandom(seed);
  const a = zeros(n, n);
  for (let i = 0; i < n; i++) {
    a.re[i * n + i] = 2 * random() - 1;
    for (let j = i + 1; j <= Math.min(n - 1, i + b); j++) {
      const re = random() - 0.5, im = random() - 0.5;
      a.re[i * n + j] = re; a.im[i * n + j] = im;
      a.re[j * n + i] = re; a.im[j * n + i] = -im;
    }
  }
  return a;
}

/** exp(−iHt) by mathjs expm (the reference library). */
function referenceExp(h: ComplexMatrix, t: number): ComplexMatrix {
  return fromMathjs(math.expm(math.multiply(math.complex(0, -t), toMathjs(h)) as never) as never);
}

describe('Bessel functions for the Chebyshev coefficients', () => {
  it('reproduce tabulated values (Abramowitz & Stegun, Table 9.1, from memory)', () => {
    const j1 = besselJ(3, 1), j10 = besselJ(12, 10);
    expectWithin('J0(1)', j1[0], 0.7651976865579666, 1e-15);
    expectWithin('J1(1)', j1[1], 0.4400505857449335, 1e-15);
    expectWithin('J2(1)', j1[2], 0.1149034849319005, 1e-15);
    expectWithin('J0(10)', j10[0], -0.2459357644513483, 1e-14);
    expectWithin('J1(10)', j10[1], 0.04347274616886144, 1e-14);
    expectWithin('J10(10)', j10[10], 0.2074861066333589, 1e-14);
  });

  it('choose a degree whose stated tail bound is below the tolerance', () => {
    for (const x of [0.1, 1, 7, 30]) {
      const { degree, tail } = chebyshevDegree(x, 1e-14);
      expectBelow(`tail bound at ρt = ${x}`, tail, 1e-14);
      const j = besselJ(degree + 40, x);
      let actual = 0;
      for (let k = degree + 1; k < j.length; k++) actual += 2 * Math.abs(j[k]);
      expectBelow(`true tail 2Σ|J_k| at ρt = ${x}`, actual, tail);
    }
  });
});

describe('bandedExpMinusIHt', () => {
  it('agrees with mathjs expm within its stated error (Chebyshev route), for t of either sign', () => {
    const h = hermitianBand(5, 16, 2);
    for (const t of [0.3, 2.5, -1.7]) {
      const e = bandedExpMinusIHt(BandedMatrix.fromDense(h, 2), t);
      expect(e.route).toBe('chebyshev');
      expectBelow(`‖e^{−iHt} − reference‖ at t = ${t}`, distance(e.matrix.withBandwidth(15).toDense(), referenceExp(h, t)), e.error * 4 + 1e-13);
    }
  });

  it('is exact on disjoint blocks (dimers and a 3-site block)', () => {
    const n = 7;
    const h = zeros(n, n);
    const bond = (i: number, j: number, re: number, im: number) => {
      h.re[i * n + j] = re; h.im[i * n + j] = im; h.re[j * n + i] = re; h.im[j * n + i] = -im;
    };
    bond(0, 1, 0.7, 0.2); bond(2, 4, -0.4, 0.9); bond(3, 5, 1.1, 0); bond(5, 6, 0.3, -0.5);
    for (let i = 0; i < n; i++) h.re[i * n + i] = 0.1 * i;
    const blocks = [[0, 1], [2, 4], [3, 5, 6]];
    const e = bandedExpMinusIHt(BandedMatrix.fromDense(h, 3), 1.3, blocks);
    expect(e.route).toBe('blocks');
    expectBelow('‖block exponential − reference‖_F', distance(e.matrix.withBandwidth(6).toDense(), referenceExp(h, 1.3)), 1e-13);
  });
});
