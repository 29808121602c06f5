/**
 * Chiral invariants of a driven chain from the half-period evolution
 * (Asbóth, Tarasinski, Delplace, PRB 90, 125143 (2014)): each gap's invariant
 * on its own, so that ν₀ is defined while only the gap at 0 is open and ν_π
 * while only the gap at π/T is open.
 *
 * Derivation. In a symmetric frame t₀ (Γ H(t₀ + s) Γ† = −H(t₀ − s)), let
 * F = U(t₀ + T/2, t₀). The second half period is the first run backwards and
 * conjugated by Γ: U(t₀ + T, t₀ + T/2) = Γ F† Γ (Γ² = 1), so the Floquet operator
 * of the frame is U = Γ F† Γ F. Since 1 = Γ F† F Γ,
 *     U − 1 = Γ F† (Γ F − F Γ) = Γ F† [Γ, F],
 *     U + 1 = Γ F† (Γ F + F Γ) = Γ F† {Γ, F}.
 * In the eigenbasis of Γ (+1 states first) F = [[a, b], [c, d]], [Γ, F] =
 * 2[[0, b], [−c, 0]] and {Γ, F} = 2[[a, 0], [0, −d]]: U has an eigenvalue 1
 * (the gap at 0 closes) exactly where det b · det c = 0, and −1 (the gap at π/T
 * closes) exactly where det a · det d = 0. For unitary F the complementary
 * minors satisfy |det b| = |det c| and |det a| = |det d| (Jacobi), so
 *     ν₀ = winding of det c(k),   ν_π = winding of det a(k)
 * need only their own gap open. Signs, in the conventions of chiral-winding.ts
 * (h = ⟨Γ = −1|H_eff|Γ = +1⟩, ν₀ = (ν′ + ν″)/2, ν_π = (ν′ − ν″)/2 with ν′ from
 * the first frame): for a static chiral H, F = e^{−iHT/2} ≈ 1 − iHT/2 has
 * c ≈ −i(T/2)h, so ν[det c] = ν[det h] = ν₀; for the two-step chain in the
 * frame t₀ = T/4, a(k) = cos φ₁cos φ₂ − sin φ₁ sin φ₂ e^{−ik} (φᵢ = θᵢ/2) winds
 * −1 exactly where ν_π = −1 (test/numerics/chain/half-period-winding.test.ts
 * derives both and checks the agreement over the phase diagram). Starting in
 * the second frame t₀ + T/2 replaces F by Γ F† Γ, whose blocks are a† and −b†:
 * ν_π flips sign and ν₀ stays (det c and det b wind oppositely), as they must.
 */
import type { ComplexMatrix, Complex } from '../linalg/complex-matrix.ts';
import type { LatticeDrive } from '../evolution/drive.ts';
import type { PropagatorOptions } from '../evolution/propagator.ts';
import { multiply, multiplyAdjointLeft } from '../linalg/complex-matrix.ts';
import { LuDecomposition } from '../linalg/lu.ts';
import { prepareFloquet } from '../evolution/propagator.ts';
import { halfPeriodDrive } from '../evolution/time-shift.ts';
import { phaseWinding } from './phase-winding.ts';
import type { PhaseWindingOptions, PhaseWindingResult } from './phase-winding.ts';

export interface HalfPeriodInvariants {
  /** The frame t₀ the half period starts at (absolute units). */
  frameTime: number;
  /** ν₀ = winding of det c, with its adaptive momentum grid. */
  zero: PhaseWindingResult;
  /** ν_π = winding of det a. */
  pi: PhaseWindingResult;
}

function determinant(m: ComplexMatrix): Complex {
  return m.rows === 1 ? { re: m.re[0], im: m.im[0] } : new LuDecomposition(m).determinant;
}

/**
 * ν₀ and ν_π of the chiral chain in the frame t₀ from the half-period evolution;
 * `plus` and `minus` hold the ±1 eigenvectors of Γ as columns (chiral-winding.ts, chiralBasis).
 */
export function halfPeriodInvariants(
  drive: LatticeDrive,
  t0: number,
  basis: { plus: ComplexMatrix; minus: ComplexMatrix },
  options: { propagator?: PropagatorOptions; winding?: PhaseWindingOptions } = {},
): HalfPeriodInvariants {
  const propagate = prepareFloquet(halfPeriodDrive(drive, t0), options.propagator);
  const cache = new Map<number, ComplexMatrix>();
  // F(k) restricted to the Γ = +1 columns, shared by both windings.
  const fPlus = (s: number): ComplexMatrix => {
    const key = s - Math.floor(s);
    let hit = cache.get(key);
    if (hit === undefined) {
      hit = multiply(propagate([key]).operator, basis.plus);
      cache.set(key, hit);
    }
    return hit;
  };
  const block = (rows: ComplexMatrix) => (s: number) => determinant(multiplyAdjointLeft(rows, fPlus(s)));
  return { frameTime: t0, zero: phaseWinding(block(basis.minus), options.winding), pi: phaseWinding(block(basis.plus), options.winding) };
}
