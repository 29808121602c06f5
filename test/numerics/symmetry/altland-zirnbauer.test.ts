/**
 * The Altland–Zirnbauer table (Altland & Zirnbauer, PRB 55, 1142 (1997); Schnyder,
 * Ryu, Furusaki, Ludwig, PRB 78, 195125 (2008): T², C² ∈ {0, +1, −1} and S
 * present exactly when T and C are both present or both absent with S given)
 * and the squares of antiunitary operators, checked on textbook operators:
 * complex conjugation K (T² = +1, spinless), iσ_y K (T² = −1, spin ½: Kramers),
 * τ_x K (C² = +1, BdG of spinless fermions), iτ_y K (C² = −1, singlet BdG).
 */
import { describe, expect, it } from 'vitest';
import { fromArrays } from '../../../src/numerics/linalg/complex-matrix.ts';
import { ALTLAND_ZIRNBAUER, antiunitarySquare, classOf, declaredSymmetryClass } from '../../../src/numerics/symmetry/altland-zirnbauer.ts';

const identity = fromArrays([[1, 0], [0, 1]]);
const iSigmaY = fromArrays([[0, 1], [-1, 0]]); // iσ_y = [[0, 1], [−1, 0]]
const sigmaX = fromArrays([[0, 1], [1, 0]]);
const sigmaZ = fromArrays([[1, 0], [0, -1]]);

describe('Altland–Zirnbauer classes', () => {
  it('has the ten classes of the table, each with a distinct set of symmetries, and S exactly where T and C are both present or both absent', () => {
    const names = Object.keys(ALTLAND_ZIRNBAUER);
    expect(names.sort()).toEqual(['A', 'AI', 'AII', 'AIII', 'BDI', 'C', 'CI', 'CII', 'D', 'DIII']);
    const keys = new Set(Object.values(ALTLAND_ZIRNBAUER).map((q) => `${q.T},${q.C},${q.S}`));
    expect(keys.size).toBe(10);
    for (const q of Object.values(ALTLAND_ZIRNBAUER)) {
      if (q.T !== 0 && q.C !== 0) expect(q.S).toBe(1); // S = T·C
      if ((q.T === 0) !== (q.C === 0)) expect(q.S).toBe(0); // one antiunitary symmetry alone implies no S
    }
    // Spot checks of the table (from memory of Schnyder et al. 2008): BDI = (+1, +1, 1), DIII = (−1, +1, 1), CI = (+1, −1, 1).
    expect(classOf({ T: 1, C: 1, S: 1 })).toBe('BDI');
    expect(classOf({ T: -1, C: 1, S: 1 })).toBe('DIII');
    expect(classOf({ T: 1, C: -1, S: 1 })).toBe('CI');
    expect(classOf({ T: 0, C: 0, S: 1 })).toBe('AIII');
  });

  it('squares antiunitary operators: K² = +1, (iσ_y K)² = −1, independent of a phase of U', () => {
    expect(antiunitarySquare(identity).sign).toBe(1);
    expect(antiunitarySquare(iSigmaY).sign).toBe(-1);
    const phased = fromArrays([[[0, 0], [0, 1]], [[0, -1], [0, 0]]]); // i·(iσ_y)
    expect(antiunitarySquare(phased)).toMatchObject({ sign: -1 });
    expect(antiunitarySquare(phased).defect).toBeLessThanOrEqual(1e-15);
  });

  it('reads the class off the declared operators, implying the third symmetry from two', () => {
    // Two-step chain: Γ = σ_z, T = K → C = S·T with U_C = σ_z, C² = σ_z σ_z* = +1: BDI.
    expect(declaredSymmetryClass({ chiral: sigmaZ, timeReversal: { unitary: identity } })).toMatchObject({
      class: 'BDI',
      particleHole: { presence: 'implied', square: 1 },
      chiral: { presence: 'declared' },
    });
    // Only Γ: AIII (the issue: a BDI claim with no time reversal must not pass).
    expect(declaredSymmetryClass({ chiral: sigmaZ }).class).toBe('AIII');
    // C = σ_x K alone (Qi–Wu–Zhang): D.
    expect(declaredSymmetryClass({ particleHole: { unitary: sigmaX } }).class).toBe('D');
    // T = iσ_y K and C = σ_x K: S implied, T² = −1, C² = +1: DIII.
    expect(declaredSymmetryClass({ timeReversal: { unitary: iSigmaY }, particleHole: { unitary: sigmaX } })).toMatchObject({ class: 'DIII', chiral: { presence: 'implied' } });
    // Nothing declared: A. A "time reversal" declared without K is not an Altland–Zirnbauer symmetry.
    expect(declaredSymmetryClass({}).class).toBe('A');
    expect(declaredSymmetryClass({ timeReversal: { unitary: identity, antiunitary: false } })).toMatchObject({ class: 'A', timeReversal: { presence: 'unitary' } });
  });

  it('finds no class when a square is not ±1', () => {
    // U = diag(1, i): U U* = diag(1, 1)… is +1; U = [[0, 1], [i, 0]]: U U* = [[−i, 0], [0, i]] is not ±1.
    const odd = fromArrays([[[0, 0], [1, 0]], [[0, 1], [0, 0]]]);
    const r = declaredSymmetryClass({ timeReversal: { unitary: odd } });
    expect(r.timeReversal.square).toBeNull();
    expect(r.class).toBeNull();
  });
});
