/**
 * The declared order of the symmetric frames, and invariants on phase
 * boundaries, through the real engines on copies of the demo two-step chain
 * (models/two-step-chain.json, θ₁ = 0.35π, θ₂ = 0.85π, Γ = σ_z, frames T/4 and 3T/4).
 *
 * Expected values (derived in test/numerics/chain/half-period-winding.test.ts and
 * docs/conventions.md): ν₀ = [θ₂ > θ₁] = 1 whatever the frame order; ν_π =
 * (ν′ − ν″)/2 = −[θ₁ + θ₂ > π] = −1 with the frame T/4 first, +1 with 3T/4 first
 * (swapping the frames swaps ν′ and ν″; Asbóth, Tarasinski, Delplace, PRB 90,
 * 125143 (2014)). On θ₁ + θ₂ = π the gap at π/T closes at k = 0 (U(0) = e^{−i(θ₁+θ₂)σ_x} = −1)
 * while the gap at 0 stays open, so ν₀ is still defined (half-period method).
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { verifyCatalogue, type CatalogueReport } from '../../../src/catalogue/verify/catalogue.ts';
import { recordLookup } from './record-lookup.ts';
import { writeVariant } from './model-variants.ts';

let report: CatalogueReport;
const { record, verdict } = recordLookup(() => report);

/** A copy of the demo chain with another id, without its sweep, changed by `edit`. */
const variant = (dir: string, id: string, edit: (doc: Record<string, any>) => void) => writeVariant(dir, 'models/two-step-chain.json', id, edit);

beforeAll(async () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'strobe-frames-'));
  variant(dir, 'demo-reversed-times', (d) => (d.claims.symmetries.chiral.symmetricTimes = ['3*T/4', 'T/4']));
  variant(dir, 'demo-reversed-times-flipped-claim', (d) => {
    d.claims.symmetries.chiral.symmetricTimes = ['3*T/4', 'T/4'];
    d.claims.gaps[1].invariant = 1;
  });
  variant(dir, 'demo-no-times', (d) => delete d.claims.symmetries.chiral.symmetricTimes);
  variant(dir, 'demo-on-pi-boundary', (d) => {
    d.parameters.theta2 = { value: '0.65*pi', description: 'theta1 + theta2 = pi: the gap at pi/T closes' };
    d.claims = { symmetries: d.claims.symmetries, gaps: [{ quasienergy: 0, invariant: 1 }, { quasienergy: 1, invariant: -1 }] };
  });
  report = await verifyCatalogue([dir], { workers: 0, cache: false });
}, 300_000);

describe('the declared frame order', () => {
  it('is honoured: with 3T/4 listed first the demo chain has ν_π = +1, so its claim −1 is contradicted and the hint names the frame order', () => {
    const v = verdict('demo-reversed-times', 'gap-1/invariant');
    expect(v).toMatchObject({ outcome: 'contradicted', claimed: -1, computed: 1 });
    expect(v.hint).toMatch(/^sign differs: ν_π = \(ν′ − ν″\)\/2 changes sign when the two symmetric frames are swapped, and the first time in claims\.symmetries\.chiral\.symmetricTimes defines ν′ \(here t₀ = 0\.75, the first time listed\)/);
    expect(verdict('demo-reversed-times', 'gap-0/invariant')).toMatchObject({ outcome: 'confirmed', computed: 1 });
    expect(v.certificate.notes).toContain('frames as declared: ν′ in t₀ = 0.75 (the first time in symmetricTimes), ν″ in t₀ + T/2 = 0.25');
  });

  it('confirms the flipped claim in the reversed order', () => {
    expect(verdict('demo-reversed-times-flipped-claim', 'gap-1/invariant')).toMatchObject({ outcome: 'confirmed', computed: 1 });
  });

  it('states the frames the engine found when none is declared', () => {
    const v = verdict('demo-no-times', 'gap-1/invariant');
    expect(v).toMatchObject({ outcome: 'confirmed', computed: -1 });
    expect(v.certificate.notes).toContain('no symmetricTimes declared: the engine found the frames t₀ = 0.25 (ν′, the earlier) and 0.75 (ν″)');
  });
});

describe('one gap open', () => {
  it('settles ν₀ on the line θ₁ + θ₂ = π by the half-period method, and leaves ν_π unsettled', () => {
    const r = record('demo-on-pi-boundary');
    const nu0 = verdict('demo-on-pi-boundary', 'gap-0/invariant');
    expect(nu0).toMatchObject({ outcome: 'confirmed', computed: 1 });
    expect(nu0.certificate.notes.join(' ')).toMatch(/computed as ν₀ from the half-period evolution F = U\(t₀ \+ T\/2, t₀\), t₀ = 0\.25/);
    expect(verdict('demo-on-pi-boundary', 'gap-1/invariant').outcome).toBe('unsettled');
    expect(r.analysis!.gaps.find((g) => g.label === 1)!.open).toBe(false);
  });
});
