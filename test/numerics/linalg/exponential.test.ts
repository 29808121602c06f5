import { describe, expect, it } from 'vitest';
import { connectedBlocks, expMinusIHt } from '../../../src/numerics/linalg/exponential.ts';
import { distance, frobeniusNorm, fromArrays, identity, multiply, unitarityDefect, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import { randomHermitian, seededRandom } from '../../support/random.ts';
import { expectBelow, fixtureMatrix, fromMathjs, linalgFixtures, math, toMathjs } from './comparisons.ts';

describe('expMinusIHt', () => {
  it('matches mathjs expm(−iHt) on seeded random Hermitian matrices (reference: mathjs)', () => {
    const random = seededRandom(31);
    for (const [n, t] of [[1, 0.4], [2, 1.1], [3, -0.8], [6, 2.5], [10, 0.3]] as const) {
      const h = randomHermitian(random, n);
      const ref = fromMathjs(math.expm(math.multiply(math.complex(0, -t), toMathjs(h)) as never) as never);
      expectBelow(`n=${n} ‖ours − mathjs‖_F`, distance(expMinusIHt(h, t), ref), 1e-12 * n);
    }
  });

  it('matches scipy expm on the committed fixtures (reference: scipy)', () => {
    const fx = linalgFixtures();
    for (const c of fx.exponential) {
      const ours = expMinusIHt(fixtureMatrix(c.matrix), c.t);
      expectBelow(`${c.name} (scipy ${fx.scipy})`, distance(ours, fixtureMatrix(c.expMinusIHt)), 1e-12 * c.matrix.rows * Math.max(1, Math.abs(c.t)));
    }
  });

  it('is unitary and satisfies exp(−iHt)exp(−iHs) = exp(−iH(t+s)) to 1e-12·n', () => {
    const random = seededRandom(32);
    for (const n of [2, 3, 5, 20]) {
      const h = randomHermitian(random, n);
      const [t, s] = [0.7, -2.3];
      expectBelow(`n=${n} unitarity`, unitarityDefect(expMinusIHt(h, 13.7)), 1e-12 * n);
      expectBelow(`n=${n} group law`, distance(multiply(expMinusIHt(h, t), expMinusIHt(h, s)), expMinusIHt(h, t + s)), 1e-12 * n);
      expectBelow(`n=${n} exp(0) = 1`, distance(expMinusIHt(h, 0), identity(n)), 1e-15 * n);
    }
  });

  it('gives the Rabi formula for a two-level system (analytic)', () => {
    // H = (Δ/2)σ_z + (Ω/2)σ_x: |⟨↓|e^{−iHt}|↑⟩|² = (Ω²/(Ω²+Δ²)) sin²(√(Ω²+Δ²) t/2).
    const delta = 0.6, omega = 1.7, t = 2.9;
    const u = expMinusIHt(fromArrays([[delta / 2, omega / 2], [omega / 2, -delta / 2]]), t);
    const w = Math.hypot(omega, delta);
    const p = (omega * omega) / (w * w) * Math.sin((w * t) / 2) ** 2;
    expect(Math.abs(u.re[2] ** 2 + u.im[2] ** 2 - p)).toBeLessThanOrEqual(1e-15 * 10);
  });

  it('exponentiates block-diagonal matrices block by block, equal to the dense route', () => {
    // 6 sites, bonds (0,3), (1,4), (2,5): three 2×2 blocks; compare with mathjs on the full matrix.
    const h = zeros(6, 6);
    const bonds: [number, number, number, number][] = [[0, 3, 0.8, 0.2], [1, 4, -0.5, 0.9], [2, 5, 1.3, 0]];
    for (const [i, j, re, im] of bonds) {
      h.re[j * 6 + i] = re; h.im[j * 6 + i] = im;
      h.re[i * 6 + j] = re; h.im[i * 6 + j] = -im;
    }
    h.re[0] = 0.4; h.re[4 * 6 + 4] = -0.2;
    expect(connectedBlocks(h)).toEqual([[0, 3], [1, 4], [2, 5]]);
    const ref = fromMathjs(math.expm(math.multiply(math.complex(0, -1.3), toMathjs(h)) as never) as never);
    expectBelow('block route vs mathjs', distance(expMinusIHt(h, 1.3), ref), 1e-13 * 6);
    // A 3-site block and an isolated site.
    const g = fromArrays([[0.1, 0.5, 0, 0], [0.5, 0, 0, [0, 0.3]], [0, 0, 2, 0], [0, [0, -0.3], 0, -1]]);
    expect(connectedBlocks(g)).toEqual([[0, 1, 3], [2]]);
    const refG = fromMathjs(math.expm(math.multiply(math.complex(0, -0.9), toMathjs(g)) as never) as never);
    expectBelow('3+1 blocks vs mathjs', distance(expMinusIHt(g, 0.9), refG), 1e-13 * 4);
  });

  it('handles 0×0, 1×1 and the zero matrix; rejects NaN and non-Hermitian input', () => {
    expect(expMinusIHt(zeros(0, 0), 1).rows).toBe(0);
    const one = expMinusIHt(fromArrays([[2]]), 0.5);
    expectBelow('1×1', Math.hypot(one.re[0] - Math.cos(1), one.im[0] + Math.sin(1)), 1e-16);
    expect(distance(expMinusIHt(zeros(3, 3), 4), identity(3))).toBe(0);
    const bad = identity(2);
    bad.re[1] = Number.NaN;
    expect(() => expMinusIHt(bad, 1)).toThrow(/expMinusIHt: entry \(0, 1\) is not finite/);
    expect(() => expMinusIHt(fromArrays([[0, 1], [0, 0]]), 1)).toThrow(/expMinusIHt: matrix is not Hermitian/);
    expect(frobeniusNorm(expMinusIHt(identity(2), 1))).toBeCloseTo(Math.SQRT2, 15);
  });
});
