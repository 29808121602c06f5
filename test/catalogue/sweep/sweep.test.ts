/**
 * Sweeps against a derivation done here: for the two-step chain
 * U(k) = e^{−iθ₂(cos k σx + sin k σy)} e^{−iθ₁σx}, U(π) = e^{−i(θ₁−θ₂)σx} and U(0) = e^{−i(θ₁+θ₂)σx},
 * so the gap at 0 is 2|θ₁ − θ₂|/π and the gap at π is 2·|1 − (θ₁ + θ₂)/π| near θ₁ + θ₂ = π (units π/T),
 * and ν₀ changes where the first closes (θ₂ = θ₁), ν_π where the second does.
 */
import { describe, expect, it } from 'vitest';
import { axisValues } from '../../../src/catalogue/sweep/sweep-grid.ts';
import { parseVary, runSweep, SweepRequestError } from '../../../src/catalogue/sweep/run-sweep.ts';
import { verifyCatalogue } from '../../../src/catalogue/verify/catalogue.ts';
import { run as sweepCommand } from '../../../src/cli/commands/sweep.ts';

const chain = 'test/fixtures/verification/two-step-chain-correct.json';
const theta1 = 0.4 * Math.PI;

describe('parameter sweeps', () => {
  it('places count points from start to stop inclusive, the last exactly at stop', () => {
    const v = axisValues({ parameter: 'x', start: 0.1, stop: 0.7, count: 4 });
    expect(v).toHaveLength(4);
    expect(v[3]).toBe(0.7);
    for (let i = 0; i < 4; i++) expect(Math.abs(v[i] - (0.1 + 0.2 * i))).toBeLessThan(1e-15);
    expect(() => axisValues({ parameter: 'x', start: 0, stop: 1, count: 1 })).toThrow(/count must be an integer ≥ 2/);
  });

  it('parses --vary and rejects malformed values with the expected form', () => {
    expect(parseVary('theta2=0.1:3:8')).toEqual({ name: 'theta2', start: 0.1, stop: 3, count: 8 });
    expect(() => parseVary('theta2=0.1:3')).toThrow('--vary expects NAME=start:stop:count such as m=-3:3:61, got "theta2=0.1:3"');
    expect(() => parseVary('m=0:1:1000')).toThrow(/count must be an integer from 2 to 401/);
  });

  it('maps gaps and invariants of the two-step chain in agreement with the derivation', async () => {
    const values = [0.2, 0.85, 1.5, 2.15, 2.8];
    const s = await runSweep(chain, [{ name: 'theta2', start: 0.2, stop: 2.8, count: 5 }], ['minimalGap', 'invariant'], { cache: false });
    expect(s.points).toHaveLength(5);
    s.points.forEach((p, i) => {
      const t2 = values[i];
      expect(Math.abs(p.parameters.theta2 - t2)).toBeLessThan(1e-12);
      // Tolerance 1e-6 π/T: the engine refines the gap minimum by golden-section search.
      expect(Math.abs((p.values['gap-0/minimal-gap'] as number) - (2 * Math.abs(theta1 - t2)) / Math.PI)).toBeLessThan(1e-6);
      const nu0 = p.values['gap-0/invariant'];
      const nuPi = p.values['gap-1/invariant'];
      expect(nu0, `ν₀ settled at θ₂ = ${t2}`).not.toBeNull();
      expect(nuPi, `ν_π settled at θ₂ = ${t2}`).not.toBeNull();
      expect(Math.abs(nu0 as number)).toBe(t2 > theta1 ? 1 : 0);
      expect(Math.abs(nuPi as number)).toBe(theta1 + t2 > Math.PI ? 1 : 0);
    });
  });

  it('computes sweeps declared in a model file as part of verification', async () => {
    const report = await verifyCatalogue([chain], { workers: 0, cache: false });
    const sweep = report.records[0].sweeps[0];
    expect(sweep.name).toBe('theta2-scan');
    expect(sweep.axes[0].values.map((x) => x / Math.PI).map((x) => Number(x.toFixed(12)))).toEqual([0.1, 0.3, 0.5, 0.7, 0.9]);
    // θ₂ = 0.5π, 0.7π, 0.9π lie above θ₁ = 0.4π: ν₀ = ±1 there, 0 below.
    expect(sweep.points.map((p) => Math.abs(p.values['gap-0/invariant'] as number))).toEqual([0, 0, 1, 1, 1]);
  });

  it('reports a point that cannot be computed and keeps going; the command explains bad requests', async () => {
    const out: string[] = [];
    const err: string[] = [];
    const io = { stdout: { write: (t: string) => out.push(t) }, stderr: { write: (t: string) => err.push(t) } };
    expect(await sweepCommand([chain, '--vary', 'nope=0:1:3', '--no-cache'], io)).toBe(2);
    expect(err.join('')).toMatch(/no parameter "nope"; parameters are T, theta1, theta2, J1, J2/);
    // T = −1 makes the segment durations negative: compile errors become per-point errors.
    await expect(runSweep(chain, [{ name: 'T', start: -1, stop: 1, count: 2 }], ['minimalGap'], { cache: false })).resolves.toMatchObject({
      points: [{ error: expect.stringMatching(/cannot compile/) }, { error: null }],
    });
    await expect(runSweep(chain, [], ['minimalGap'], { cache: false })).rejects.toThrow(SweepRequestError);
  });

  it('maps QWZ Chern numbers with the sign flip at m = 0 and leaves points where a gap of the model closes unsettled', async () => {
    // Qi, Wu, Zhang, PRB 74, 085308 (2006) (from memory): |C| = 1 for 0 < |m| < 2 with opposite signs on the
    // two sides of m = 0; the gap at ε = 0 closes at m = 0, where "band 0" stops being one band.
    const s = await runSweep('test/fixtures/verification/qwz-correct.json', [{ name: 'm', start: -1, stop: 1, count: 3 }], ['chern'], { cache: false });
    const lower = s.points.map((p) => p.values['band-0/chern']);
    expect(lower[1]).toBeNull();
    expect(Math.abs(lower[0] as number)).toBe(1);
    expect(lower[2]).toBe(-(lower[0] as number));
  });
});
