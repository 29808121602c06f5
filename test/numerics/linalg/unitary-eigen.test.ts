import { describe, expect, it } from 'vitest';
import { UnitaryEigen, foldPhase } from '../../../src/numerics/linalg/unitary-eigen.ts';
import type { ComplexMatrix } from '../../../src/numerics/linalg/complex-matrix.ts';
import { distance, fromArrays, identity, multiply, multiplyAdjointLeft, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import { randomUnitary, seededRandom, unitaryWithPhases } from '../../support/random.ts';
import { defects, expectBelow, expectWithin, fixtureMatrix, linalgFixtures, math, toMathjs } from './comparisons.ts';


function circularDistance(a: number, b: number): number {
  return Math.abs(foldPhase(a - b));
}

describe('UnitaryEigen', () => {
  it('matches mathjs eigs on seeded Haar-random unitaries (reference: mathjs)', () => {
    const random = seededRandom(21);
    for (const n of [3, 5, 8]) {
      const u = randomUnitary(random, n);
      const ours = new UnitaryEigen(u).phases;
      const raw = (math.eigs(toMathjs(u), { eigenvectors: false }).values as unknown as { toArray(): ({ re: number; im: number } | number)[] }).toArray();
      const ref = raw.map((z) => (typeof z === 'number' ? Math.atan2(0, z) : Math.atan2(z.im, z.re))).map(foldPhase).sort((x, y) => x - y);
      ref.forEach((phi, k) => expectWithin(`n=${n} phase ${k}`, circularDistance(ours[k], phi), 0, 1e-11 * n));
    }
  });

  it('satisfies UV = VΛ, V†V = 1 to 1e-13·n and reports its residual truthfully', () => {
    const random = seededRandom(22);
    for (const n of [1, 2, 3, 4, 9, 30, 64, 120]) {
      const u = randomUnitary(random, n);
      const e = new UnitaryEigen(u);
      const { residual, orthogonality } = defects(u, e);
      expectBelow(`n=${n} ‖UV − VΛ‖_F`, residual, 1e-13 * n);
      expectBelow(`n=${n} ‖V†V − 1‖_F`, orthogonality, 1e-13 * n);
      expectWithin(`n=${n} reported residual`, e.residual, residual, 1e-14 * n);
      for (let k = 0; k < n; k++) {
        expect(e.phases[k]).toBeGreaterThan(-Math.PI);
        expect(e.phases[k]).toBeLessThanOrEqual(Math.PI);
        if (k > 0) expect(e.phases[k]).toBeGreaterThanOrEqual(e.phases[k - 1]);
      }
    }
  });

  it('matches numpy eigvals on the committed fixtures (reference: numpy)', () => {
    const fx = linalgFixtures();
    for (const c of fx.unitary) {
      const e = new UnitaryEigen(fixtureMatrix(c.matrix));
      c.phases.forEach((phi, k) => expectWithin(`${c.name} (numpy ${fx.numpy}) phase ${k}`, circularDistance(e.phases[k], phi), 0, 1e-12 * c.matrix.rows));
    }
  });

  const hardCases: [string, number[]][] = [
    ['exact degeneracy', [0.3, 0.3, 0.3, -1.2, -1.2, 2, 2, 2, 2, 0.9]],
    ['splitting 1e-9', [0.5, 0.5 + 1e-9, 0.5 + 2e-9, -2, -2 + 1e-9, 1, 3, -3, 0, 0 + 1e-9]],
    ['splitting 1e-13', [0.5, 0.5 + 1e-13, 0.5 - 1e-13, -2, -2 + 1e-13, 1, 3, -3, 0, 1e-13]],
    ['phases at ±π', [Math.PI, Math.PI, -Math.PI + 1e-15, Math.PI - 1e-12, 0, 0.1, -0.1, 1, 2, -2]],
    ['dense near the first cut', Array.from({ length: 10 }, (_, k) => 2.39996 + (k - 5) * 0.01)],
    ['all but one equal', [1, 1, 1, 1, 1, 1, 1, 1, 1, -1]],
  ];
  const smallCases: [string, number[]][] = [
    ['2×2 splitting 1e-13', [1.1, 1.1 + 1e-13]],
    ['2×2 at ±π', [Math.PI, -Math.PI + 1e-14]],
    ['2×2 opposite', [0.4, 0.4 - Math.PI]],
    ['3×3 splitting 1e-9 at π', [Math.PI, Math.PI - 1e-9, 0]],
    ['3×3 triple', [-0.7, -0.7, -0.7]],
  ];
  for (const [name, phases] of [...hardCases, ...smallCases]) {
    it(`stays accurate for prescribed eigenphases: ${name}`, () => {
      const n = phases.length;
      const u = unitaryWithPhases(randomUnitary(seededRandom(23), n), phases);
      const e = new UnitaryEigen(u);
      const { residual, orthogonality } = defects(u, e);
      expectBelow('‖UV − VΛ‖_F', residual, 1e-13 * n);
      expectBelow('‖V†V − 1‖_F', orthogonality, 1e-13 * n);
      const expected = phases.map(foldPhase).sort((x, y) => x - y);
      expected.forEach((phi, k) => expectWithin(`phase ${k}`, circularDistance(e.phases[k], phi), 0, 1e-13 * n));
    });
  }

  it('handles the identity, diagonal, 1×1 and 0×0 matrices', () => {
    const id = new UnitaryEigen(identity(4));
    expect(Array.from(id.phases)).toEqual([0, 0, 0, 0]);
    const d = new UnitaryEigen(fromArrays([[[0, 1], 0, 0], [0, -1, 0], [0, 0, [0, -1]]]));
    // Eigenvalues i, −1, −i: phases −π/2, π/2, π (−1 maps to +π, never −π).
    [-Math.PI / 2, Math.PI / 2, Math.PI].forEach((phi, k) => expectWithin(`diagonal phase ${k}`, d.phases[k], phi, 1e-15));
    const one = new UnitaryEigen(fromArrays([[[Math.cos(2), Math.sin(2)]]]));
    expectWithin('1×1 phase', one.phases[0], 2, 1e-15);
    expect(new UnitaryEigen(zeros(0, 0)).phases.length).toBe(0);
  });

  it('rejects bad input with precise messages', () => {
    expect(() => new UnitaryEigen(zeros(3, 2))).toThrow('UnitaryEigen: matrix is 3×2, expected a square matrix');
    const nan = identity(3);
    nan.re[4] = Number.NaN;
    expect(() => new UnitaryEigen(nan)).toThrow(/UnitaryEigen: entry \(1, 1\) is not finite/);
    // 2·1 has U†U − 1 = 3·1, so ‖U†U − 1‖_F = 3√2 = 4.243.
    const twice = fromArrays([[2, 0], [0, 2]]);
    expect(() => new UnitaryEigen(twice)).toThrow(/UnitaryEigen: matrix is not unitary: ‖U†U − 1‖_F = 4\.243e\+0/);
  });
});
