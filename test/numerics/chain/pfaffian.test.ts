import { describe, expect, it } from 'vitest';
import { det, matrix } from 'mathjs';
import { realSkewPfaffian, PfaffianInputError } from '../../../src/numerics/chain/pfaffian.ts';

/** Seeded linear congruential generator (Numerical Recipes constants, common practice). */
function rng(seed: number): () => number {
  let x = seed >>> 0;
  return () => {
    x = (1664525 * x + 1013904223) >>> 0;
    return x / 2 ** 32 - 0.5;
  };
}

function randomSkew(n: number, seed: number): number[] {
  const r = rng(seed);
  const a = new Array(n * n).fill(0);
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) {
    a[i * n + j] = r();
    a[j * n + i] = -a[i * n + j];
  }
  return a;
}

describe('realSkewPfaffian', () => {
  it('matches the analytic 4×4 formula Pf = a₁₂a₃₄ − a₁₃a₂₄ + a₁₄a₂₃ (textbook identity)', () => {
    const a = randomSkew(4, 7);
    const expected = a[1] * a[11] - a[2] * a[7] + a[3] * a[6];
    expect(Math.abs(realSkewPfaffian(a, 4) - expected)).toBeLessThanOrEqual(1e-14);
  });

  it('Pf([[0, x], [−x, 0]]) = x and Pf of a block-diagonal matrix is the product of the blocks', () => {
    expect(realSkewPfaffian([0, 2.5, -2.5, 0], 2)).toBe(2.5);
    // blocks x = 2, y = −3 (defining property Pf(A ⊕ B) = Pf(A) Pf(B)); the pivoting must not change it.
    const a = [0, 2, 0, 0, -2, 0, 0, 0, 0, 0, 0, -3, 0, 0, 3, 0];
    expect(Math.abs(realSkewPfaffian(a, 4) - -6)).toBeLessThanOrEqual(1e-14);
  });

  it.each([6, 8, 10])('satisfies Pf² = det (determinant from mathjs) for a seeded random %i×%i matrix', (n) => {
    const a = randomSkew(n, 100 + n);
    const rows = Array.from({ length: n }, (_, i) => a.slice(i * n, (i + 1) * n));
    const d = det(matrix(rows)) as number;
    const pf = realSkewPfaffian(a, n);
    expect(Math.abs(pf * pf - d)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(d)));
  });

  it('flips sign under an odd permutation of basis vectors (Pf(PAPᵀ) = det P · Pf A)', () => {
    const n = 6;
    const a = randomSkew(n, 3);
    const swap = (i: number) => (i === 0 ? 3 : i === 3 ? 0 : i);
    const b = a.map((_, p) => a[swap(Math.floor(p / n)) * n + swap(p % n)]);
    expect(Math.abs(realSkewPfaffian(b, n) + realSkewPfaffian(a, n))).toBeLessThanOrEqual(1e-13);
  });

  it('returns 0 for odd size and 1 for the empty matrix', () => {
    expect(realSkewPfaffian(randomSkew(3, 1), 3)).toBe(0);
    expect(realSkewPfaffian([], 0)).toBe(1);
  });

  it('rejects non-skew input with a located message', () => {
    expect(() => realSkewPfaffian([0, 1, 1, 0], 2)).toThrow(PfaffianInputError);
    expect(() => realSkewPfaffian([0, 1, -1, 0, 0], 2)).toThrow(/expected 2×2 = 4 entries, got 5/);
    expect(() => realSkewPfaffian([0, NaN, -1, 0], 2)).toThrow(/entry \(0, 1\) is NaN/);
  });
});
