/**
 * The analysis part of a chain record, built by the real engines from a model file.
 *
 * Two-step chain θ₁ = 0.4π, θ₂ = 0.7π (θᵢ = JᵢT/2). Which phase (derived here): at θ₁ = 0 the
 * intercell step leaves the end orbitals (A of the first cell, B of the last) untouched, so
 * each end has one state at ε = 0 and none at π, for every θ₂ ∈ (0, π). Going from there to
 * θ₁ = 0.4π crosses no closing of the gap at 0 (θ₂ > θ₁ all along, U(π) = e^{−i(θ₁−θ₂)σx}) and
 * one closing of the gap at π (θ₁ + θ₂ = π, U(0) = e^{−i(θ₁+θ₂)σx} = −1 there), a single
 * linear crossing at k = 0 that adds one π mode per end: the (1, 1) phase, one end state at 0
 * and one at π on each end (the phase diagram of Asbóth & Obuse, PRB 88, 121406(R) (2013),
 * from memory, agrees). Gaps: 2|θ₁ − θ₂|/π = 0.6 at 0 and 2(θ₁ + θ₂ − π)/π = 0.2 at π.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { loadModels } from '../../../src/catalogue/load.ts';
import { verifyModel } from '../../../src/catalogue/verify/verify-model.ts';
import { realEngines } from '../../../src/catalogue/verify/real-engines.ts';
import { reportProblems } from '../../../src/catalogue/records/report-validation.ts';
import type { ModelRecord, SpectrumRecord } from '../../../src/catalogue/records/model-record.ts';

let record: ModelRecord;
let spectrum: SpectrumRecord;

beforeAll(async () => {
  const { models } = await loadModels(['test/fixtures/verification/two-step-chain-correct.json']);
  const loaded = models[0];
  loaded.document.sweeps = [];
  record = verifyModel(loaded, realEngines, { version: 'test', numericsHash: '0'.repeat(64) }).record;
  spectrum = record.analysis!.spectra[0];
});

/** Positions in the record's row of the states within `window` (units π/T) of `label`. */
function statesNear(label: number, window: number): number[] {
  const row = spectrum.quasienergies[0];
  return row.map((e, i) => i).filter((i) => {
    const d = row[i] - label;
    return Math.abs(d - 2 * Math.round(d / 2)) <= window;
  });
}

describe('chain records', () => {
  it('carry the open-chain spectrum as one row of quasienergies with end weights, valid against the schema', () => {
    expect(reportProblems(record)).toEqual([]);
    expect(record.analysis!.spectra).toHaveLength(1);
    expect(spectrum.kind).toBe('open-chain');
    expect(spectrum.finiteDirection).toBeNull();
    expect(spectrum.momenta).toEqual([]);
    expect(spectrum.width).toBe(40); // numerics.chainLength of the file
    expect(spectrum.quasienergies).toHaveLength(1);
    expect(spectrum.quasienergies[0]).toHaveLength(2 * 40);
    expect(spectrum.lowEdgeWeight[0]).toHaveLength(80);
    expect(spectrum.highEdgeWeight[0]).toHaveLength(80);
  });

  it('in the (1, 1) phase holds exactly the end states the engine counted at 0 and π, on the right ends', () => {
    const counts = (gap: string) => record.portrait.find((e) => e.id === `gap-${gap}/end-modes`)!.value;
    expect([counts('0'), counts('1')]).toEqual([1, 1]);
    // Bulk states keep at least the bulk clearance (0.3 and 0.1 π/T) from the labels; end states are
    // within the finite-size splitting e^{−L/ξ} of them. A window of 0.05 π/T separates the two.
    const zero = statesNear(0, 0.05), pi = statesNear(1, 0.05);
    expect(zero).toHaveLength(2); // one per end
    expect(pi).toHaveLength(2);
    const localised = spectrum.quasienergies[0].map((_, i) => i).filter((i) => spectrum.lowEdgeWeight[0][i] + spectrum.highEdgeWeight[0][i] >= 0.5);
    expect(localised.sort((a, b) => a - b)).toEqual([...zero, ...pi].sort((a, b) => a - b));
    for (const states of [zero, pi]) {
      // Degenerate end states may come out as any mixture of the two ends: per gap, one state's worth
      // of weight on each end (records round weights to 1e-3; the end regions miss e^{−2·edgeCells/ξ}).
      const low = states.reduce((s, i) => s + spectrum.lowEdgeWeight[0][i], 0);
      const high = states.reduce((s, i) => s + spectrum.highEdgeWeight[0][i], 0);
      expect(Math.abs(low - 1)).toBeLessThanOrEqual(0.01);
      expect(Math.abs(high - 1)).toBeLessThanOrEqual(0.01);
      for (const i of states) expect(spectrum.lowEdgeWeight[0][i] + spectrum.highEdgeWeight[0][i]).toBeGreaterThanOrEqual(0.99);
    }
  });

  it('reports the minimal direct gaps 2|θ₁ − θ₂|/π at 0 (k = π) and 2(θ₁ + θ₂ − π)/π at π (k = 0)', () => {
    const gaps = record.analysis!.gaps;
    const zero = gaps.find((g) => g.label === 0)!, pi = gaps.find((g) => g.label === 1)!;
    expect(Math.abs(zero.minimalGap - 0.6)).toBeLessThanOrEqual(1e-9);
    expect(Math.abs(zero.at[0] - 0.5)).toBeLessThanOrEqual(1e-6);
    expect(Math.abs(pi.minimalGap - 0.2)).toBeLessThanOrEqual(1e-9);
    expect(Math.min(pi.at[0], 1 - pi.at[0])).toBeLessThanOrEqual(1e-6);
  });
});
