import { describe, expect, it } from 'vitest';
import { judgeSheet } from '../../../src/catalogue/verify/sheet-verdicts.ts';
import { DEFAULT_POLICY } from '../../../src/catalogue/verify/policy.ts';
import { classifySheet } from '../../../src/catalogue/verify/anomalous.ts';
import { modelStatus } from '../../../src/catalogue/verify/status.ts';
import { distrustOnInconsistency } from '../../../src/catalogue/verify/analyse-point.ts';
import type { NormalizedClaim } from '../../../src/catalogue/verify/claims.ts';
import { certified, estimate, ribbon, twoBandSheet } from './hand-portraits.ts';

const winding = (gap: number, value: number): NormalizedClaim => ({ kind: 'winding', id: `gap-${gap}/winding`, pointer: `/claims/gaps/${gap}/winding`, gap, value });
const chern = (band: number, value: number): NormalizedClaim => ({ kind: 'chern', id: `band-${band}/chern`, pointer: `/claims/bands/chern/${band}`, cut: 0, band, value });
const edge = (gap: number, end: 'low' | 'high', value: number): NormalizedClaim => ({
  kind: 'edge-modes', id: `gap-${gap}/edge-1-${end}`, pointer: '/x', gap, finiteAlong: 1, end, value,
});

describe('verdicts on a two-dimensional portrait', () => {
  it('confirms claims that match settled values (Rudner et al. 2013 anomalous phase: C = 0, W = 1 in both gaps)', () => {
    const { verdicts } = judgeSheet(twoBandSheet(), [winding(0, 1), winding(1, 1), chern(0, 0), chern(1, 0), edge(1, 'low', 1)], DEFAULT_POLICY);
    expect(verdicts.map((v) => v.outcome)).toEqual(['confirmed', 'confirmed', 'confirmed', 'confirmed', 'confirmed']);
    expect(verdicts[0].certificate.gaps[0]).toMatchObject({ gap: 0, minimalGap: 0.6, open: true });
    expect(verdicts[0].certificate.refinement.map((s) => s.grid)).toEqual([[24, 24], [48, 48]]);
    expect(modelStatus(verdicts).status).toBe('verified');
  });

  it('contradicts a flipped sign; for W the basis cannot be the cause (C and W are Cartesian), for edges it can', () => {
    const { verdicts } = judgeSheet(twoBandSheet(), [winding(0, -1), edge(0, 'low', -1)], DEFAULT_POLICY);
    expect(verdicts[0]).toMatchObject({ outcome: 'contradicted', claimed: -1, computed: 1 });
    expect(verdicts[0].hint).toMatch(/^sign differs: C and W are reported in the Cartesian orientation \(x̂, ŷ\) for either handedness of \(a₁, a₂\)/);
    expect(verdicts[1].hint).toMatch(/^sign differs: check the orientation of \(a₁, a₂\) or the direction of k_∥ \(edge-count signs follow the table in docs\/conventions\.md\)$/);
    expect(modelStatus(verdicts).status).toBe('disputed');
  });

  it('recognises a value that belongs to the other gap', () => {
    // Haldane-like Chern phase as a drive: C = (−1, +1) upward from the 0 gap gives W(π) − W(0) = C₀ = −1.
    const p = twoBandSheet({ c: [-1, 1], w: [1, 0] });
    const { verdicts } = judgeSheet(p, [winding(1, 1)], DEFAULT_POLICY);
    expect(verdicts[0]).toMatchObject({ outcome: 'contradicted', computed: 0, hint: 'this value belongs to the gap at ε = 0' });
    const bands = judgeSheet(p, [chern(0, 1)], DEFAULT_POLICY).verdicts[0];
    // +1 is both minus the computed value and band 1's value; the sign explanation comes first.
    expect(bands.hint).toMatch(/^sign differs/);
  });

  it('judges openness on the certified lower bound, not on the refined minimum', () => {
    // The refined minimum 0.04 π/T is far above the tolerance 1e-3, but the bound the engine could certify
    // (8e-4, budget spent) is not: a near-closing between the sampled momenta is not ruled out.
    const p = twoBandSheet();
    p.gaps[0] = { ...p.gaps[0], minimalGap: 0.04, open: false, certified: certified(0.04, 0.02, 'undecided') };
    const { verdicts } = judgeSheet(p, [winding(0, 1), winding(1, 1)], DEFAULT_POLICY);
    expect(verdicts[0].outcome).toBe('unsettled');
    expect(verdicts[0].certificate.gaps[0]).toMatchObject({ minimalGap: 0.04, lowerBound: 0.0008, bound: 'undecided', tolerance: 1e-3, open: false });
    expect(verdicts[0].message).toMatch(/lies between 8×10⁻⁴ and 0\.04 π\/T \(certified lower bound after 100 evaluations\), not shown above the tolerance 0\.001 π\/T; to settle, lower numerics\.tolerances\.gap to 8×10⁻⁴ π\/T or below/);
    expect(verdicts[0].hint).not.toMatch(/phase transition/);
    // The π gap (certified ≥ 0.48 ≫ 1e-3) is settled.
    expect(verdicts[1].outcome).toBe('confirmed');
    expect(modelStatus(verdicts).status).toBe('unsettled');
  });

  it('opens a gap whose certified bound clears the tolerance although the grid spacing is coarse', () => {
    // 0.032 π/T on a 24² grid of bands 0.8 π/T wide: the former rule max(1e-3, ½·π·0.8/24) = 0.052 refused it.
    const p = twoBandSheet({ gap0: 0.032, width: 0.8, grid: 24 });
    const v = judgeSheet(p, [winding(0, 1)], DEFAULT_POLICY).verdicts[0];
    expect(v.outcome).toBe('confirmed');
    expect(v.certificate.gaps[0]).toMatchObject({ minimalGap: 0.032, open: true });
    expect(v.certificate.gaps[0].lowerBound).toBeCloseTo(0.0256, 12);
  });

  it('names a phase transition only when the gap is small against the bandwidth; otherwise the setting to change', () => {
    const tiny = twoBandSheet({ gap0: 4e-4, width: 0.8 });
    const near = judgeSheet(tiny, [winding(0, 1)], DEFAULT_POLICY).verdicts[0];
    expect(near.outcome).toBe('unsettled');
    expect(near.message).toMatch(/is 4×10⁻⁴ π\/T at s = \(0\.000, 0\.000\), not above the tolerance 0\.001 π\/T: it is small against the bandwidth, so the model sits at or near a phase transition/);
    expect(near.hint).toMatch(/phase transition/);
    // The same gap next to a flat band (width 0.01 π/T) is not small against it: the tolerance is the setting to change.
    const flat = twoBandSheet({ gap0: 4e-4, width: 0.01 });
    const v = judgeSheet(flat, [winding(0, 1)], DEFAULT_POLICY).verdicts[0];
    expect(v.message).toMatch(/to settle, if it is a genuine gap, lower numerics\.tolerances\.gap below 4×10⁻⁴ π\/T \(hard limit 1×10⁻⁵\)/);
    expect(v.hint).not.toMatch(/phase transition/);
  });

  it('is unsettled, not contradicted, when the gap is closed or the integer moves under refinement', () => {
    const closed = judgeSheet(twoBandSheet({ gap0: 0 }), [winding(0, 5)], DEFAULT_POLICY).verdicts[0];
    expect(closed.outcome).toBe('unsettled');
    const p = twoBandSheet();
    p.windings[0].winding = estimate(1, { coarse: 0.2 });
    const moving = judgeSheet(p, [winding(0, 1)], DEFAULT_POLICY).verdicts[0];
    expect(moving.outcome).toBe('unsettled');
    expect(moving.message).toMatch(/changed under the last refinement \(0 on 24², 1 on 48²\); to settle, raise numerics\.windingEvaluations/);
    p.windings[0].winding = estimate(1, { residual: 0.2 });
    expect(judgeSheet(p, [winding(0, 1)], DEFAULT_POLICY).verdicts[0].message).toMatch(/\|x − round x\| = 0\.2 exceeds the tolerance 0\.01; to settle, raise numerics\.windingEvaluations/);
  });

  it('lists unclaimed invariants in the portrait and flags the Chern-trivial anomalous phase', () => {
    const { entries } = judgeSheet(twoBandSheet(), [winding(0, 1)], DEFAULT_POLICY);
    expect(entries.filter((e) => e.quantity === 'winding').map((e) => [e.id, e.value, e.claimed])).toEqual([
      ['gap-0/winding', 1, true],
      ['gap-1/winding', 1, false],
    ]);
    expect(classifySheet(entries)).toMatchObject({ classification: 'chern-trivial-anomalous', reason: expect.stringContaining('(W_0 = 1, W_π = 1)') });
    const chernPhase = judgeSheet(twoBandSheet({ c: [-1, 1], w: [1, 0] }), [], DEFAULT_POLICY).entries;
    expect(classifySheet(chernPhase)).toMatchObject({ classification: 'not-anomalous', reason: 'winding W at ε = π/T is 0' });
    const nearCritical = judgeSheet(twoBandSheet({ gap0: 0 }), [], DEFAULT_POLICY).entries;
    expect(classifySheet(nearCritical).classification).toBe('undetermined');
  });
});

describe('claims at a quasienergy that no open gap contains', () => {
  it('name the band group the label lies in, with its range, and the open gaps', () => {
    // Band 0 spans 0.4 … 0.6 π/T (width 0.2 around 0.5): ε = 0.45 π/T lies inside it.
    const p = twoBandSheet();
    p.gaps = p.gaps.map((g) => ({ ...g, lower: g.label === 0 ? -0.4 : 0.6, upper: g.label === 0 ? 0.4 : -0.6 }));
    const { verdicts } = judgeSheet(p, [winding(0.45, 1), edge(0.45, 'low', 1)], DEFAULT_POLICY);
    for (const v of verdicts) {
      expect(v.outcome).toBe('unsettled');
      expect(v.message).toContain('no open gap contains ε = 0.45 π/T; it lies in band group 0 (quasienergies 0.400 to 0.600 π/T); open gaps: ε = 0, ε = π/T');
      expect(v.message).not.toMatch(/not computed by the engine/);
      expect(v.hint).toMatch(/^name the gap by a quasienergy inside one of the open gaps/);
    }
  });
});

describe('edge counts at two ribbon widths', () => {
  const counts = (n: number) => [{ gap: 0, edge: 'low' as const, count: n }, { gap: 0, edge: 'high' as const, count: -n }];

  it('are confirmed only when the wider ribbon gives the same count, with both widths in the certificate', () => {
    const v = judgeSheet(twoBandSheet(), [edge(0, 'low', 1)], DEFAULT_POLICY).verdicts[0];
    expect(v).toMatchObject({ outcome: 'confirmed', computed: 1 });
    expect(v.certificate.refinement).toEqual([{ grid: [40, 4], value: 1 }, { grid: [60, 4], value: 1 }]);
  });

  it('are unsettled when the count changes with the width, or when no second width was computed', () => {
    const p = twoBandSheet();
    p.checkRibbons = [ribbon(60, counts(2))];
    const changed = judgeSheet(p, [edge(0, 'low', 1)], DEFAULT_POLICY).verdicts[0];
    expect(changed.outcome).toBe('unsettled');
    expect(changed.message).toMatch(/the count changed with the ribbon width: 1 at 40, 2 at 60/);
    expect(changed.hint).toMatch(/^raise numerics\.ribbon\.width well beyond the decay length/);
    delete p.checkRibbons;
    const single = judgeSheet(p, [edge(0, 'low', 1)], DEFAULT_POLICY).verdicts[0];
    expect(single.outcome).toBe('unsettled');
    expect(single.message).toMatch(/computed at a single ribbon width \(40\)/);
  });

  it('carry the reason when the wider ribbon leaves the count unsettled', () => {
    const p = twoBandSheet();
    const wide = ribbon(60, counts(1));
    wide.counts[0] = { ...wide.counts[0], settled: false, count: null, reason: 'a crossing state is not localised' };
    p.checkRibbons = [wide];
    const v = judgeSheet(p, [edge(0, 'low', 1)], DEFAULT_POLICY).verdicts[0];
    expect(v.message).toMatch(/at ribbon width 60 the count is unsettled \(a crossing state is not localised; to settle, raise numerics\.ribbon\.width/);
  });
});

describe('invariants that contradict each other', () => {
  it('turn every settled verdict unsettled and name the failed relation', () => {
    // W(π) − W(0) must equal the Chern number of the band between (Rudner et al. 2013); here 1 − 1 ≠ 1.
    const { verdicts, entries } = judgeSheet(twoBandSheet({ c: [1, -1], w: [1, 1] }), [winding(0, 1)], DEFAULT_POLICY);
    expect(verdicts[0].outcome).toBe('confirmed');
    distrustOnInconsistency(verdicts, entries, [
      { name: 'winding-step:band-0', holds: false, detail: 'W(1) − W(0) = 0, C = 1' },
      { name: 'chern-sum', holds: false, inconclusive: true, detail: 'an input was unsettled' },
    ]);
    expect(verdicts[0].outcome).toBe('unsettled');
    expect(verdicts[0].message).toMatch(/cannot be trusted: computed invariants contradict each other \(winding-step:band-0: W\(1\) − W\(0\) = 0, C = 1\)/);
    expect(verdicts[0].message).not.toMatch(/chern-sum/);
    expect(entries.every((e) => !e.settled)).toBe(true);
  });
});
