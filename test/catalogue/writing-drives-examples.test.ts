/**
 * The minimal files of docs/writing-drives.md (one per kind of drive) must load
 * without a single diagnostic and verify. Expected numbers are derived here, not
 * taken from the engine:
 *  - Step (two-step chain, θᵢ = JᵢT/2): U(k=0) = e^{−i(θ₁+θ₂)σx}, U(k=π) = e^{−i(θ₁−θ₂)σx}, so
 *    the gap at 0 is 2|θ₁ − θ₂|/π and the gap at π is 2|1 − (θ₁ + θ₂)/π| (units π/T);
 *    ν₀ = [θ₂ > θ₁], ν_π = [θ₁ + θ₂ > π] for 0 < θ < π (Asbóth & Obuse, PRB 88, 121406(R) (2013)).
 *  - Kick at t = 0 with J₁ on all period: from t₀ = T/2 the Floquet operator is
 *    e^{−iJ₁Tσx/2} e^{−iκh(k)} e^{−iJ₁Tσx/2}, the two-step chain with θ₁ = J₁T, θ₂ = κ seen
 *    from the middle of its first step; the gaps are those of the two-step chain.
 *  - Harmonic: a single cosine harmonic has H₁ = H₋₁, so [H₁, H₋₁] = 0 and
 *    H_eff = H̄ + O(ω⁻²), the dimer chain with gap 2|w − v| in energy, 2|w − v|T/π in π/T.
 *  - Light: first-order high-frequency mass m = 9J₁(A₀/√3)²/ω at the Dirac points
 *    (derived in models/graphene-circular-light-high-frequency.json), gap 2|m|·T/π.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkModelSource } from '../../src/catalogue/load.ts';
import { verifyCatalogue, type CatalogueReport } from '../../src/catalogue/verify/catalogue.ts';

const page = readFileSync('docs/writing-drives.md', 'utf8');
const examples = [...page.matchAll(/```json\n([\s\S]*?)```/g)].map((m) => m[1]);
const idOf = (text: string): string => JSON.parse(text).id;

/** J₁(x), Bessel function of the first kind, from its power series (common practice; converges fast for x < 2). */
function besselJ1(x: number): number {
  let term = x / 2, sum = term;
  for (let k = 1; k < 30; k++) {
    term *= -(x * x) / (4 * k * (k + 1));
    sum += term;
  }
  return sum;
}

let dir: string;
let report: CatalogueReport;
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'strobe-writing-drives-'));
  for (const text of examples) writeFileSync(join(dir, `${idOf(text)}.json`), text);
  report = await verifyCatalogue([dir], { workers: 0, cache: false });
}, 300_000);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const record = (id: string) => {
  const r = report.records.find((x) => x.id === id);
  if (!r) throw new Error(`no record for ${id}`);
  return r;
};
const gapWidth = (id: string, label: number) => record(id).analysis!.gaps.find((g) => g.label === label)!.minimalGap;

describe('docs/writing-drives.md', () => {
  it('has one minimal file for each kind of drive', () => {
    expect(examples.map(idOf)).toEqual(['step-drive-example', 'kick-drive-example', 'harmonic-drive-example', 'light-drive-example']);
  });

  it.each(examples.map((text) => [idOf(text), text]))('%s loads without any diagnostic', (id, text) => {
    const { model, diagnostics } = checkModelSource(`${id}.json`, text);
    expect(diagnostics).toEqual([]);
    expect(model?.id).toBe(id);
  });

  it('every minimal file verifies: all claims confirmed', () => {
    for (const r of report.records) expect([r.id, r.status, r.statusReason]).toEqual([r.id, 'verified', r.statusReason]);
    expect(report.records).toHaveLength(4);
  });

  it('step drive: gaps 2|θ₁ − θ₂|/π at 0 and 2|1 − (θ₁ + θ₂)/π| at π (θ₁ = 0.2π, θ₂ = 0.7π)', () => {
    expect(Math.abs(gapWidth('step-drive-example', 0) - 1.0)).toBeLessThan(1e-9);
    expect(Math.abs(gapWidth('step-drive-example', 1) - 0.2)).toBeLessThan(1e-9);
  });

  it('kick: the frame through the kick comes first, so ν_π = +1 from ν′ = 1, ν″ = −1 (θ₁ = 0.75π, κ = 0.45π)', () => {
    const frames = record('kick-drive-example').portrait.filter((e) => e.quantity === 'frame-winding').map((e) => e.value);
    expect(frames).toEqual([1, -1]);
    // Same gaps as the two-step chain: 2|0.75 − 0.45| = 0.6 at 0, 2|1 − 1.2| = 0.4 at π.
    expect(Math.abs(gapWidth('kick-drive-example', 0) - 0.6)).toBeLessThan(1e-9);
    expect(Math.abs(gapWidth('kick-drive-example', 1) - 0.4)).toBeLessThan(1e-9);
  });

  it('harmonic: the gap at 0 is that of the averaged chain, 2|w − v|T/π = 0.2, up to O(ω⁻²)', () => {
    // (|w − v|·T)²-sized corrections: ω = 10, |H| ≲ 3, so the relative error is of order (3/10)² ≈ 0.1 at most.
    expect(Math.abs(gapWidth('harmonic-drive-example', 0) - 0.2)).toBeLessThan(0.02);
  });

  it('light: the gap at the Dirac points matches the first-order Haldane mass within 10 %', () => {
    const omega = 8, T = (2 * Math.PI) / omega;
    const mass = (9 * besselJ1(1.5 / Math.sqrt(3)) ** 2) / omega;
    const expected = (2 * mass * T) / Math.PI;
    expect(Math.abs(gapWidth('light-drive-example', 0) - expected)).toBeLessThan(0.1 * expected);
  });
});
