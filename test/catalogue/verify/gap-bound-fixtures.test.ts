/**
 * Small gaps judged on their certified lower bound (test/fixtures/gap-bounds),
 * through the real engines. Expected values come from published results and
 * derivations, not from our own output:
 *  - Circularly driven honeycomb lattice, t = 1, A₀ = 0.5, ω = 8 (above the bandwidth
 *    6t; Oka & Aoki, PRB 79, 081406(R) (2009); Kitagawa, Oka, Brataas, Fu, Demler,
 *    PRB 84, 235108 (2011), from memory): the first-order high-frequency Hamiltonian
 *    opens a gap 9t²A₀²/(2ω) at K and K′, with neglected terms of at most
 *    2·(81/64)t²A₀⁴/ω + 4b⁴/ω³ (derived in test/numerics/sheet/published-2d-driven.test.ts,
 *    b = 3tJ₁(A₀) ≤ 3tA₀/2); in units of π/T multiply by T/π = 2/ω. The lower band
 *    has C = −½Σ_v χ_v sign M_v = +1 for helicity +1 (same file), the gap at π/T
 *    lies above the top of the high-frequency spectrum (W = 0 there, as for a static
 *    spectrum: docs/conventions.md), and W(0) − W(π) = C of the band between
 *    (Rudner, Lindner, Berg, Levin, PRX 3, 031005 (2013)), so W(0) = +1.
 *  - Qi–Wu–Zhang model (Qi, Wu, Zhang, PRB 74, 085308 (2006), from memory): the lower
 *    band has C = +1 for 0 < m < 2 and 0 for m > 2; at T = 0.5 the gap at 0 is
 *    2|m − 2|T/π units π/T near m = 2, so m = 2 ∓ 3·10⁻⁴π gives 3·10⁻⁴ π/T on either
 *    side of the transition; W(0) = C(lower band), W(π) = 0 (static drive, docs/conventions.md).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { verifyCatalogue, type CatalogueReport } from '../../../src/catalogue/verify/catalogue.ts';
import { recordLookup } from './record-lookup.ts';
import { reportProblems } from '../../../src/catalogue/records/report-validation.ts';
import { canonicalJson } from '../../../src/catalogue/records/canonical-json.ts';

let report: CatalogueReport;
const { record, verdict } = recordLookup(() => report);

beforeAll(async () => {
  report = await verifyCatalogue(['test/fixtures/gap-bounds'], { workers: 0, cache: false });
}, 600_000);

describe('a well-resolved small gap on the default grid (circularly driven honeycomb, gap ≈ 0.032 π/T at K)', () => {
  it('is open on its certified bound although the former grid rule (½ · band velocity · spacing) refused it', () => {
    const r = record('circular-honeycomb-k-gap');
    const gap0 = r.analysis!.gaps.find((g) => g.label === 0)!;
    const t = 1, a0 = 0.5, omega = 8, toUnits = 2 / omega;
    const leading = ((9 * t * t * a0 * a0) / (2 * omega)) * toUnits;
    const b = 1.5 * t * a0;
    const neglected = ((2 * 81 * t * t * a0 ** 4) / (64 * omega) + (4 * b ** 4) / omega ** 3) * toUnits;
    expect(Math.abs(gap0.minimalGap - leading)).toBeLessThanOrEqual(neglected);
    // The former rule: max(1e-3, ½ · π · (widest adjacent band) / 24) on the default 24 × 24 grid.
    const widest = Math.max(...r.analysis!.bands.map((band) => (band.range[1] - band.range[0] + 2) % 2));
    expect(gap0.minimalGap).toBeLessThan((0.5 * Math.PI * widest) / 24);
    expect(r.analysis!.grid).toEqual([24, 24]);
    expect(gap0.lowerBound).toBeGreaterThan(gap0.tolerance);
    expect(gap0.lowerBound).toBeLessThanOrEqual(gap0.minimalGap);
    expect(gap0.open).toBe(true);
  });

  it('confirms every claim: W = 1 at 0, W = 0 at π/T, C = (+1, −1) upward from π/T, the gap size', () => {
    const r = record('circular-honeycomb-k-gap');
    expect(r.claims.map((c) => [c.claim, c.outcome])).toEqual([
      ['gap-0/winding', 'confirmed'],
      ['gap-0/minimal-gap', 'confirmed'],
      ['gap-1/winding', 'confirmed'],
      ['band-0/chern', 'confirmed'],
      ['band-1/chern', 'confirmed'],
    ]);
    expect(r.status).toBe('verified');
  });

  it('writes the quadrature and the gap bound into the winding certificate, one refinement level per item', () => {
    const c = verdict('circular-honeycomb-k-gap', 'gap-0/winding').certificate;
    expect(c.residual!).toBeLessThanOrEqual(1e-6);
    expect(c.residualTolerance).toBe(1e-6);
    expect(c.notes.join(' ')).toMatch(/adaptive Gauss–Kronrod quadrature: \d+ evaluations on \d+ cells \(first mesh \d+\), error estimate [0-9.×⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+, raw value 1\.0000000/);
    const last = c.refinement.at(-1)!, previous = c.refinement.at(-2)!;
    expect(previous.label).toMatch(/^7-point Gauss on the final \d+ cells$/);
    expect(last.label).toMatch(/^15-point Kronrod on the final \d+ cells \(\d+ evaluations\)$/);
    expect(c.gaps[0]).toMatchObject({ gap: 0, bound: 'above', open: true });
  });

  it('contradicts a wrong sign and a value taken from the other gap, never confirming them', () => {
    expect(verdict('circular-honeycomb-k-gap-wrong', 'gap-0/winding')).toMatchObject({ outcome: 'contradicted', claimed: -1, computed: 1 });
    expect(verdict('circular-honeycomb-k-gap-wrong', 'gap-0/winding').hint).toMatch(/^sign differs/);
    expect(verdict('circular-honeycomb-k-gap-wrong', 'gap-1/winding')).toMatchObject({ outcome: 'contradicted', claimed: 1, computed: 0, hint: 'this value belongs to the gap at ε = 0' });
    expect(record('circular-honeycomb-k-gap-wrong').status).toBe('disputed');
  });
});

describe('gaps near the lower floor (Qi–Wu–Zhang, gap 3·10⁻⁴ π/T, tolerance lowered to 10⁻⁴)', () => {
  it('settles W on the topological side and confirms the correct claims', () => {
    const r = record('qwz-floor-topological');
    const gap0 = r.analysis!.gaps.find((g) => g.label === 0)!;
    expect(Math.abs(gap0.minimalGap - 3e-4)).toBeLessThanOrEqual(1e-9);
    expect(gap0.tolerance).toBe(1e-4);
    expect(gap0.lowerBound).toBeGreaterThan(1e-4);
    expect(r.claims.every((c) => c.outcome === 'confirmed')).toBe(true);
    // The loosened tolerance is stated in every certificate.
    expect(verdict('qwz-floor-topological', 'gap-0/winding').certificate.notes.join(' ')).toMatch(/loosens numerics\.tolerances\.gap to 1×10⁻⁴ π\/T/);
  });

  it('contradicts a flipped sign and a value of the other gap', () => {
    expect(verdict('qwz-floor-wrong', 'gap-0/winding')).toMatchObject({ outcome: 'contradicted', claimed: -1, computed: 1 });
    expect(verdict('qwz-floor-wrong', 'gap-1/winding')).toMatchObject({ outcome: 'contradicted', claimed: 1, computed: 0 });
  });

  it('contradicts, on the trivial side of the transition, the winding number of the other side', () => {
    expect(verdict('qwz-floor-trivial-side', 'gap-0/winding')).toMatchObject({ outcome: 'contradicted', claimed: 1, computed: 0 });
    expect(verdict('qwz-floor-trivial-side', 'gap-1/winding')).toMatchObject({ outcome: 'confirmed', computed: 0 });
  });

  it('leaves the claim unsettled at the default tolerance and names the transition', () => {
    const v = verdict('qwz-floor-default-tolerance', 'gap-0/winding');
    expect(v.outcome).toBe('unsettled');
    expect(v.message).toMatch(/the gap at ε = 0 is 3×10⁻⁴ π\/T at s = \(0\.500, 0\.500\), not above the tolerance 0\.001 π\/T: it is small against the bandwidth, so the model sits at or near a phase transition/);
    expect(v.hint).toMatch(/phase transition/);
  });
});

describe('records', () => {
  it('validate against schemas/report.schema.json', () => {
    for (const r of report.records) expect(reportProblems(JSON.parse(canonicalJson(r))), r.id).toEqual([]);
  });
});
