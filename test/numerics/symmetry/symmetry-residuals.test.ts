import { describe, expect, it } from 'vitest';
import { fromArrays, identity } from '../../../src/numerics/linalg/complex-matrix.ts';
import { nambuParticleHole } from '../../../src/numerics/evolution/bdg.ts';
import { chiralResidual, particleHoleResidual, timeReversalResidual } from '../../../src/numerics/symmetry/symmetry-residuals.ts';
import { analyseChain } from '../../../src/numerics/chain/chain-analysis.ts';
import { hop, kickedKitaevChain, twoStepChain, splitStepWalk } from '../../support/drives/chains.ts';

const sigmaZ = fromArrays([[1, 0], [0, -1]]);

describe('symmetry residuals', () => {
  it('are below 1e-12 where the symmetry holds (Hamiltonian and Floquet-operator forms)', () => {
    for (const d of [twoStepChain(0.4, 1.1), splitStepWalk(0.3 * Math.PI, 0.1 * Math.PI)]) {
      const r = chiralResidual(d, sigmaZ);
      expect(r.hamiltonian).toBeLessThan(1e-12);
      expect(r.floquet).toBeLessThan(1e-12);
      expect(r.holds).toBe(true);
    }
    const kitaev = kickedKitaevChain(1, 0.8, 2.5, 1.3, 1);
    const ph = particleHoleResidual(kitaev, nambuParticleHole(1));
    // Real hopping, pairing and potentials: time reversal with U_T = 1 about the kick (common practice for the Kitaev chain).
    const tr = timeReversalResidual(kitaev, identity(2));
    for (const r of [ph, tr]) {
      expect(r.hamiltonian).toBeLessThan(1e-12);
      expect(r.floquet).toBeLessThan(1e-12);
    }
  });

  it('detects a broken chiral symmetry and turns the claim into "no symmetric frame" with the residual', () => {
    const d = twoStepChain(0.4, 1.1);
    d.segments[1].terms.push(hop(1, 1, 0, 0.2));
    const r = chiralResidual(d, sigmaZ);
    expect(r.holds).toBe(false);
    expect(r.hamiltonian).toBeGreaterThan(1e-3);
    const p = analyseChain(d, { chiral: sigmaZ }, { cells: 24 });
    expect(p.symmetries[0]).toMatchObject({ symmetry: 'chiral', holds: false });
    expect(p.chiral!.status).toBe('no-symmetric-frame');
    expect(p.chiral!.zero).toBeUndefined();
  });

  it('detects broken time reversal: a complex hopping phase', () => {
    const d = kickedKitaevChain(1, 0.8, 2.5, 1.3, 1);
    d.segments[1].terms[0].amplitude = { re: -Math.cos(0.4), im: -Math.sin(0.4) };
    d.segments[1].terms[1].amplitude = { re: Math.cos(0.4), im: -Math.sin(0.4) };
    const r = timeReversalResidual(d, identity(2));
    expect(r.holds).toBe(false);
    expect(r.hamiltonian).toBeGreaterThan(1e-3);
  });
});
