/**
 * Symmetry classes and the declared symmetries of sheets as claims, through the
 * real engines, on copies of the Qi–Wu–Zhang fixture and of the demo chain.
 *
 * Expected values (derived here): the Qi–Wu–Zhang Hamiltonian H(k) = sin k_x σ_x +
 * sin k_y σ_y + d_z(k) σ_z with d_z even in k has σ_x H(k)* σ_x = sin k_x σ_x +
 * sin k_y σ_y − d_z σ_z = −H(−k): particle–hole symmetry C = σ_x K with C² = +1
 * (class D; Qi, Wu, Zhang, PRB 74, 085308 (2006)); it breaks T = K, since
 * H(k)* − H(−k) = 2 sin k_x σ_x. The two-step chain with Γ = σ_z only declares S:
 * class AIII, not the BDI it would be with T = K declared (Altland–Zirnbauer table,
 * test/numerics/symmetry/altland-zirnbauer.test.ts).
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { verifyCatalogue, type CatalogueReport } from '../../../src/catalogue/verify/catalogue.ts';
import { recordLookup } from './record-lookup.ts';
import { writeVariant } from './model-variants.ts';

let report: CatalogueReport;
const { verdict } = recordLookup(() => report);

beforeAll(async () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'strobe-classes-'));
  const qwz = 'test/fixtures/verification/qwz-correct.json';
  const sigmaX = [[0, 1], [1, 0]];
  writeVariant(dir, qwz, 'qwz-class-d', (d) => (d.claims = { symmetryClass: 'D', symmetries: { particleHole: { unitary: sigmaX } } }));
  writeVariant(dir, qwz, 'qwz-class-d-undeclared', (d) => (d.claims = { symmetryClass: 'D' }));
  writeVariant(dir, qwz, 'qwz-time-reversal', (d) => (d.claims = { symmetryClass: 'BDI', symmetries: { particleHole: { unitary: sigmaX }, timeReversal: { unitary: [[1, 0], [0, 1]] } } }));
  writeVariant(dir, 'models/two-step-chain.json', 'chain-bdi-without-t', (d) => {
    delete d.claims.symmetries.timeReversal;
    d.claims = { symmetryClass: d.claims.symmetryClass, symmetries: d.claims.symmetries };
  });
  report = await verifyCatalogue([dir], { workers: 0, cache: false });
}, 300_000);

describe('symmetry classes', () => {
  it('confirms class D for the Qi–Wu–Zhang sheet with C = σ_x K declared, and the operator by its residuals', () => {
    const cls = verdict('qwz-class-d', 'symmetry-class');
    expect(cls).toMatchObject({ outcome: 'confirmed', claimed: 'D', computed: 'D' });
    expect(cls.message).toMatch(/^The declared operators \(no T, C² = \+1, no S\) are those of class D, and each holds on the drive\./);
    const c = verdict('qwz-class-d', 'symmetry/particle-hole');
    expect(c.outcome).toBe('confirmed');
    for (const s of c.certificate.symmetry) expect(s.residual).toBeLessThanOrEqual(1e-12);
  });

  it('contradicts a class whose operators are not declared, naming the class they do define', () => {
    expect(verdict('qwz-class-d-undeclared', 'symmetry-class')).toMatchObject({ outcome: 'contradicted', claimed: 'D', computed: 'A' });
    const chain = verdict('chain-bdi-without-t', 'symmetry-class');
    expect(chain).toMatchObject({ outcome: 'contradicted', claimed: 'BDI', computed: 'AIII' });
    expect(chain.message).toMatch(/define class AIII, but the file claims class BDI \(T² = \+1, C² = \+1, S\)/);
  });

  it('contradicts a declared time reversal the sheet breaks, with its residual, and the class resting on it', () => {
    const t = verdict('qwz-time-reversal', 'symmetry/time-reversal');
    expect(t.outcome).toBe('contradicted');
    expect(t.message).toMatch(/^The time-reversal symmetry U_T K does not hold, symmetry broken: ‖U_T H\(k, t₀\+s\)\* U_T† − H\(−k, t₀−s\)‖ = [0-9.]+ > tolerance 1×10⁻⁸/);
    const cls = verdict('qwz-time-reversal', 'symmetry-class');
    // T = K and C = σ_x K imply S = σ_x with T² = C² = +1: the form of BDI, but T does not hold.
    expect(cls).toMatchObject({ outcome: 'contradicted', claimed: 'BDI', computed: null });
    expect(cls.message).toMatch(/have the form class BDI requires, but the drive breaks one of them/);
  });
});
