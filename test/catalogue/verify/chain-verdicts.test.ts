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
import { certified, estimate } from './hand-portraits.ts';

const gap = (label: number, width: number) => ({
  label, lower: label - width / 2, upper: label === 1 ? -1 + width / 2 : label + width / 2, minimalGap: width, momentumAtMinimum: [0.5], open: 0.8 * width > 1e-3, arcWidth: width, certified: certified(width),
});
const chiral = [
  { name: 'chiral symmetry of H(t) about t₀ = 0.25', residual: 0, tolerance: 1e-10 },
  { name: 'chiral symmetry of the Floquet operator', residual: 1e-15, tolerance: 1e-10 },
];

const endModes = (chainLength: number, zero: number, pi: number) => [
  { gap: 0, count: zero, settled: true, chainLength, decayLength: 1.2 },
  { gap: 1, count: pi, settled: true, chainLength, decayLength: 2.5 },
];

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
    endModes: endModes(40, Math.abs((nu1 + nu2) / 2), Math.abs((nu1 - nu2) / 2)),
    checkEndModes: endModes(60, Math.abs((nu1 + nu2) / 2), Math.abs((nu1 - nu2) / 2)),
    openChain: null,
    symmetry: chiral,
    consistency: [],
    propagatorAccuracy: 0,
    timings: {},
    bandwidth: 0.6,
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

  it('contradicts invariant claims resting on a broken chiral symmetry, with the residual, and judges Γ itself', () => {
    const view = chainView(0, 2);
    view.symmetry = [
      { name: 'chiral symmetry of H(t) about t₀ = 0.25', residual: 0.185, tolerance: 1e-10 },
      { name: 'chiral symmetry of the Floquet operator', residual: 1e-3, tolerance: 1e-10 },
    ];
    view.invariants = [];
    view.frames = [];
    const claims: NormalizedClaim[] = [
      { kind: 'symmetry', id: 'symmetry/chiral', pointer: '/claims/symmetries/chiral/operator', symmetry: 'chiral', value: true },
      inv(0, 1),
      { kind: 'end-modes', id: 'gap-0/end-modes', pointer: '/claims/gaps/0/endModes', gap: 0, value: 1 },
    ];
    const { verdicts, entries } = judgeChain(view, claims, DEFAULT_POLICY);
    const [gamma, nu0, ends] = verdicts;
    // The policy floor 1e-8 applies when the engine's tolerance is tighter.
    expect(gamma).toMatchObject({ kind: 'symmetry', pointer: '/claims/symmetries/chiral/operator', outcome: 'contradicted', claimed: true, computed: false });
    expect(gamma.message).toContain('symmetry broken: ‖ΓH(t₀+s)Γ† + H(t₀−s)‖ = 0.185 > tolerance 1×10⁻⁸ (max over k and s, best frame t₀ = 0.25); ‖ΓUΓ† − U†‖ = 0.001 > tolerance 1×10⁻⁸');
    expect(gamma.certificate.residual).toBe(0.185);
    expect(nu0).toMatchObject({ outcome: 'contradicted', computed: null });
    expect(nu0.message).toMatch(/^The invariant of the gap at ε = 0 is not defined, symmetry broken: ‖ΓH\(t₀\+s\)Γ† \+ H\(t₀−s\)‖ = 0\.185 > tolerance/);
    // End modes are counted on the open chain, not derived from the symmetry; their certificate still shows the residuals.
    expect(ends.outcome).toBe('confirmed');
    expect(ends.certificate.symmetry.map((s) => s.residual)).toEqual([0.185, 1e-3]);
    const pi = classifyChain(entries.find((e) => e.id === 'gap-1/invariant'));
    expect(pi.classification).toBe('not-anomalous');
    expect(pi.reason).toMatch(/^symmetry broken: chiral symmetry of H\(t\) about t₀ = 0\.25 holds only to 0\.185/);
  });

  it('confirms a declared symmetry whose residuals are within tolerance', () => {
    const claim: NormalizedClaim = { kind: 'symmetry', id: 'symmetry/chiral', pointer: '/claims/symmetries/chiral/operator', symmetry: 'chiral', value: true };
    const v = judgeChain(chainView(0, 2), [claim], DEFAULT_POLICY).verdicts[0];
    expect(v).toMatchObject({ outcome: 'confirmed', computed: true });
    expect(v.certificate.symmetry).toHaveLength(2);
    // A time-reversal claim with no residual from the engine cannot be checked.
    const tr: NormalizedClaim = { kind: 'symmetry', id: 'symmetry/time-reversal', pointer: '/claims/symmetries/timeReversal/unitary', symmetry: 'time-reversal', value: true };
    expect(judgeChain(chainView(0, 2), [tr], DEFAULT_POLICY).verdicts[0].outcome).toBe('unsettled');
  });

  it('says why the π invariant is missing when its gap is open: the engine reason, or no symmetry declared', () => {
    const view = chainView(0, 2);
    view.invariants = [];
    view.frames = [];
    view.invariantNote = 'no symmetric time frame within tolerance';
    const entry = judgeChain(view, [], DEFAULT_POLICY).entries.find((e) => e.id === 'gap-1/invariant');
    const flag = classifyChain(entry);
    expect(flag.classification).toBe('undetermined');
    expect(flag.reason).toBe('winding ν_π of the gap at ε = π/T is unsettled (the engine computed no invariant: no symmetric time frame within tolerance; to settle, check the declared operator against the drive (see the verdict on the symmetry))');
    expect(flag.reason).not.toMatch(/closed/);
    view.symmetry = [];
    const claim = judgeChain(view, [inv(1, 1)], DEFAULT_POLICY);
    expect(claim.entries.find((e) => e.id === 'gap-1/invariant')).toBeUndefined();
    expect(claim.verdicts[0].message).toMatch(/no chiral or particle–hole symmetry is declared/);
    expect(classifyChain(undefined).reason).toMatch(/declares no chiral or particle–hole symmetry/);
  });

  it('settles end modes only when a chain 1.5× as long gives the same count', () => {
    const claim: NormalizedClaim = { kind: 'end-modes', id: 'gap-1/end-modes', pointer: '/claims/gaps/1/endModes', gap: 1, value: 1 };
    const same = judgeChain(chainView(0, 2), [claim], DEFAULT_POLICY).verdicts[0];
    expect(same).toMatchObject({ outcome: 'confirmed', computed: 1 });
    expect(same.certificate.refinement).toEqual([{ grid: [40], value: 1 }, { grid: [60], value: 1 }]);
    const view = chainView(0, 2);
    view.checkEndModes = endModes(60, 1, 0);
    const changed = judgeChain(view, [claim], DEFAULT_POLICY).verdicts[0];
    expect(changed.outcome).toBe('unsettled');
    expect(changed.message).toMatch(/the count changed with the chain length: 1 at 40, 0 at 60/);
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
