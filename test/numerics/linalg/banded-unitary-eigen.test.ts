import { describe, expect, it } from 'vitest';
import { BandedLu, bandwidth } from '../../../src/numerics/linalg/banded-lu.ts';
import { UnitaryEigen, foldPhase } from '../../../src/numerics/linalg/unitary-eigen.ts';
import type { ComplexMatrix } from '../../../src/numerics/linalg/complex-matrix.ts';
import { adjoint, distance, identity, multiply, multiplyAdjointLeft, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import { randomUnitary, seededRandom } from '../../support/random.ts';
import type { Random } from '../../support/random.ts';
import { defects, expectBelow, expectWithin, math, toMathjs } from './comparisons.ts';
import { BandedMatrix } from '../../../src/numerics/linalg/banded-matrix.ts';
import { bandedUnitaryEigen, rotationFor } from '../../../src/numerics/linalg/banded-unitary-eigen.ts';
import { eigenvaluesOnArc } from '../../../src/numerics/linalg/unitary-window-count.ts';
import { eigenpairsOnArc } from '../../../src/numerics/linalg/banded-shift-invert.ts';

/** One brickwork layer: independent 2×2 unitaries on the pairs (p, p+1), p = first, first+2, … */
function layer(random: Random, n: number, first: number): ComplexMatrix {
  const out = identity(n);
  for (let p = first; p + 1 < n; p += 2) {
    const q = randomUnitary(random, 2);
    for (let a = 0; a < 2; a++) {
      for (let b = 0; b < 2; b++) {
        out.re[(p + a) * n + p + b] = q.re[2 * a + b];
        out.im[(p + a) * n + p + b] = q.im[2 * a + b];
      }
    }
  }
  return out;
}

/** Q diag(e^{iφ}) Q† with Q a product of two brickwork layers: banded (bandwidth ≤ 4), eigenphases known exactly. */
function bandedWithPhases(seed: number, phases: number[]): ComplexMatrix {
  const random = seededRandom(seed);
  const n = phases.length;
  const q = multiply(layer(random, n, 1), layer(random, n, 0));
  const d = zeros(n, n);
  phases.forEach((phi, k) => {
    d.re[k * n + k] = Math.cos(phi);
    d.im[k * n + k] = Math.sin(phi);
  });
  const u = multiply(multiply(q, d), adjoint(q));
  // Entries outside the band are rounding of exact zeros: clear them so the band is exact.
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (Math.abs(i - j) > 4) { u.re[i * n + j] = 0; u.im[i * n + j] = 0; }
  return u;
}


describe('BandedLu', () => {
  it('solves a seeded banded system to 1e-13 relative residual and agrees with mathjs lusolve (reference: mathjs)', () => {
    const random = seededRandom(41);
    const n = 12, b = 2;
    const a = zeros(n, n);
    for (let i = 0; i < n; i++) {
      for (let j = Math.max(0, i - b); j <= Math.min(n - 1, i + b); j++) {
        a.re[i * n + j] = random() - 0.5;
        a.im[i * n + j] = random() - 0.5;
      }
    }
    expect(bandwidth(a)).toBe(b);
    const yr = Float64Array.from({ length: n }, () => random() - 0.5), yi = Float64Array.from({ length: n }, () => random() - 0.5);
    const xr = yr.slice(), xi = yi.slice();
    new BandedLu(n, b).factor(a, 1, 0, 0, 0).solveInPlace(xr, xi);
    const ref = (math.lusolve(toMathjs(a), Array.from(yr, (r, k) => [math.complex(r, yi[k])])) as unknown as { toArray(): { re: number; im: number }[][] }).toArray();
    for (let k = 0; k < n; k++) {
      const z = ref[k][0];
      const zr = typeof z === 'number' ? z : z.re, zi = typeof z === 'number' ? 0 : z.im;
      expectWithin(`x[${k}] re`, xr[k], zr, 1e-12);
      expectWithin(`x[${k}] im`, xi[k], zi, 1e-12);
    }
  });
});

describe('UnitaryEigen on banded unitaries (inverse-iteration route)', () => {
  const n = 96;
  const base = Array.from({ length: n }, (_, k) => -3 + (6 * k) / n + 0.01 * Math.sin(k));
  const cases: [string, number[]][] = [
    ['distinct phases', base],
    ['flat bands: two 48-fold phases (dense fallback)', Array.from({ length: n }, (_, k) => (k % 2 === 0 ? 0.7 : -1.9))],
    ['splitting 1e-9 inside a 10-fold cluster', base.map((p, k) => (k < 10 ? 0.5 + k * 1e-9 : p))],
    ['splitting 1e-13 inside a 10-fold cluster', base.map((p, k) => (k < 10 ? 0.5 + k * 1e-13 : p))],
    ['clusters at ±π', base.map((p, k) => (k < 4 ? Math.PI - k * 1e-12 : k < 8 ? -Math.PI + (k - 3) * 1e-12 : p))],
  ];
  for (const [name, phases] of cases) {
    it(`keeps UV = VΛ and V†V = 1 to 1e-13·n and the exact eigenphases: ${name}`, () => {
      const u = bandedWithPhases(42, phases);
      expect(8 * bandwidth(u)).toBeLessThanOrEqual(n);
      const e = new UnitaryEigen(u);
      const { residual, orthogonality } = defects(u, e);
      expectBelow('‖UV − VΛ‖_F', residual, 1e-13 * n);
      expectBelow('‖V†V − 1‖_F', orthogonality, 1e-13 * n);
      expectWithin('reported residual', e.residual, residual, 1e-14 * n);
      const expected = phases.map(foldPhase).sort((x, y) => x - y);
      expected.forEach((phi, k) => expectWithin(`phase ${k}`, Math.abs(foldPhase(e.phases[k] - phi)), 0, 1e-13 * n));
    });
  }
});

/** Eigenphases of `phases` on the arc |φ − centre| < h. */
function onArc(phases: number[], centre: number, h: number): number[] {
  return phases.filter((p) => Math.abs(foldPhase(p - centre)) < h).sort((a, b) => foldPhase(a - centre) - foldPhase(b - centre));
}

describe('bandedUnitaryEigen (band-tridiagonal route on (W + W†)/2)', () => {
  const n = 96;
  const base = Array.from({ length: n }, (_, k) => -3 + (6 * k) / n + 0.01 * Math.sin(k));
  const cases: [string, number[]][] = [
    ['distinct phases', base],
    ['a spectrum symmetric about 0 (mirror pairs share cos φ when θ = 0)', base.map((p, k) => (k < n / 2 ? p : -base[k - n / 2]))],
    ['splitting 1e-9 inside a 10-fold cluster', base.map((p, k) => (k < 10 ? 0.5 + k * 1e-9 : p))],
    ['clusters at ±π', base.map((p, k) => (k < 4 ? Math.PI - k * 1e-12 : k < 8 ? -Math.PI + (k - 3) * 1e-12 : p))],
  ];
  for (const [name, phases] of cases) {
    it(`keeps UV = VΛ and V†V = 1 to 1e-13·n and the exact eigenphases: ${name}`, () => {
      const u = bandedWithPhases(43, phases);
      for (const theta of [0, rotationFor(phases)]) {
        const e = bandedUnitaryEigen(BandedMatrix.fromDense(u, 4), theta);
        const { residual, orthogonality } = defects(u, { phases: e.phases, vectors: e.vectors, residual: e.residual } as UnitaryEigen);
        expectBelow(`‖UV − VΛ‖_F (θ = ${theta.toFixed(3)})`, residual, 1e-13 * n);
        expectBelow(`‖V†V − 1‖_F (θ = ${theta.toFixed(3)})`, orthogonality, 1e-13 * n);
        const expected = phases.map(foldPhase).sort((x, y) => x - y);
        expected.forEach((phi, k) => expectWithin(`phase ${k}`, Math.abs(foldPhase(e.phases[k] - phi)), 0, 1e-13 * n));
      }
    });
  }

  it('puts the rotation where no mirror pair of a symmetric spectrum meets', () => {
    const phases = [0.3, -0.3, 1.1, -1.1, 2.0, -2.0, 2.9, -2.9];
    const theta = rotationFor(phases);
    const cosines = phases.map((p) => Math.cos(p - theta)).sort((a, b) => a - b);
    for (let k = 1; k < cosines.length; k++) expect(cosines[k] - cosines[k - 1]).toBeGreaterThan(1e-3);
  });
});

describe('eigenvalues on an arc: inertia count and shift-invert', () => {
  const n = 96;
  const phases = Array.from({ length: n }, (_, k) => -3 + (6 * k) / n + 0.01 * Math.sin(k));
  // An isolated group near 1.2 rad inside a stretch left empty.
  const spaced = phases.map((p) => (Math.abs(p - 1.2) < 0.3 ? 1.2 + 0.02 * (p - 1.2) : p));
  const u = BandedMatrix.fromDense(bandedWithPhases(44, spaced), 4);

  it('counts exactly the eigenphases on arcs of every width, also with an eigenvalue on the Cayley cut', () => {
    for (const [centre, h] of [[1.2, 0.05], [1.2, 0.4], [-2, 0.5], [0.3, 1.4], [Math.PI, 0.2], [0, 2.9]]) {
      expect(eigenvaluesOnArc(u, centre, h), `arc ${centre} ± ${h}`).toBe(onArc(spaced, centre, h).length);
    }
    // An eigenphase exactly opposite the centre (on the first cut): counted all the same.
    const opposite = spaced.map((p, k) => (k === 3 ? foldPhase(1.2 + Math.PI) : p));
    const v = BandedMatrix.fromDense(bandedWithPhases(45, opposite), 4);
    expect(eigenvaluesOnArc(v, 1.2, 0.3)).toBe(onArc(opposite, 1.2, 0.3).length);
  });

  it('finds every eigenpair on the arc, with residuals below 1e-10 and the exact phases, from a cold or a warm start', () => {
    const expected = onArc(spaced, 1.2, 0.1);
    expect(expected.length).toBeGreaterThan(3);
    const cold = eigenpairsOnArc(u, 1.2, 0.1);
    expect(cold.converged).toBe(true);
    expect(cold.count).toBe(expected.length);
    expected.forEach((phi, k) => expectWithin(`phase ${k}`, foldPhase(cold.phases[k] - phi), 0, 1e-11));
    for (const r of cold.residuals) expectBelow('residual', r, 1e-10);
    const warm = eigenpairsOnArc(u, 1.2, 0.1, { start: cold.vectors });
    expect(warm.iterations).toBeLessThanOrEqual(cold.iterations);
    expect(Array.from(warm.phases)).toEqual(Array.from(warm.phases).sort((a, b) => foldPhase(a - 1.2) - foldPhase(b - 1.2)));
    expect(eigenpairsOnArc(u, 1.2, 0.1, { maxCount: 2 })).toMatchObject({ crowded: true, converged: false });
  });
});
