import { describe, expect, it } from 'vitest';
import { run as inspect } from '../../../src/cli/commands/inspect.ts';
import { inspectModel, ModelNotFoundError } from '../../../src/catalogue/verify/inspect.ts';

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  return { io: { stdout: { write: (t: string) => out.push(t) }, stderr: { write: (t: string) => err.push(t) } }, out, err };
}

describe('inspecting one model', () => {
  it('prints gaps, verdicts with hints and evidence, and the unclaimed portrait', async () => {
    const c = capture();
    const code = await inspect(['test/fixtures/verification/two-step-chain-wrong-frame.json', '--no-cache'], c.io);
    const text = c.out.join('');
    expect(code).toBe(1);
    expect(text).toMatch(/^two-step-chain-wrong-frame — Two-step chain with frame windings claimed as gap invariants\n/);
    // Gap at 0 of the two-step chain: 2|θ₁ − θ₂|/π = 0.6 π/T (θ₁ = 0.4π, θ₂ = 0.7π), printed to 4 digits.
    expect(text).toMatch(/\n {2}0 {4}-0\.300 … 0\.300 {2}0\.6000 /);
    expect(text).toContain('  ν_0, the winding at ε = 0 [gap-0/invariant]: contradicted (claimed 2, computed 1)\n');
    expect(text).toContain('    hint: matches ν″ of the other symmetric frame');
    expect(text).toMatch(/evidence: grid 32; \|x − round x\| [0-9.×⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+ \(tol 1×10⁻⁶\)/);
    // The refinement history, one level per line.
    expect(text).toMatch(/\n {4}refinement:\n {6}\(ν′ \+ ν″\)\/2 from frames on 32 and 32 momenta → 1\.0000000\n {6}ν′: 32 momenta, uniform → [0-9.×⁻⁰¹²³⁴⁵⁶⁷⁸⁹−]+\n/);
    expect(text).toContain('Computed but not claimed\n  end modes per end at ε = 0: 1\n');
  });

  it('explains an unknown model and a misused option', async () => {
    const c = capture();
    expect(await inspect(['no-such-model'], c.io)).toBe(2);
    expect(c.err.join('')).toBe('strobe inspect: no model "no-such-model": neither a file nor models/no-such-model.json (model files live in models/; give a path for others)\n');
    const d = capture();
    expect(await inspect(['x', '--fast'], d.io)).toBe(2);
    expect(d.err.join('')).toMatch(/^strobe inspect: unknown option --fast\n/);
    await expect(inspectModel('no-such-model')).rejects.toThrow(ModelNotFoundError);
  });
});
