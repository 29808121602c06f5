import { describe, expect, it } from 'vitest';
import { fromArrays, identity } from '../../../src/numerics/linalg/complex-matrix.ts';
import { nambuParticleHole } from '../../../src/numerics/evolution/bdg.ts';
import { analyseChain } from '../../../src/numerics/chain/chain-analysis.ts';
import { kickedKitaevChain, twoStepChain } from '../../support/drives/chains.ts';

describe('analyseChain', () => {
  it('two-step chain in the (1, 1) phase: invariants, end modes, frames and consistency in one portrait', () => {
    const p = analyseChain(twoStepChain(1.5, 2.0), { chiral: fromArrays([[1, 0], [0, -1]]) });
    expect(p.kind).toBe('chain');
    expect(p.gaps.map((g) => g.open)).toEqual([true, true]);
    // Analytic clearances: the 0 gap edge is at |θ₁ − θ₂| = 0.5 rad, the π gap edge at π − (θ₁ + θ₂) → |π − 3.5| rad; in units π/T.
    expect(Math.abs(p.gaps[0].clearance - 0.5 / Math.PI)).toBeLessThanOrEqual(1e-9);
    expect(Math.abs(p.gaps[1].clearance - (3.5 - Math.PI) / Math.PI)).toBeLessThanOrEqual(1e-9);
    expect([Math.abs(p.chiral!.zero!.nearest), Math.abs(p.chiral!.pi!.nearest)]).toEqual([1, 1]);
    expect(p.openChain!.modes.map((m) => [m.low, m.high])).toEqual([[1, 1], [1, 1]]);
    expect(p.consistency.length).toBeGreaterThanOrEqual(3);
    for (const c of p.consistency) expect(c.holds, c.detail).toBe(true);
    // Both gaps open: the half-period invariants are checked against the H_eff ones, and the check is reported.
    expect(p.consistency.map((c) => c.name)).toEqual(expect.arrayContaining(['half-period vs H_eff at 0', 'half-period vs H_eff at π']));
    expect([p.chiral!.halfPeriod!.zero.nearest, p.chiral!.halfPeriod!.pi.nearest]).toEqual([p.chiral!.zero!.nearest, p.chiral!.pi!.nearest]);
    expect(p.determinantWinding.nearest + 0).toBe(0);
  });

  it('kicked Kitaev chain with particle–hole and time reversal: Z₂ and the BDI winding derived from both agree with the ends', () => {
    const p = analyseChain(kickedKitaevChain(1, 1, 3, 2, 0.5), { particleHole: { unitary: nambuParticleHole(1) }, timeReversal: { unitary: identity(2) } });
    expect(p.chiral!.source).toBe('time-reversal × particle-hole');
    expect([p.majorana!.zero, p.majorana!.pi]).toEqual([1, -1]);
    expect(Math.abs(p.chiral!.pi!.nearest)).toBe(1);
    expect(p.openChain!.modes[1].low).toBe(1);
    for (const c of p.consistency) expect(c.holds, c.detail).toBe(true);
    expect(p.symmetries.every((s) => s.holds)).toBe(true);
  });

  it('reports the whole open-chain spectrum with end weights; the end states are the window states the counts rest on', () => {
    const cells = 40;
    const p = analyseChain(twoStepChain(1.5, 2.0), { chiral: fromArrays([[1, 0], [0, -1]]) }, { cells });
    const open = p.openChain!;
    expect(open.quasienergies).toHaveLength(2 * cells);
    for (let i = 1; i < open.quasienergies.length; i++) expect(open.quasienergies[i]).toBeGreaterThanOrEqual(open.quasienergies[i - 1]);
    // Weights are probabilities of disjoint regions of a normalised state.
    open.quasienergies.forEach((_, i) => expect(open.lowEdgeWeight[i] + open.highEdgeWeight[i]).toBeLessThanOrEqual(1 + 1e-12));
    for (const mode of open.modes) {
      const inside = open.quasienergies.map((e, i) => i).filter((i) => mode.quasienergies.includes(open.quasienergies[i]));
      expect(inside).toHaveLength(mode.quasienergies.length);
      const low = inside.reduce((s, i) => s + open.lowEdgeWeight[i], 0), high = inside.reduce((s, i) => s + open.highEdgeWeight[i], 0);
      expect(Math.abs(low - mode.lowWeight)).toBeLessThanOrEqual(1e-12);
      expect(Math.abs(high - mode.highWeight)).toBeLessThanOrEqual(1e-12);
    }
  });

  it('without the open chain (sweep points) reports gaps and invariants but no end modes or bulk–end relations', () => {
    const gamma = fromArrays([[1, 0], [0, -1]]);
    const full = analyseChain(twoStepChain(1.5, 2.0), { chiral: gamma });
    const bulk = analyseChain(twoStepChain(1.5, 2.0), { chiral: gamma }, { run: { openChain: false } });
    expect(bulk.openChain).toBeUndefined();
    expect(bulk.timings['open-chain']).toBeUndefined();
    expect(bulk.consistency.some((c) => c.name.startsWith('bulk–end'))).toBe(false);
    expect(bulk.gaps).toEqual(full.gaps);
    expect([bulk.chiral!.zero!.nearest, bulk.chiral!.pi!.nearest]).toEqual([full.chiral!.zero!.nearest, full.chiral!.pi!.nearest]);
  });
});
