import { describe, expect, it } from 'vitest';
import { fromArrays } from '../../../src/numerics/linalg/complex-matrix.ts';
import { chiralInvariants } from '../../../src/numerics/chain/chiral-winding.ts';
import { shiftTimeOrigin } from '../../../src/numerics/evolution/time-shift.ts';
import { hop, sshChain, splitStepWalk, twoStepChain } from '../../support/drives/chains.ts';

const sigmaZ = fromArrays([[1, 0], [0, -1]]);
/** Integer without the sign of zero (Math.round(−1e-17) is −0). */
const int = (x: number) => x + 0;

describe('chiral invariants (Asbóth & Obuse, PRB 88, 121406(R) (2013))', () => {
  it.each([
    [0.4, 1.0, 1],
    [1.0, 0.4, 0],
    [0.2, 0.9, 1],
  ])('static SSH chain v = %f, w = %f has ν₀ = %i and ν_π = 0 (Su, Schrieffer, Heeger, PRL 42, 1698 (1979))', (v, w, nu) => {
    // Bandwidth |v| + |w| < π/T: the static chain leaves the π gap empty.
    const r = chiralInvariants(sshChain(v, w, 1), sigmaZ);
    expect(r.status).toBe('computed');
    expect(int(r.zero!.nearest)).toBe(nu);
    expect(int(r.pi!.nearest)).toBe(0);
    expect(r.zero!.converged && r.pi!.converged).toBe(true);
    expect(r.zero!.residual).toBeLessThanOrEqual(1e-6);
  });

  it('two-step chain: (|ν₀|, |ν_π|) on a 12×12 grid of (θ₁, θ₂) in (0, π)² follows the analytic gap closings', () => {
    // Derivation: U(k) = e^{−iθ₂ n(k)·σ} e^{−iθ₁σ_x} with n(k) = (cos k, sin k, 0), so
    // cos(εT) = cos θ₁ cos θ₂ − sin θ₁ sin θ₂ cos k. At k = π this is cos(θ₁ − θ₂): the 0 gap closes on θ₁ = θ₂;
    // at k = 0 it is cos(θ₁ + θ₂): the π gap closes on θ₁ + θ₂ = π. Starting from the trivial corner
    // (θ₂ → 0: only intracell hopping, no end modes) each line toggles one invariant by ±1, hence
    // |ν₀| = [θ₂ > θ₁] and |ν_π| = [θ₁ + θ₂ > π]. The grid avoids both lines.
    const seen = new Set<string>();
    for (let i = 0; i < 12; i++) {
      for (let j = 0; j < 12; j++) {
        const t1 = ((i + 0.37) / 12) * Math.PI, t2 = ((j + 0.61) / 12) * Math.PI;
        const r = chiralInvariants(twoStepChain(t1, t2), sigmaZ);
        const expected = [t2 > t1 ? 1 : 0, t1 + t2 > Math.PI ? 1 : 0];
        expect([Math.abs(r.zero!.nearest), Math.abs(r.pi!.nearest)], `θ = (${t1}, ${t2})`).toEqual(expected);
        expect(r.zero!.converged && r.pi!.converged).toBe(true);
        seen.add(expected.join(','));
      }
    }
    expect(seen.size).toBe(4);
  });

  it('finds the frames t₀ = T/4 and 3T/4 of the two-step chain with residual below 1e-12', () => {
    const r = chiralInvariants(twoStepChain(0.4, 1.1, 2), sigmaZ);
    expect(r.search!.frames.map((t) => t / 2)).toEqual([0.25, 0.75]);
    expect(r.search!.residual).toBeLessThan(1e-12);
    for (const f of r.frames) expect(f.floquetResidual).toBeLessThan(1e-12);
  });

  it('does not depend on the time origin: shifting by a full segment keeps ν₀ and |ν_π|', () => {
    // Shifting by one segment (T/2 here) swaps which symmetric frame comes first, and ν_π = (ν′ − ν″)/2
    // changes sign with the frame order (the documented convention); ν₀ and the end-mode counts do not.
    for (const [t1, t2] of [[0.3, 1.2], [2.0, 1.5], [1.5, 2.3]]) {
      const d = twoStepChain(t1, t2);
      const a = chiralInvariants(d, sigmaZ), b = chiralInvariants(shiftTimeOrigin(d, 0.5), sigmaZ);
      expect([b.zero!.nearest, b.pi!.nearest].map(int)).toEqual([a.zero!.nearest, -a.pi!.nearest].map(int));
    }
  });

  it('split-step walk: |ν₀| = |ν_π| = 1 occurs (Kitagawa, Rudner, Berg, Demler, PRA 82, 033429 (2010))', () => {
    const r = chiralInvariants(splitStepWalk(0.3 * Math.PI, 0.1 * Math.PI), sigmaZ);
    expect(r.search!.frames).toEqual([0, 0.5]);
    expect([Math.abs(r.zero!.nearest), Math.abs(r.pi!.nearest)]).toEqual([1, 1]);
  });

  it('refuses to compute without a symmetric frame and reports the best residual', () => {
    // A sublattice potential during the first step breaks Γ H Γ = −H at every time.
    const d = twoStepChain(0.4, 1.1);
    d.segments[0].terms.push(hop(0, 0, 0, 0.3));
    const r = chiralInvariants(d, sigmaZ);
    expect(r.status).toBe('no-symmetric-frame');
    expect(r.zero).toBeUndefined();
    expect(r.reason).toMatch(/no symmetric time frame: best residual [0-9.]+(×10[⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+)? at t₀ = /);
    expect(r.search!.residual).toBeGreaterThan(1e-3);
  });
});
