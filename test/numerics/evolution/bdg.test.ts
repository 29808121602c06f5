import { describe, expect, it } from 'vitest';
import { blochHamiltonian } from '../../../src/numerics/evolution/bloch.ts';
import { nambuDrive, nambuParticleHole, NambuInputError } from '../../../src/numerics/evolution/bdg.ts';
import { particleHoleResidual } from '../../../src/numerics/symmetry/symmetry-residuals.ts';
import { kitaevChain, twoStepChain } from '../../support/drives/chains.ts';

describe('nambuDrive', () => {
  it('gives the textbook Kitaev BdG matrix (Kitaev, Phys. Usp. 44, 131 (2001), with H = ½Ψ†H_BdGΨ)', () => {
    // Derived by hand: ξ(k) = −2w cos k − μ on the diagonal (±), pairing Δ(e^{−ik} − e^{ik}) = −2iΔ sin k in the (particle, hole) entry.
    const w = 0.7, delta = 0.4, mu = 0.3;
    const drive = kitaevChain(w, delta, mu);
    for (const s of [0, 0.13, 0.5, 0.71]) {
      const k = 2 * Math.PI * s;
      const h = blochHamiltonian(drive, [s], 0.5);
      const xi = -2 * w * Math.cos(k) - mu;
      const tol = 1e-14;
      expect(Math.abs(h.re[0] - xi)).toBeLessThanOrEqual(tol);
      expect(Math.abs(h.re[3] + xi)).toBeLessThanOrEqual(tol);
      expect(Math.abs(h.re[1])).toBeLessThanOrEqual(tol);
      expect(Math.abs(h.im[1] - -2 * delta * Math.sin(k))).toBeLessThanOrEqual(tol);
    }
  });

  it('is particle–hole symmetric with U_C = τ_x ⊗ 1 (residual below 1e-12)', () => {
    const r = particleHoleResidual(kitaevChain(1, 0.6, 0.4), nambuParticleHole(1));
    expect(r.hamiltonian).toBeLessThan(1e-12);
    expect(r.floquet).toBeLessThan(1e-12);
  });

  it('labels holes "h:X" with opposite charge and doubles every normal term', () => {
    const normal = twoStepChain(0.3, 0.4);
    const d = nambuDrive(normal, [[], []]);
    expect(d.states.map((s) => s.label)).toEqual(['A', 'B', 'h:A', 'h:B']);
    expect(d.states.map((s) => s.charge)).toEqual([1, 1, -1, -1]);
    expect(d.segments[1].terms).toHaveLength(2);
    expect(d.segments[1].terms[1]).toMatchObject({ from: 2, to: 3, offset: [-1] });
  });

  it('rejects a wrong number of pairing lists and on-site self-pairing with located messages', () => {
    const normal = twoStepChain(0.3, 0.4);
    expect(() => nambuDrive(normal, [[]])).toThrow(/1 pairing lists for 2 segments/);
    const self = { from: 0, to: 0, offset: [0], amplitude: { re: 1, im: 0 }, modulation: { kind: 'constant' as const } };
    expect(() => nambuDrive(normal, [[self], []])).toThrow(NambuInputError);
    expect(() => nambuDrive(normal, [[self], []])).toThrow(/segment 0, pairing 0/);
  });
});
