import { describe, expect, it } from 'vitest';
import { effectiveHamiltonian, quasienergiesFromPhases } from '../../../src/numerics/evolution/effective-hamiltonian.ts';
import { HermitianEigen } from '../../../src/numerics/linalg/hermitian-eigen.ts';
import { expMinusIHt } from '../../../src/numerics/linalg/exponential.ts';
import { distance, hermiticityDefect } from '../../../src/numerics/linalg/complex-matrix.ts';
import { hermitianWithValues, randomHermitian, randomUnitary, seededRandom, unitaryWithPhases } from '../../support/random.ts';
import { expectBelow, expectWithin } from '../linalg/comparisons.ts';

describe('effectiveHamiltonian', () => {
  it('reproduces U = exp(−iH_eff T) with every eigenvalue in (ε − 2π/T, ε]', () => {
    const random = seededRandom(71);
    for (const [n, T] of [[2, 1], [3, 2.5], [8, 0.7], [20, 4]] as const) {
      const u = randomUnitary(random, n);
      for (const cut of [0, Math.PI / T, -0.3 / T, 2.2 / T]) {
        const h = effectiveHamiltonian(u, T, cut);
        expectBelow(`n=${n} cut=${cut} ‖H − H†‖`, hermiticityDefect(h), 1e-14 * n);
        expectBelow(`n=${n} cut=${cut} ‖exp(−iHT) − U‖_F`, distance(expMinusIHt(h, T), u), 1e-12 * n);
        const values = new HermitianEigen(h, { vectors: false }).values;
        expect(values[0]).toBeGreaterThan(cut - (2 * Math.PI) / T - 1e-12 * n);
        expect(values[n - 1]).toBeLessThanOrEqual(cut + 1e-12 * n);
      }
    }
  });

  it('returns H itself when the spectrum of H already lies in the window', () => {
    // Eigenvalues in (−π/T, π/T] with T = 1.5 and cut π/T: log recovers H exactly (analytic).
    const T = 1.5;
    const h = hermitianWithValues(randomUnitary(seededRandom(72), 6), [-2, -1.1, 0, 0.4, 1.9, 2.05]);
    expectBelow('‖H_eff − H‖_F', distance(effectiveHamiltonian(expMinusIHt(h, T), T, Math.PI / T), h), 1e-12 * 6);
    // Moving the cut below 1.9 sends the two top levels down by 2π/T.
    const lowered = new HermitianEigen(effectiveHamiltonian(expMinusIHt(h, T), T, 1.0)).values;
    const expected = [-2, -1.1, 0, 0.4, 1.9 - (2 * Math.PI) / T, 2.05 - (2 * Math.PI) / T].sort((a, b) => a - b);
    expected.forEach((e, k) => expectWithin(`level ${k}`, lowered[k], e, 1e-12));
  });

  it('handles degenerate Floquet operators (identity and ±1 blocks)', () => {
    const q = randomUnitary(seededRandom(73), 4);
    const u = unitaryWithPhases(q, [Math.PI, Math.PI, 0, 0]);
    const T = 2;
    const h = effectiveHamiltonian(u, T, Math.PI / T);
    const values = new HermitianEigen(h).values;
    // Eigenphase π ⇒ ε = −π/T ≡ +π/T; with cut π/T the window is (−π/T, π/T] so ε = +π/T.
    [0, 0, Math.PI / T, Math.PI / T].forEach((e, k) => expectWithin(`level ${k}`, values[k], e, 1e-12));
  });

  it('folds quasienergies −φ/T into (−π/T, π/T]', () => {
    const T = 2;
    const eps = quasienergiesFromPhases([0, Math.PI, -Math.PI / 2, Math.PI / 2, 3], T);
    [0, Math.PI / T, Math.PI / (2 * T), -Math.PI / (2 * T), -3 / T].forEach((e, k) => expectWithin(`ε_${k}`, eps[k], e, 1e-15));
  });

  it('rejects bad periods and non-unitary input', () => {
    const u = expMinusIHt(randomHermitian(seededRandom(74), 3), 1);
    expect(() => effectiveHamiltonian(u, 0, 0)).toThrow('effectiveHamiltonian: period must be a positive number, got 0');
    expect(() => effectiveHamiltonian(randomHermitian(seededRandom(75), 3), 1, 0)).toThrow(/UnitaryEigen: matrix is not unitary/);
  });
});
