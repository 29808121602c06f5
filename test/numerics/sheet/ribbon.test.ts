import { describe, expect, it } from 'vitest';
import { cellWeights, ribbonSpectrum, staticSegmentIndex } from '../../../src/numerics/sheet/ribbon.ts';
import type { LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import { circularDifference } from '../../../src/numerics/quasienergy-bands.ts';
import { FloquetSampler } from '../../../src/numerics/quasienergy-bands.ts';
import { truncateDrive } from '../../../src/numerics/supercell.ts';
import { qwzDrive } from '../../support/drives/qwz.ts';
import { threeStepHoneycombDrive } from '../../support/drives/honeycomb.ts';

function expectWithin(label: string, actual: number, expected: number, tolerance: number): void {
  const delta = Math.abs(actual - expected);
  if (!(delta <= tolerance)) expect.fail(`${label}: actual ${actual}, expected ${expected}, |Δ| ${delta.toExponential(2)} > tolerance ${tolerance.toExponential(2)}`);
}

/*
 * Analytic QWZ edge state (derived here). Ribbon finite along x, cells j ≥ 0:
 *   H = Σ_j h₀|j⟩⟨j| + B|j+1⟩⟨j| + B†|j⟩⟨j+1|,  h₀ = sin k_y σy + (m + cos k_y)σz,  B = (i/2)σx + (1/2)σz.
 * Take χ with σy χ = χ; then σz χ = −iσxχ, so Bχ = 0 and B†χ = −iσxχ. The ansatz ψ_j = λ^j χ gives
 *   (Hψ)_j = λ^j [sin k_y χ − i(m + cos k_y + λ) σxχ]  in the bulk, and the boundary term Bψ_{−1} = 0.
 * With λ = −(m + cos k_y): Hψ = sin k_y ψ. It is normalisable for |m + cos k_y| < 1: the low-edge state
 * has energy +sin k_y and cell weights ∝ λ^{2j}, i.e. decay length ξ = −1/ln|λ| cells.
 */
describe('ribbonSpectrum', () => {
  const m = 1;
  const width = 20;
  const ribbon = ribbonSpectrum(qwzDrive(m), { finiteDirection: 0, width, momenta: 40 });
  const T = qwzDrive(m).period;

  it('samples k∥ = (j + 1/2)/n and reports edge weights that never exceed 1', () => {
    expect(ribbon.momenta.length).toBe(40);
    expectWithin('first momentum', ribbon.momenta[0], 1 / 80, 1e-15);
    expect(ribbon.edgeCells).toBe(5);
    for (let j = 0; j < 40; j++) {
      ribbon.lowEdgeWeight[j].forEach((w, c) => expect(w + ribbon.highEdgeWeight[j][c]).toBeLessThanOrEqual(1 + 1e-12));
    }
  });

  it('contains the analytic low-edge state: ε = sin k_y (T/π units) with weights ∝ (m + cos k_y)^{2j}', () => {
    let checked = 0;
    ribbon.momenta.forEach((s, j) => {
      const ky = 2 * Math.PI * s;
      const lambda = -(m + Math.cos(ky));
      if (Math.abs(lambda) > 0.6) return;
      const sample = ribbon.samples[j];
      const column = ribbon.lowEdgeWeight[j].indexOf(Math.max(...ribbon.lowEdgeWeight[j]));
      expectWithin(`ε at k_y = ${ky.toFixed(3)}`, sample.quasienergies[column], (Math.sin(ky) * T) / Math.PI, 1e-9);
      const w = cellWeights(sample, column, 2);
      expectWithin(`w₁/w₀ at k_y = ${ky.toFixed(3)}`, w[1] / w[0], lambda * lambda, 1e-8);
      checked++;
    });
    expect(checked).toBeGreaterThan(5);
  });

  it('at k_y = π (m = 1) has two exact zero modes, one in the first and one in the last cell', () => {
    // λ = 0 at k_y = π: the state sits in cell 0 only (and its mirror partner in the last cell).
    const sample = new FloquetSampler(truncateDrive(qwzDrive(m), 0, width)).at([0.5]);
    const zero = Array.from(sample.quasienergies.keys()).filter((c) => Math.abs(sample.quasienergies[c]) < 1e-9);
    expect(zero.length).toBe(2);
    const total = zero.reduce((acc, c) => {
      const w = cellWeights(sample, c, 2);
      return acc + w[0] + w[width - 1];
    }, 0);
    expectWithin('weight of the zero modes in the end cells', total, 2, 1e-10);
  });

  it('rejects bad options with plain messages', () => {
    expect(() => ribbonSpectrum(qwzDrive(1), { width: 4, edgeCells: 3 })).toThrow(/edge region of 3 cells does not fit twice into a ribbon of 4 cells/);
    expect(() => ribbonSpectrum(qwzDrive(1), { momenta: 1 })).toThrow(/at least 2 momenta/);
    expect(() => ribbonSpectrum(truncateDrive(qwzDrive(1), 0, 3))).toThrow(/needs a sheet/);
  });
});

/**
 * A static drive has U = e^{−iHT}: the eigenvectors of H with eigenphases −E T. The ribbon takes
 * them from one Hermitian eigen-decomposition; here the same Hamiltonian split into two equal
 * steps (U = e^{−iHT/2} e^{−iHT/2}, the same operator) goes through exponentials and the unitary
 * eigensolver instead, and the two must agree. T = 1.5 makes the QWZ bandwidth (|E| ≤ |m| + 2 = 3)
 * exceed 2π/T, so quasienergies fold across π/T.
 */
describe('ribbon spectra of static drives', () => {
  const m = 1, period = 1.5, width = 10, momenta = 12;
  const whole = qwzDrive(m, period);
  const split: LatticeDrive = {
    ...whole,
    segments: [0, 1].map((i) => ({ label: `half ${i + 1}`, duration: period / 2, terms: whole.segments[0].terms })),
  };
  const fast = ribbonSpectrum(whole, { finiteDirection: 0, width, momenta });
  const reference = ribbonSpectrum(split, { finiteDirection: 0, width, momenta });

  it('take the Hermitian route only for one constant segment', () => {
    expect(staticSegmentIndex(whole)).toBe(0);
    expect(staticSegmentIndex(split)).toBe(-1);
    expect(fast.route).toBe('hermitian');
    expect(reference.route).toBe('floquet');
  });

  it('give the quasienergies and edge weights of the product of exponentials, folded into (−1, 1]', () => {
    for (let j = 0; j < momenta; j++) {
      const a = fast.samples[j], b = reference.samples[j];
      for (let c = 0; c < a.quasienergies.length; c++) {
        const e = a.quasienergies[c];
        expect(e > -1 && e <= 1).toBe(true);
        if (c > 0) expect(e).toBeGreaterThanOrEqual(a.quasienergies[c - 1]);
        // Partner in the reference: nearest quasienergy on the circle.
        let best = 0;
        for (let d = 1; d < b.quasienergies.length; d++) if (Math.abs(circularDifference(b.quasienergies[d], e)) < Math.abs(circularDifference(b.quasienergies[best], e))) best = d;
        expectWithin(`quasienergy ${c} at k∥ = ${fast.momenta[j]}`, circularDifference(b.quasienergies[best], e), 0, 1e-9);
        // Weights are basis-free only for isolated states: compare those.
        const isolated = a.quasienergies.every((x, d) => d === c || Math.abs(circularDifference(x, e)) > 1e-4);
        if (isolated) {
          expectWithin(`low-edge weight of state ${c}`, fast.lowEdgeWeight[j][c], reference.lowEdgeWeight[j][best], 1e-8);
          expectWithin(`high-edge weight of state ${c}`, fast.highEdgeWeight[j][c], reference.highEdgeWeight[j][best], 1e-8);
        }
      }
    }
    expect(fast.eigenResidual).toBeLessThan(1e-10);
    expect(fast.propagatorAccuracy).toBe(0);
  });
});

describe('ribbon spectrum of a drive with flat, degenerate bulk bands', () => {
  // Three-step honeycomb drive at complete transfer, Jτ = π/2, no sublattice offset (Kitagawa, Berg, Rudner,
  // Demler, PRB 82, 235114 (2010)): every bulk particle closes a loop, so U has eigenvalues ±i only (flat bands
  // at ε = ±1/2 in units of π/T), 2(width − 2) states of a 12-cell ribbon sit exactly there, and the edge
  // carries one chiral mode in each gap. The large degenerate groups once made the banded eigensolver
  // project onto a non-invariant subspace and stop the whole model with an error.
  it('computes every momentum: 20 flat bulk states at ±1/2 and one edge state in each half of each gap', () => {
    const drive = threeStepHoneycombDrive({ hopping: Math.PI / 2, stepDuration: 1 });
    const r = ribbonSpectrum(drive, { finiteDirection: 1, width: 12, momenta: 80 });
    for (const sample of r.samples) {
      const q = Array.from(sample.quasienergies);
      expect(q).toHaveLength(24);
      expect(q.filter((e) => Math.abs(Math.abs(e) - 0.5) < 1e-9)).toHaveLength(20);
      const rest = q.filter((e) => Math.abs(Math.abs(e) - 0.5) >= 1e-9);
      const bins = [[-1, -0.5], [-0.5, 0], [0, 0.5], [0.5, 1]].map(([lo, hi]) => rest.filter((e) => e > lo && e <= hi).length);
      expect(bins).toEqual([1, 1, 1, 1]);
    }
  });

  it('computes the other cut too, where the degenerate groups are largest (flat states exactly at ±1/2)', () => {
    // Finite along a₁ the bulk loops close for all but one state per gap: at least 2(width − 2) states are flat
    // (measured: 2(width − 1)), and whatever is left lies inside the gaps.
    const drive = threeStepHoneycombDrive({ hopping: Math.PI / 2, stepDuration: 1 });
    for (const width of [12, 16]) {
      const r = ribbonSpectrum(drive, { finiteDirection: 0, width, momenta: 40 });
      for (const sample of r.samples) {
        const q = Array.from(sample.quasienergies);
        expect(q).toHaveLength(2 * width);
        expect(q.filter((e) => Math.abs(Math.abs(e) - 0.5) < 1e-9).length).toBeGreaterThanOrEqual(2 * (width - 2));
        expect(q.every((e) => Math.abs(Math.abs(e) - 0.5) < 1e-9 || Math.abs(Math.abs(e) - 0.5) > 1e-6)).toBe(true);
      }
    }
  });
});
