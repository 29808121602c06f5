import { describe, expect, it } from 'vitest';
import { fromArrays } from '../../../src/numerics/linalg/complex-matrix.ts';
import { nambuParticleHole } from '../../../src/numerics/evolution/bdg.ts';
import { openChainSpectrum } from '../../../src/numerics/chain/open-chain.ts';
import { analyseChain } from '../../../src/numerics/chain/chain-analysis.ts';
import { chiralInvariants } from '../../../src/numerics/chain/chiral-winding.ts';
import { majoranaInvariants } from '../../../src/numerics/chain/majorana-z2.ts';
import { kickedKitaevChain, splitStepWalk, sshChain, twoStepChain, kitaevChain } from '../../support/drives/chains.ts';

const sigmaZ = fromArrays([[1, 0], [0, -1]]);

describe('open chains', () => {
  it('SSH chain with |v| < |w| has one zero mode per end, |ψ|² ∝ (v/w)^{2x} (exact semi-infinite solution)', () => {
    // The zero mode on sublattice A obeys v ψ_x + w ψ_{x+1} = 0, so ξ = 1 / ln(w/v) (amplitude decay length).
    const v = 0.5, w = 1;
    const r = openChainSpectrum(sshChain(v, w), 24);
    const zero = r.modes[0];
    expect([zero.low, zero.high]).toEqual([1, 1]);
    const exact = 1 / Math.log(w / v);
    expect(Math.abs(zero.lowFit!.length - exact)).toBeLessThanOrEqual(0.02 * exact);
    expect(Math.abs(zero.highFit!.length - exact)).toBeLessThanOrEqual(0.02 * exact);
    expect(zero.lowFit!.rmsResidual).toBeLessThan(0.1);
    expect([r.modes[1].low, r.modes[1].high]).toEqual([0, 0]);
  });

  it('SSH chain with |v| > |w| has no end modes', () => {
    const r = openChainSpectrum(sshChain(1, 0.5), 24);
    expect(r.modes.map((m) => [m.low, m.high])).toEqual([[0, 0], [0, 0]]);
  });

  it('bulk–end correspondence: end modes per end = |ν₀|, |ν_π| on every chiral test model', () => {
    const models = [twoStepChain(0.3, 1.2), twoStepChain(2.0, 1.5), twoStepChain(1.5, 2.0), twoStepChain(0.9, 0.4), splitStepWalk(0.3 * Math.PI, 0.1 * Math.PI), splitStepWalk(0.2 * Math.PI, 0.9 * Math.PI)];
    for (const d of models) {
      const inv = chiralInvariants(d, sigmaZ);
      const r = openChainSpectrum(d, 36);
      expect(r.modes.map((m) => [m.low, m.high])).toEqual([
        [Math.abs(inv.zero!.nearest), Math.abs(inv.zero!.nearest)],
        [Math.abs(inv.pi!.nearest), Math.abs(inv.pi!.nearest)],
      ]);
    }
  });

  it('bulk–end correspondence for Majorana parities, including π modes of the kicked Kitaev chain', () => {
    const cases: [ReturnType<typeof kitaevChain>, number][] = [
      [kitaevChain(1, 1, 0.5, 0.5), 40],
      [kickedKitaevChain(1, 1, 3, 2, 0.5), 40],
      [kickedKitaevChain(1, 1, 2.5, 2.5, 1), 130],
    ];
    for (const [d, cells] of cases) {
      const z = majoranaInvariants(d, nambuParticleHole(1));
      const r = openChainSpectrum(d, cells);
      expect(r.modes.every((m) => m.settled)).toBe(true);
      expect(r.modes[0].low! % 2).toBe(z.zero!.sign === -1 ? 1 : 0);
      expect(r.modes[1].low! % 2).toBe(z.pi!.sign === -1 ? 1 : 0);
      expect(r.modes[1].high).toBe(r.modes[1].low);
    }
  });

  it('refuses to count when the chain is too short for the decay length', () => {
    const r = openChainSpectrum(twoStepChain(1.45, 1.6), 8);
    expect(r.modes.some((m) => !m.settled && /shorter than 10 decay lengths/.test(m.reason ?? ''))).toBe(true);
  });
});

describe('long open chains (states near 0 and π/T only, by shift-invert)', () => {
  it('give the end-mode counts of the whole spectrum on every chiral test model', () => {
    const models = [twoStepChain(0.3, 1.2), twoStepChain(2.0, 1.5), twoStepChain(1.5, 2.0), splitStepWalk(0.3 * Math.PI, 0.1 * Math.PI), splitStepWalk(0.2 * Math.PI, 0.9 * Math.PI)];
    for (const d of models) {
      const whole = openChainSpectrum(d, 40, { denseStates: Infinity });
      const near = openChainSpectrum(d, 40, { denseStates: 0 });
      expect(whole.coverage).toBe('all');
      expect(near.coverage).toBe('near-gap-labels');
      expect(near.modes.map((m) => [m.low, m.high, m.settled])).toEqual(whole.modes.map((m) => [m.low, m.high, m.settled]));
      near.modes.forEach((m, i) => expect(m.lowWeight).toBeCloseTo(whole.modes[i].lowWeight, 8));
    }
  });

  it('settle end modes that decay over a hundred cells on a chain of a thousand (two-step chain near θ₁ = θ₂)', () => {
    // θ₂ − θ₁ = 0.01: the gap at 0 is 2|θ₁ − θ₂|/π ≈ 0.0064 π/T (derived in catalogue/verify/fixtures.test.ts); ν₀ = 1
    // for θ₂ > θ₁ (Asbóth & Obuse, PRB 88, 121406(R) (2013)), so one zero mode per end, decaying slowly.
    const d = twoStepChain(0.7, 0.71);
    const r = analyseChain(d, { chiral: sigmaZ });
    const zero = r.openChain!.modes[0];
    expect(r.openChain!.cells).toBeGreaterThan(600);
    expect(r.openChain!.coverage).toBe('near-gap-labels');
    expect(r.openChain!.lengthSufficient).toBe(true);
    expect([zero.low, zero.high, zero.settled]).toEqual([1, 1, true]);
    expect(zero.lowDecayLength!).toBeGreaterThan(50);
  });
});
