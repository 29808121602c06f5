/**
 * ν₀ and ν_π from the half-period evolution (Asbóth, Tarasinski, Delplace,
 * PRB 90, 125143 (2014)), derived here for the two-step and the kicked chain
 * and cross-checked against the H_eff windings of both frames (Asbóth & Obuse,
 * PRB 88, 121406(R) (2013)) wherever both gaps are open.
 *
 * Two-step chain (intracell J₁ for T/2, then intercell J₂ for T/2, θᵢ = JᵢT/2,
 * φᵢ = θᵢ/2), Γ = σ_z on (A, B). In the first symmetric frame t₀ = T/4 the half
 * period is F = e^{−iφ₂ n·σ} e^{−iφ₁σ_x} with n = (cos k, sin k, 0) (the intercell
 * bond B → A of the next cell enters H₂(k) as J₂(cos k σ_x + sin k σ_y) in the cell
 * gauge). Multiplying out with σ_x σ_x = 1, (n·σ)σ_x = cos k − i sin k σ_z:
 *     a = F_AA = cos φ₁ cos φ₂ − sin φ₁ sin φ₂ e^{−ik},
 *     c = F_BA = −i (cos φ₂ sin φ₁ + sin φ₂ cos φ₁ e^{+ik}).
 * For 0 < θᵢ < π every sine and cosine is positive, so c winds +1 exactly when
 * tan φ₂ > tan φ₁ (θ₂ > θ₁) and a winds −1 exactly when tan φ₁ tan φ₂ > 1
 * (θ₁ + θ₂ > π); c vanishes at k = π when θ₁ = θ₂ and a at k = 0 when
 * θ₁ + θ₂ = π: exactly the lines where the gaps at 0 and π/T close.
 *
 * Kicked chain (intracell J for the whole period, then an intercell kick of
 * strength κ at t = T), Γ = σ_z: the symmetric frames are the kick (t₀ = 0) and
 * the middle of the hopping (T/2); the engine takes the kick first. Then
 * F = e^{−iφ₁σ_x} e^{−iφ₂ n·σ} with φ₁ = JT/2, φ₂ = κ/2, and likewise
 *     a = cos φ₁ cos φ₂ − sin φ₁ sin φ₂ e^{+ik},   c = −i (sin φ₁ cos φ₂ + cos φ₁ sin φ₂ e^{+ik}):
 * ν₀ = [φ₂ > φ₁] as before, ν_π = +[φ₁ + φ₂ > π/2], the sign opposite to the
 * two-step chain's because the frame order is (intercell, intracell) here.
 */
import { describe, expect, it } from 'vitest';
import type { DriveTerm, LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import { fromArrays } from '../../../src/numerics/linalg/complex-matrix.ts';
import { chiralBasis, chiralInvariants } from '../../../src/numerics/chain/chiral-winding.ts';
import { halfPeriodInvariants } from '../../../src/numerics/chain/half-period-winding.ts';
import { hop, twoStepChain } from '../../support/drives/chains.ts';

const sigmaZ = fromArrays([[1, 0], [0, -1]]);
const int = (x: number) => x + 0;

function kickedChain(j: number, kappa: number, period = 1): LatticeDrive {
  return {
    dimension: 1, spaceDimension: 1, latticeVectors: [[1]], period,
    states: [{ label: 'A', position: [0], charge: 1 }, { label: 'B', position: [0.5], charge: 1 }],
    segments: [
      { label: 'intracell', duration: period, terms: [hop(0, 1, 0, j)] },
      { label: 'intercell kick', duration: 0, terms: [hop(1, 0, 1, kappa)] },
    ],
  };
}

/** Winding numbers read off the closed forms above (φᵢ in (0, π/2)). */
const twoStepExpected = (t1: number, t2: number) => ({ zero: Math.tan(t2 / 2) > Math.tan(t1 / 2) ? 1 : 0, pi: Math.tan(t1 / 2) * Math.tan(t2 / 2) > 1 ? -1 : 0 });

describe('half-period invariants of the two-step chain', () => {
  it('match the closed forms of det c and det a and the H_eff windings over the whole phase diagram (both gaps open)', () => {
    const phases = new Set<string>();
    for (let i = 0; i < 9; i++) {
      for (let j = 0; j < 9; j++) {
        const t1 = ((i + 0.43) / 9) * Math.PI, t2 = ((j + 0.71) / 9) * Math.PI;
        const r = chiralInvariants(twoStepChain(t1, t2), sigmaZ);
        const half = r.halfPeriod!;
        const expected = twoStepExpected(t1, t2);
        const where = `θ = (${t1.toFixed(3)}, ${t2.toFixed(3)})`;
        expect(half.frameTime, where).toBeCloseTo(0.25, 12);
        expect([int(half.zero.winding.nearest), int(half.pi.winding.nearest)], where).toEqual([expected.zero, expected.pi]);
        expect(half.zero.winding.converged && half.pi.winding.converged, where).toBe(true);
        // Cross-check: ν₀ = (ν′ + ν″)/2 and ν_π = (ν′ − ν″)/2 from H_eff in both frames.
        expect([int(r.zero!.nearest), int(r.pi!.nearest)], where).toEqual([expected.zero, expected.pi]);
        phases.add(`${expected.zero},${expected.pi}`);
      }
    }
    expect(phases.size).toBe(4);
  });

  it('settles ν₀ exactly on the line θ₁ + θ₂ = π where the π gap closes, and ν_π on θ₁ = θ₂ where the 0 gap closes', () => {
    for (const t1 of [0.3, 0.9, 1.3, 2.2]) {
      // π gap closed: a(0) = cos(φ₁ + φ₂) = 0; the 0 gap stays open unless θ₁ = θ₂ = π/2.
      const onPi = chiralInvariants(twoStepChain(t1, Math.PI - t1), sigmaZ);
      const expectedZero = Math.PI - t1 > t1 ? 1 : 0;
      expect(onPi.halfPeriod!.zero.winding.converged, `θ₁ = ${t1}`).toBe(true);
      expect(int(onPi.halfPeriod!.zero.winding.nearest)).toBe(expectedZero);
      expect(onPi.halfPeriod!.pi.winding.converged).toBe(false);
      expect(onPi.halfPeriod!.pi.winding.caveat).toMatch(/nearly vanishes at s = 0\.000000/);
      // H_eff, cut in the π gap, cannot tell ν₀ here: its frame windings are unsettled.
      expect(onPi.zero!.converged).toBe(false);
      // 0 gap closed: c(π) ∝ sin(φ₁ − φ₂) = 0; ν_π = −[θ₁ + θ₂ > π].
      const onZero = chiralInvariants(twoStepChain(t1, t1), sigmaZ);
      expect(onZero.halfPeriod!.pi.winding.converged, `θ₁ = θ₂ = ${t1}`).toBe(true);
      expect(int(onZero.halfPeriod!.pi.winding.nearest)).toBe(2 * t1 > Math.PI ? -1 : 0);
      expect(onZero.halfPeriod!.zero.winding.converged).toBe(false);
      expect(onZero.halfPeriod!.zero.winding.caveat).toMatch(/nearly vanishes at s = 0\.500000/);
    }
  });

  it('adds up over two decoupled copies (2×2 blocks, determinants)', () => {
    // Block-diagonal F: det c = det c₁ · det c₂, so windings add (one copy in each phase with ν₀ = 1).
    const a = twoStepChain(0.35 * Math.PI, 0.85 * Math.PI), b = twoStepChain(0.2 * Math.PI, 0.6 * Math.PI);
    const shift = (t: DriveTerm): DriveTerm => ({ ...t, from: t.from + 2, to: t.to + 2 });
    const both: LatticeDrive = {
      ...a,
      states: [...a.states, ...b.states.map((s) => ({ ...s, label: `${s.label}′` }))],
      segments: a.segments.map((seg, i) => ({ ...seg, terms: [...seg.terms, ...b.segments[i].terms.map(shift)] })),
    };
    const gamma = fromArrays([[1, 0, 0, 0], [0, -1, 0, 0], [0, 0, 1, 0], [0, 0, 0, -1]]);
    const r = halfPeriodInvariants(both, 0.25, chiralBasis(gamma));
    const e1 = twoStepExpected(0.35 * Math.PI, 0.85 * Math.PI), e2 = twoStepExpected(0.2 * Math.PI, 0.6 * Math.PI);
    expect([int(r.zero.winding.nearest), int(r.pi.winding.nearest)]).toEqual([e1.zero + e2.zero, e1.pi + e2.pi]);
  });
});

describe('half-period invariants of a kicked chain', () => {
  it('follow the closed forms in the frame of the kick, and flip ν_π (not ν₀) when the other frame is declared first', () => {
    for (const [jt, kappa] of [[0.6, 2.1], [2.0, 0.5], [2.3, 2.6], [0.4, 0.9]]) {
      const phi1 = jt / 2, phi2 = kappa / 2;
      const zero = phi2 > phi1 ? 1 : 0, pi = phi1 + phi2 > Math.PI / 2 ? 1 : 0;
      const found = chiralInvariants(kickedChain(jt, kappa), sigmaZ);
      expect(found.frames.map((f) => f.frameTime)).toEqual([0, 0.5]);
      expect([int(found.halfPeriod!.zero.winding.nearest), int(found.halfPeriod!.pi.winding.nearest)], `JT = ${jt}, κ = ${kappa}`).toEqual([zero, pi]);
      expect([int(found.zero!.nearest), int(found.pi!.nearest)]).toEqual([zero, pi]);
      const swapped = chiralInvariants(kickedChain(jt, kappa), sigmaZ, { declaredFrames: [0.5, 0] });
      expect(swapped.frameSource).toBe('declared');
      expect([int(swapped.halfPeriod!.zero.winding.nearest), int(swapped.halfPeriod!.pi.winding.nearest)]).toEqual([zero, -pi + 0]);
      expect([int(swapped.zero!.nearest), int(swapped.pi!.nearest)]).toEqual([zero, -pi + 0]);
    }
  });

  it('settles ν₀ on its phase boundary φ₁ + φ₂ = π/2 (π gap closed)', () => {
    const r = chiralInvariants(kickedChain(0.8, Math.PI - 0.8), sigmaZ);
    expect(r.halfPeriod!.zero.winding.converged).toBe(true);
    expect(int(r.halfPeriod!.zero.winding.nearest)).toBe(1);
    expect(r.halfPeriod!.pi.winding.converged).toBe(false);
  });
});

describe('declared frames', () => {
  it('reject a declared first time that is not a symmetric frame, naming the frames that are', () => {
    const r = chiralInvariants(twoStepChain(0.4, 2.1), sigmaZ, { declaredFrames: [0, 0.5] });
    expect(r.status).toBe('declared-frame-not-symmetric');
    expect(r.reason).toMatch(/^the first symmetric time listed, t₀ = 0, is not a symmetric frame \(residual [0-9.]+ > 1×10⁻¹⁰\); symmetric frames exist at t₀ = 0\.25 and 0\.75; to settle, list a symmetric frame first/);
  });

  it('state which frames were used', () => {
    expect(chiralInvariants(twoStepChain(0.4, 2.1), sigmaZ).notes).toEqual(['no symmetricTimes declared: the engine found the frames t₀ = 0.25 (ν′, the earlier) and 0.75 (ν″)']);
    const declared = chiralInvariants(twoStepChain(0.4, 2.1), sigmaZ, { declaredFrames: [0.75, 0.3] });
    expect(declared.notes).toEqual([
      'frames as declared: ν′ in t₀ = 0.75 (the first time in symmetricTimes), ν″ in t₀ + T/2 = 0.25',
      'the second time listed (0.3) is not t₀ + T/2; the frame t₀ + T/2 = 0.25 was used for ν″',
    ]);
  });
});
