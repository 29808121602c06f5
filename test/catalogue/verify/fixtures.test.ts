/**
 * Purpose-built model files (test/fixtures/verification) run through the real
 * engines. Expected values come from published results and derivations in this
 * file, not from our own output:
 *  - Qi–Wu–Zhang model (Qi, Wu, Zhang, PRB 74, 085308 (2006)), from memory:
 *    |C| = 1 for 0 < |m| < 2 and 0 for |m| > 2; with a₁ = x̂, a₂ = ŷ the lower band at
 *    m = 1 has C = +1 in our convention (docs/conventions.md). Its gap at 0 is
 *    2·min|d(k)| = 2·||m| − 2| near m = 2 in energy, i.e. 2·||m| − 2|·T/π in units π/T.
 *  - A static spectrum has no chiral mode in the gap above its top (Rudner et al., PRX 3,
 *    031005 (2013)): the edge count in the gap at π/T is 0.
 *  - Two-step chain: U(k) = e^{−iθ₂(cos k σx + sin k σy)} e^{−iθ₁σx}. At k = π, U = e^{−i(θ₁−θ₂)σx}
 *    and at k = 0, U = e^{−i(θ₁+θ₂)σx} (derived here), so the gap at 0 is 2|θ₁ − θ₂|/π and the
 *    gap at π is 2·|1 − (θ₁ + θ₂)/π| near θ₁ + θ₂ = π (units π/T). ν₀ = (ν′ + ν″)/2,
 *    ν_π = (ν′ − ν″)/2 (Asbóth & Obuse, PRB 88, 121406(R) (2013)); for θ₂ > θ₁ with
 *    θ₁ + θ₂ > π both |ν₀| and |ν_π| are 1 (from memory, same paper's phase diagram).
 *  - Two-step chain with an onsite energy ε on orbital a in the first step, Γ = diag(1, −1):
 *    the hoppings anticommute with Γ and the onsite term commutes, so in the frame t₀ = T/4
 *    ΓH(t₀+s)Γ† + H(t₀−s) = 2ε|a⟩⟨a| while both times lie in the first step, and 0 while both
 *    lie in the second (derived here). The engine's residual is max‖…‖_F / max(1, max‖H‖_F)
 *    (src/numerics/symmetry/reflection-residual.ts), the largest ‖H‖_F being the intercell step's
 *    √2·J₂: residual = 2ε / (√2·J₂) with J₂ = 2θ₂/T.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { verifyCatalogue, type CatalogueReport } from '../../../src/catalogue/verify/catalogue.ts';
import { reportProblems } from '../../../src/catalogue/records/report-validation.ts';
import { canonicalJson } from '../../../src/catalogue/records/canonical-json.ts';
import { recordLookup } from './record-lookup.ts';
import { formatNumber } from '../../../src/catalogue/verify/format.ts';

let report: CatalogueReport;
const { record, verdict } = recordLookup(() => report);

beforeAll(async () => {
  report = await verifyCatalogue(['test/fixtures/verification'], { workers: 0, cache: false });
});

describe('verification of purpose-built models', () => {
  it('confirms correct claims (Qi–Wu–Zhang at m = 1)', () => {
    const r = record('qwz-correct');
    expect(r.status).toBe('verified');
    expect(verdict('qwz-correct', 'band-0/chern')).toMatchObject({ outcome: 'confirmed', computed: 1 });
    expect(verdict('qwz-correct', 'band-1/chern')).toMatchObject({ outcome: 'confirmed', computed: -1 });
    expect(verdict('qwz-correct', 'gap-1/edge-1-low')).toMatchObject({ outcome: 'confirmed', computed: 0 });
    expect(verdict('qwz-correct', 'anomalous')).toMatchObject({ outcome: 'confirmed', computed: false });
    // Gap at 0: 2·min|d| = 2 at m = 1, T = 0.5 → 2·0.5/π π/T; the engine refines the minimum, tolerance 1e-6.
    const gap0 = r.analysis!.gaps.find((g) => g.label === 0)!;
    expect(Math.abs(gap0.minimalGap - 1 / Math.PI)).toBeLessThan(1e-6);
    // Band path for plots: at Γ, E = ±|d(0)| = ±(m + 2) = ±3, so ε = ±3T/π = ±1.5/π π/T (rounded to 1e-5 in records).
    const path = r.analysis!.bandPath!;
    expect(path.corners.map((c) => c.label)).toEqual(['Γ', 'X', 'M', 'Γ']);
    expect(path.momenta[path.corners[2].index]).toEqual([0.5, 0.5]);
    expect(Math.abs(path.quasienergies[0][0] + 1.5 / Math.PI)).toBeLessThanOrEqual(5e-6);
    expect(Math.abs(path.quasienergies[0][1] - 1.5 / Math.PI)).toBeLessThanOrEqual(5e-6);
    const cert = verdict('qwz-correct', 'band-0/chern').certificate;
    expect(cert.residual!).toBeLessThanOrEqual(cert.residualTolerance!);
    expect(cert.refinement.length).toBeGreaterThanOrEqual(2);
  });

  it('contradicts flipped signs and names the orientation as the likely cause', () => {
    expect(record('qwz-sign-error').status).toBe('disputed');
    const v = verdict('qwz-sign-error', 'band-0/chern');
    expect(v).toMatchObject({ outcome: 'contradicted', claimed: -1, computed: 1 });
    expect(v.hint).toMatch(/^sign differs: C and W are reported in the Cartesian orientation/);
  });

  it('recognises a claim made for the wrong gap', () => {
    const v = verdict('qwz-wrong-gap', 'gap-1/edge-1-low');
    expect(v).toMatchObject({ outcome: 'contradicted', claimed: 1, computed: 0, hint: 'this value belongs to the gap at ε = 0' });
  });

  it('leaves claims on a closed gap unsettled (m = 2)', () => {
    const r = record('qwz-closed-gap');
    expect(r.status).toBe('unsettled');
    expect(r.claims.every((c) => c.outcome === 'unsettled')).toBe(true);
    expect(r.analysis!.gaps.some((g) => g.label === 0 && g.open)).toBe(false);
  });

  it('settles a near-critical model on the certified bound of its gap (m = 2.03: gap below band velocity × grid spacing)', () => {
    const r = record('qwz-near-critical');
    const gap0 = r.analysis!.gaps.find((g) => g.label === 0)!;
    // 2·|m − 2|·T/π = 2·0.03·0.5/π ≈ 0.00955 π/T, relative tolerance 1e-6.
    expect(Math.abs(gap0.minimalGap - (2 * 0.03 * 0.5) / Math.PI)).toBeLessThan(1e-6 * gap0.minimalGap);
    // Band velocity × grid spacing (½·π·width/24 with bands about 2.2 π/T·0.5 wide) would have refused it; the bound does not.
    expect(gap0.lowerBound).toBeGreaterThan(gap0.tolerance);
    expect(gap0.lowerBound).toBeLessThanOrEqual(gap0.minimalGap);
    expect(gap0.open).toBe(true);
    // |m| > 2: both bands trivial (Qi, Wu, Zhang, PRB 74, 085308 (2006)), as claimed.
    expect(r.claims.map((c) => c.outcome)).toEqual(['confirmed', 'confirmed']);
    expect(r.status).toBe('verified');
  });

  it('confirms the two-step chain and flags it anomalous (modes at π/T)', () => {
    const r = record('two-step-chain-correct');
    expect(r.status).toBe('verified');
    const gaps = Object.fromEntries(r.analysis!.gaps.map((g) => [g.label, g.minimalGap]));
    // θ₁ = 0.4π, θ₂ = 0.7π: gap at 0 = 2·|0.4 − 0.7| = 0.6; eigenphases ±1.1π at k = 0 fold to ∓0.9π, so the gap at π is 2·0.1 = 0.2 (units π/T); tolerance 1e-9.
    expect(Math.abs(gaps[0] - 0.6)).toBeLessThan(1e-9);
    expect(Math.abs(gaps[1] - 0.2)).toBeLessThan(1e-9);
    expect(r.anomalous.classification).toBe('anomalous');
    const frames = r.portrait.filter((e) => e.quantity === 'frame-winding').map((e) => e.value as number);
    const nu0 = r.portrait.find((e) => e.id === 'gap-0/invariant')!.value as number;
    const nuPi = r.portrait.find((e) => e.id === 'gap-1/invariant')!.value as number;
    expect(frames).toHaveLength(2);
    expect(nu0).toBe((frames[0] + frames[1]) / 2);
    expect(nuPi).toBe((frames[0] - frames[1]) / 2);
    expect([Math.abs(nu0), Math.abs(nuPi)]).toEqual([1, 1]);
  });

  it('confirms the declared chiral operator of the two-step chain by its residuals', () => {
    const v = verdict('two-step-chain-correct', 'symmetry/chiral');
    expect(v).toMatchObject({ kind: 'symmetry', pointer: '/claims/symmetries/chiral/operator', outcome: 'confirmed', computed: true });
    for (const s of v.certificate.symmetry) expect(s.residual).toBeLessThanOrEqual(s.tolerance);
    // Every chain certificate carries the residuals, end-mode counts included.
    // Two relations (H and U) for each declared operator, chiral and time reversal.
    expect(verdict('two-step-chain-correct', 'gap-1/end-modes').certificate.symmetry.length).toBe(4);
  });

  it('contradicts a chiral operator broken by an onsite term, and every claim resting on it, with the residual', () => {
    const r = record('two-step-chain-onsite');
    expect(r.status).toBe('disputed');
    const gamma = verdict('two-step-chain-onsite', 'symmetry/chiral');
    expect(gamma).toMatchObject({ outcome: 'contradicted', computed: false });
    const hamiltonian = gamma.certificate.symmetry.find((s) => /H\(t\)/.test(s.name))!;
    const eps = 0.5, j2 = 2 * 0.7 * Math.PI;
    const expected = (2 * eps) / (Math.SQRT2 * j2);
    expect(Math.abs(hamiltonian.residual - expected)).toBeLessThanOrEqual(1e-9 * expected);
    expect(gamma.message).toContain(`‖ΓH(t₀+s)Γ† + H(t₀−s)‖ = ${formatNumber(expected)} > tolerance`);
    for (const claim of ['gap-0/invariant', 'gap-1/invariant']) {
      const v = verdict('two-step-chain-onsite', claim);
      expect(v.outcome).toBe('contradicted');
      expect(v.message).toMatch(/is not defined, symmetry broken: ‖ΓH\(t₀\+s\)Γ† \+ H\(t₀−s\)‖ = 0\.161 > tolerance 1×10⁻⁸/);
    }
    expect(verdict('two-step-chain-onsite', 'anomalous')).toMatchObject({ outcome: 'contradicted', computed: false });
    expect(r.anomalous.reason).toMatch(/^symmetry broken/);
  });

  it('recognises frame windings claimed as gap invariants', () => {
    const r = record('two-step-chain-wrong-frame');
    const frames = r.portrait.filter((e) => e.quantity === 'frame-winding');
    const second = frames.find((e) => e.id === 'frame-second/winding')!.value;
    const first = frames.find((e) => e.id === 'frame-first/winding')!.value;
    expect(verdict('two-step-chain-wrong-frame', 'gap-0/invariant')).toMatchObject({ outcome: 'contradicted', claimed: second });
    expect(verdict('two-step-chain-wrong-frame', 'gap-0/invariant').hint).toMatch(/^matches ν″ of the other symmetric frame/);
    expect(verdict('two-step-chain-wrong-frame', 'gap-1/invariant')).toMatchObject({ outcome: 'contradicted', claimed: first });
    expect(verdict('two-step-chain-wrong-frame', 'gap-1/invariant').hint).toMatch(/^matches ν′ of the first symmetric frame/);
  });

  it('turns a bad file into an invalid record with a located diagnostic, and the rest still run', () => {
    const r = record('broken-file');
    expect(r.status).toBe('invalid');
    expect(r.diagnostics[0]).toMatchObject({ file: 'test/fixtures/verification/broken-file.json', line: 10, pointer: '/claims/gaps/0/windnig' });
    expect(report.records).toHaveLength(9);
    expect(report.summary.counts).toEqual({ verified: 3, disputed: 4, unsettled: 1, 'portrait-only': 0, invalid: 1, failed: 0 });
  });

  it('writes records and the summary that validate against schemas/report.schema.json', () => {
    for (const r of report.records) {
      const parsed = JSON.parse(canonicalJson(r));
      expect(reportProblems(parsed), r.id).toEqual([]);
    }
    expect(reportProblems(JSON.parse(canonicalJson(report.summary)))).toEqual([]);
    // The schema must be able to fail: a record without a status is rejected.
    const broken = JSON.parse(canonicalJson(report.records[0]));
    delete broken.status;
    expect(reportProblems(broken).join('\n')).toMatch(/required/);
  });
});
