import { describe, expect, it } from 'vitest';
import { analyseSheet, consistencyChecks, edgeSign } from '../../../src/numerics/sheet/sheet-analysis.ts';
import type { BandGroupReport, GapReport, WindingReport } from '../../../src/numerics/portrait.ts';
import { integerEstimate } from '../../../src/numerics/certificates.ts';
import { truncateDrive } from '../../../src/numerics/supercell.ts';
import { qwzDrive } from '../../support/drives/qwz.ts';

describe('analyseSheet on QWZ at m = 1', () => {
  const portrait = analyseSheet(qwzDrive(1), { grid: [12, 12], ribbon: { width: 12, momenta: 48 } });

  it('finds the gaps at 0 and π/T, counts bands upward from π/T and gives C = +1, −1', () => {
    expect(portrait.kind).toBe('sheet');
    expect(portrait.cut).toBe(1);
    expect(portrait.gaps.map((g) => Math.round(g.label * 1e9) / 1e9).sort()).toEqual([0, 1]);
    expect(portrait.bands.map((b) => b.chern?.nearest)).toEqual([1, -1]);
    expect(portrait.bands.every((b) => b.chern?.converged && b.chern.maxPlaquetteFlux < Math.PI / 3)).toBe(true);
    expect(portrait.gapTolerance).toBe(1e-3);
  });

  it('computes windings, ribbons along both lattice vectors, and every consistency check holds', () => {
    expect(portrait.windings.map((w) => [Math.round(w.gap * 1e9) / 1e9 + 0, w.winding.nearest + 0])).toEqual([[1, 0], [0, 1]]);
    expect(portrait.ribbons.map((r) => r.finiteDirection)).toEqual([0, 1]);
    expect(portrait.consistency.length).toBeGreaterThan(10);
    const failing = portrait.consistency.filter((c) => !c.holds);
    expect(failing).toEqual([]);
    expect(Object.keys(portrait.timings).sort()).toEqual(['bands', 'chern', 'edges', 'gaps', 'symmetries', 'winding']);
    expect(portrait.propagatorAccuracy).toBeLessThan(1e-9);
    expect(portrait.eigenResidual).toBeLessThan(1e-12);
  });
});

describe('stages and options', () => {
  it('skips Chern numbers, windings and ribbons when asked', () => {
    const p = analyseSheet(qwzDrive(1), { grid: [8, 8], run: { chern: false, winding: false, edges: false } });
    expect(p.bands.every((b) => b.chern === undefined)).toBe(true);
    expect(p.windings).toEqual([]);
    expect(p.ribbons).toEqual([]);
  });

  it('rejects a drive that is not a sheet', () => {
    expect(() => analyseSheet(truncateDrive(qwzDrive(1), 0, 3))).toThrow(/two periodic directions, got dimension 1/);
  });
});

describe('edge signs and consistency checks', () => {
  it('uses count = σW with σ = −1 (low) / +1 (high) finite along a₁, swapped along a₂, all flipped for a left-handed basis', () => {
    expect([edgeSign(0, 'low'), edgeSign(0, 'high'), edgeSign(1, 'low'), edgeSign(1, 'high')]).toEqual([-1, 1, 1, -1]);
    expect([edgeSign(0, 'low', -1), edgeSign(1, 'low', -1)]).toEqual([1, -1]);
  });

  it('reports a violated relation W(above) − W(below) = C instead of smoothing it over', () => {
    const gap = (label: number): GapReport => ({ label, lower: label - 0.1, upper: label + 0.1, minimalGap: 0.2, momentumAtMinimum: [0, 0], open: true, arcWidth: 0.2 });
    const chern = (c: number) => ({ ...integerEstimate(c, 1e-6, [8, 8], []), maxPlaquetteFlux: 0.1, fluxThreshold: Math.PI / 3, minimalLinkModulus: 0.9 });
    const band = (index: number, below: number, above: number, c: number): BandGroupReport => ({
      index, branches: 1, gapBelow: below, gapAbove: above, range: [0, 0], minimalInternalGap: Infinity, touching: false, chern: chern(c),
    });
    const winding = (g: number, w: number): WindingReport => ({ gap: g, winding: integerEstimate(w, 1e-3, [8, 8, 8], []) });
    const checks = consistencyChecks([gap(1), gap(0)], [band(0, 1, 0, 1), band(1, 0, 1, -1)], [winding(1, 0), winding(0, 0)], []);
    const step = checks.find((c) => c.name === 'winding-step:band-0')!;
    expect(step.holds).toBe(false);
    expect(step.detail).toMatch(/= 0 − 0 = 0, C = 1/);
    const unsettled = consistencyChecks([gap(1), gap(0)], [band(0, 1, 0, 1), band(1, 0, 1, -1)], [winding(1, 0), winding(0, 0.4)], []);
    const inconclusive = unsettled.find((c) => c.name === 'winding-step:band-0')!;
    expect([inconclusive.holds, inconclusive.inconclusive]).toEqual([false, true]);
  });
});
