import { describe, expect, it } from 'vitest';
import { fromArrays } from '../../../src/numerics/linalg/complex-matrix.ts';
import { nambuParticleHole } from '../../../src/numerics/evolution/bdg.ts';
import { majoranaInvariants } from '../../../src/numerics/chain/majorana-z2.ts';
import { chiralInvariants } from '../../../src/numerics/chain/chiral-winding.ts';
import { kickedKitaevChain, kitaevChain, twoStepKitaevChain } from '../../support/drives/chains.ts';

const C = nambuParticleHole(1);
const tauX = fromArrays([[0, 1], [1, 0]]);

describe('class D parities M₀, M_π', () => {
  it.each([
    [0.5, -1],
    [-1.5, -1],
    [2.5, 1],
    [3.5, 1],
  ])('static Kitaev chain μ = %f: M₀ = %i (topological iff |μ| < 2w; Kitaev, Phys. Usp. 44, 131 (2001)), M_π = +1', (mu, m0) => {
    // T = 0.5 keeps the bandwidth (≤ 2w + |μ|) below π/T, so no π modes exist.
    const r = majoranaInvariants(kitaevChain(1, 1, mu, 0.5), C);
    expect(r.zero!.sign).toBe(m0);
    expect(r.pi!.sign).toBe(1);
    expect(r.zero!.margin).toBeGreaterThan(1e-3);
  });

  it('kicked chemical potential creates Majorana π modes where the static chain has none (Thakurathi et al., PRB 88, 155133 (2013))', () => {
    // μ₀ = 3 > 2w: the static chain is trivial; with T = 0.5 its bandwidth 2w + μ₀ = 5 stays below π/T.
    const staticChain = majoranaInvariants(kitaevChain(1, 1, 3, 0.5), C);
    expect([staticChain.zero!.sign, staticChain.pi!.sign]).toEqual([1, 1]);
    const kicked = majoranaInvariants(kickedKitaevChain(1, 1, 3, 2, 0.5), C);
    expect([kicked.zero!.sign, kicked.pi!.sign]).toEqual([1, -1]);
  });

  it('agrees with the BDI winding parity (Γ = τ_x for real Kitaev chains) on several drives', () => {
    const drives = [kickedKitaevChain(1, 1, 2.5, 2.5, 1), kickedKitaevChain(1, 1, 3, 2, 0.5), twoStepKitaevChain(1, 3, 3, 1), twoStepKitaevChain(1, 4, 3, 1.5)];
    for (const d of drives) {
      const z = majoranaInvariants(d, C), w = chiralInvariants(d, tauX);
      expect(z.zero!.sign).toBe(Math.abs(w.zero!.nearest) % 2 === 1 ? -1 : 1);
      expect(z.pi!.sign).toBe(Math.abs(w.pi!.nearest) % 2 === 1 ? -1 : 1);
    }
  });

  it('many-body and single-particle evolutions agree: (Tr Û/2ⁿ)² = det((1 + U_M)/2) to 1e-12', () => {
    const r = majoranaInvariants(kickedKitaevChain(1, 0.7, 1.2, 0.8, 1.3), C);
    for (const p of r.points) {
      expect(p.liftConsistency).toBeLessThan(1e-12);
      expect(p.realityDefect).toBeLessThan(1e-12);
    }
  });

  it('reports a particle–hole operator that is not in Nambu form instead of guessing a basis', () => {
    const r = majoranaInvariants(kitaevChain(1, 1, 0.5), fromArrays([[1, 0], [0, 1]]));
    expect(r.status).toBe('not-nambu');
    expect(r.reason).toMatch(/τ_x ⊗ 1/);
  });
});
