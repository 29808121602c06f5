import { describe, expect, it } from 'vitest';
import { BandedMatrix, compactBandwidth, multiplyBanded } from '../../../src/numerics/linalg/banded-matrix.ts';
import { bandHermitianEigenvalues } from '../../../src/numerics/linalg/band-tridiagonal.ts';
import { bandedHermitianEigen } from '../../../src/numerics/linalg/banded-hermitian-eigen.ts';
import { eigenpairsInInterval } from '../../../src/numerics/linalg/banded-shift-invert.ts';
import { eigenvaluesInInterval } from '../../../src/numerics/linalg/unitary-window-count.ts';
import type { ComplexMatrix } from '../../../src/numerics/linalg/complex-matrix.ts';
import { distance, multiply, multiplyAdjointLeft, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import { seededRandom } from '../../support/random.ts';
import { expectBelow, expectWithin, math, toMathjs } from './comparisons.ts';

/** Random complex matrix with nonzeros only within the band |i − j| ≤ b (Hermitian when asked). */
function randomBand(seed: number, n: number, b: number, hermitian = false): ComplexMatrix {
  const random = seededRandom(seed);
  const a = zeros(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = Math.max(0, i - b); j <= Math.min(n - 1, i + b); j++) {
      a.re[i * n + j] = random() - 0.5;
      a.im[i * n + j] = random() - 0.5;
    }
  }
  if (hermitian) {
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < i; j++) {
        a.re[j * n + i] = a.re[i * n + j];
        a.im[j * n + i] = -a.im[i * n + j];
      }
      a.im[i * n + i] = 0;
    }
  }
  return a;
}

/** Eigenvalues of a Hermitian matrix by mathjs (the reference library), ascending. */
function referenceEigenvalues(a: ComplexMatrix): number[] {
  const values = (math.eigs(toMathjs(a)).values as unknown as { toArray(): (number | { re: number })[] }).toArray();
  return values.map((v) => (typeof v === 'number' ? v : v.re)).sort((x, y) => x - y);
}

describe('BandedMatrix', () => {
  it('multiplies within the band exactly as the dense product (bandwidths add), and applies to vectors', () => {
    const a = randomBand(1, 30, 2), b = randomBand(2, 30, 3);
    const c = multiplyBanded(BandedMatrix.fromDense(a, 2), BandedMatrix.fromDense(b, 3));
    expect(c.b).toBe(5);
    expectBelow('‖AB − (AB)_band‖_F', distance(c.toDense(), multiply(a, b)), 1e-14 * 30);
    const x = seededRandom(3);
    const xr = Float64Array.from({ length: 30 }, () => x() - 0.5), xi = Float64Array.from({ length: 30 }, () => x() - 0.5);
    const yr = new Float64Array(30), yi = new Float64Array(30);
    BandedMatrix.fromDense(a, 2).apply(xr, xi, yr, yi);
    const dense = multiply(a, { rows: 30, cols: 1, re: xr, im: xi });
    for (let i = 0; i < 30; i++) expectWithin(`(Ax)_${i}`, Math.hypot(yr[i] - dense.re[i], yi[i] - dense.im[i]), 0, 1e-14);
  });

  it('cuts tails below a tolerance with a bound on what it dropped, and keeps exact zeros out of the bandwidth', () => {
    const n = 40;
    const m = new BandedMatrix(n, 6);
    for (let i = 0; i < n; i++) for (let d = -6; d <= 6; d++) if (i + d >= 0 && i + d < n) m.add(i, i + d, 10 ** -Math.abs(2 * d), 0);
    const { matrix, dropped } = m.truncate(1e-7);
    // Offsets 4, 5, 6 weigh 1e-8, 1e-10, 1e-12 per entry: two of each per row and column.
    expect(matrix.b).toBe(3);
    expectBelow('dropped', dropped, 1e-7);
    expectWithin('dropped bound', dropped, 2 * (1e-8 + 1e-10 + 1e-12), 1e-15);
    // The dropped part is real symmetric: its spectral norm is its largest |eigenvalue| (mathjs).
    const e = m.toDense(), kept = matrix.withBandwidth(6).toDense();
    for (let p = 0; p < e.re.length; p++) e.re[p] -= kept.re[p];
    const spectral = Math.max(...referenceEigenvalues(e).map(Math.abs));
    expectBelow('‖dropped part‖₂ ≤ bound', spectral, dropped);
    const sparse = new BandedMatrix(10, 4);
    sparse.add(2, 3, 1, 0);
    expect(compactBandwidth(sparse).b).toBe(1);
  });
});

describe('Hermitian band matrices', () => {
  it('band-tridiagonal eigenvalues agree with mathjs eigs (reference) to 1e-12', () => {
    for (const [n, b] of [[12, 1], [20, 3], [28, 4]]) {
      const a = randomBand(10 + n, n, b, true);
      const ours = bandHermitianEigenvalues(BandedMatrix.fromDense(a, b));
      referenceEigenvalues(a).forEach((v, k) => expectWithin(`eigenvalue ${k} (n = ${n}, b = ${b})`, ours[k], v, 1e-12));
    }
  });

  it('the banded eigen-decomposition satisfies HV = VΛ and V†V = 1 to 1e-12 and matches mathjs', () => {
    const n = 32, b = 3;
    const a = randomBand(7, n, b, true);
    const e = bandedHermitianEigen(BandedMatrix.fromDense(a, b));
    expect(e.route).toBe('band');
    const hv = multiply(a, e.vectors);
    let r = 0;
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) r += (hv.re[i * n + j] - e.values[j] * e.vectors.re[i * n + j]) ** 2 + (hv.im[i * n + j] - e.values[j] * e.vectors.im[i * n + j]) ** 2;
    expectBelow('‖HV − VΛ‖_F', Math.sqrt(r), 1e-12 * n);
    const g = multiplyAdjointLeft(e.vectors, e.vectors);
    for (let i = 0; i < n; i++) g.re[i * n + i] -= 1;
    expectBelow('‖V†V − 1‖_F', Math.hypot(...g.re, ...g.im), 1e-12 * n);
    referenceEigenvalues(a).forEach((v, k) => expectWithin(`eigenvalue ${k}`, e.values[k], v, 1e-12));
  });

  it('counts (Sylvester inertia) and finds the eigenpairs in an interval', () => {
    const n = 36, b = 2;
    const a = randomBand(8, n, b, true);
    const values = referenceEigenvalues(a);
    const h = BandedMatrix.fromDense(a, b);
    const lo = 0.5 * (values[19] + values[20]), hi = 0.5 * (values[24] + values[25]);
    expect(eigenvaluesInInterval(h, lo, hi)).toBe(5);
    expect(eigenvaluesInInterval(h, values[0] - 1, values[n - 1] + 1)).toBe(n);
    const found = eigenpairsInInterval(h, lo, hi);
    expect(found.converged).toBe(true);
    Array.from(found.phases).sort((x, y) => x - y).forEach((v, k) => expectWithin(`eigenvalue ${20 + k}`, v, values[20 + k], 1e-11));
  });
});
