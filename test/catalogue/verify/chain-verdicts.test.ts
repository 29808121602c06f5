/**
 * Chain verdicts on hand-made engine results. The relations used are published:
 * ν₀ = (ν′ + ν″)/2, ν_π = (ν′ − ν″)/2 (Asbóth & Obuse, PRB 88, 121406(R) (2013)),
 * and class D Z₂ indices from Pfaffian signs (Jiang et al., PRL 106, 220402 (2011)).
 */
import { describe, expect, it } from 'vitest';
import { judgeChain } from '../../../src/catalogue/verify/chain-verdicts.ts';
import type { ChainView } from '../../../src/catalogue/verify/chain-view.ts';
import { DEFAULT_POLICY } from '../../../src/catalogue/verify/policy.ts';
import { classifyChain } from '../../../src/catalogue/verify/anomalous.ts';
import type { NormalizedClaim } from '../../../src/catalogue/verify/claims.ts';
import { integerEstimate } from '../../../src/numerics/certificates.ts';
import { estimate } from './hand-portraits.ts';

const gap = (label: number, width: number) => ({
  label, lower: label - width / 2, upper: label === 1 ? -1 + width / 2 : label + width / 2, minimalGap: width, momentumAtMinimum: [0.5], open: width > 1e-3, arcWidth: width,
});
const chiral = [{ name: 'chiral symmetry of the Floquet operator', residual: 1e-15, tolerance: 1e-10 }];

function chainView(nu1: number, nu2: number, o: { piGap?: number; frameResidual?: number } = {}): ChainView {
  return {
    grid: [128],
    gaps: [gap(0, 0.6), gap(1, o.piGap ?? 0.2)],
    bands: [],
    invariants: [
      { gap: 0, kind: 'winding', estimate: integerEstimate((nu1 + nu2) / 2, 1e-6, [32], [{ grid: [32], value: (nu1 + nu2) / 2 }]), symmetry: chiral, fromFrames: true },
      { gap: 1, kind: 'winding', estimate: integerEstimate((nu1 - nu2) / 2, 1e-6, [32], [{ grid: [32], value: (nu1 - nu2) / 2 }]), symmetry: chiral, fromFrames: true },
    ],
    frames: [
      { time: 0.25, name: 'first', estimate: estimate(nu1, { residual: o.frameResidual }) },
      { time: 0.75, name: 'second', estimate: estimate(nu2) },
    ],
    endModes: [
      { gap: 0, count: Math.abs((nu1 + nu2) / 2), settled: true, chainLength: 40, decayLength: 1.2 },
      { gap: 1, count: Math.abs((nu1 - nu2) / 2), settled: true, chainLength: 40, decayLength: 2.5 },
    ],
    openChain: null,
    symmetry: chiral,
    consistency: [],
    propagatorAccuracy: 0,
    timings: {},
    velocity: 2,
  };
}

const inv = (gapLabel: number, value: number): NormalizedClaim => ({ kind: 'gap-invariant', id: `gap-${gapLabel}/invariant`, pointer: `/claims/gaps/${gapLabel}/invariant`, gap: gapLabel, value });

describe('chain verdicts', () => {
  it('confirms ν₀ and ν_π built from settled frame windings and lists the frames in the certificate', () => {
    const { verdicts, entries } = judgeChain(chainView(0, 2), [inv(0, 1), inv(1, -1)], DEFAULT_POLICY);
    expect(verdicts.map((v) => [v.outcome, v.computed])).toEqual([['confirmed', 1], ['confirmed', -1]]);
    expect(verdicts[0].certificate.refinement).toHaveLength(1 + 2 + 2);
    expect(classifyChain(entries.find((e) => e.id === 'gap-1/invariant')).classification).toBe('anomalous');
  });

  it('names the frame mix-up: a claim equal to ν″ or ν′ instead of the gap invariant', () => {
    const { verdicts } = judgeChain(chainView(0, 2), [inv(0, 2), inv(1, 0)], DEFAULT_POLICY);
    expect(verdicts[0].hint).toBe('matches ν″ of the other symmetric frame (t₀ = 0.75); the gap invariants are ν₀ = (ν′ + ν″)/2 and ν_π = (ν′ − ν″)/2');
    expect(verdicts[1].hint).toMatch(/^matches ν′ of the first symmetric frame \(t₀ = 0\.25\)/);
  });

  it('is unsettled when a frame winding is not an integer, even if the derived invariant looks fine', () => {
    const { verdicts } = judgeChain(chainView(0, 2, { frameResidual: 0.3 }), [inv(0, 1)], DEFAULT_POLICY);
    expect(verdicts[0].outcome).toBe('unsettled');
    expect(verdicts[0].message).toMatch(/ν′ \(frame t₀ = 0\.25\) is unsettled/);
  });

  it('is unsettled when the chiral symmetry is broken beyond its tolerance', () => {
    const view = chainView(0, 2);
    view.invariants[0].symmetry = [{ name: 'chiral symmetry of the Floquet operator', residual: 1e-3, tolerance: 1e-10 }];
    const v = judgeChain(view, [inv(0, 1)], DEFAULT_POLICY).verdicts[0];
    expect(v.outcome).toBe('unsettled');
    // The policy floor 1e-8 applies when the engine's tolerance is tighter.
    expect(v.message).toMatch(/chiral symmetry of the Floquet operator holds only to 0\.00100 \(tolerance 1\.00e-8\)/);
  });

  it('decides a Z₂ index by its sign margin without asking for grid refinement', () => {
    const view = chainView(0, 0);
    view.invariants = [
      { gap: 1, kind: 'z2', estimate: integerEstimate(1, 0.01, [2], [{ grid: [2], value: 1 }]), symmetry: [], signDecided: true },
    ];
    const claim = inv(1, 1);
    expect(judgeChain(view, [claim], DEFAULT_POLICY).verdicts[0]).toMatchObject({ outcome: 'confirmed', computed: 1 });
    view.invariants[0].estimate = integerEstimate(NaN, 0.01, [2], [], false, 'the Pfaffian-sign margin 1e-14 is below its tolerance 1e-10');
    expect(judgeChain(view, [claim], DEFAULT_POLICY).verdicts[0].outcome).toBe('unsettled');
  });
});
