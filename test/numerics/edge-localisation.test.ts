/**
 * The edge-localisation measure (src/numerics/edge-localisation.ts) on states
 * whose character is known from outside the code: an extended standing wave,
 * the analytic Qi–Wu–Zhang edge state (derived in sheet/ribbon.test.ts), the
 * bulk bands of a QWZ ribbon (E = ±|d(k)|, Qi, Wu, Zhang, PRB 74, 085308 (2006))
 * and the flat bulk bands of the five-step checkerboard drive at full transfer
 * (Rudner, Lindner, Berg, Levin, PRX 3, 031005 (2013): the bulk Floquet operator
 * is e^{−iΔτσ_z} up to a phase, every bulk state at quasienergy ±Δτ/π).
 */
import { describe, expect, it } from 'vitest';
import { LOCALISATION_THRESHOLD, localisationMeasure, localisationRegion, regionWeights, stateLocalisation } from '../../src/numerics/edge-localisation.ts';
import { ribbonSpectrum } from '../../src/numerics/sheet/ribbon.ts';
import { qwzDrive } from '../support/drives/qwz.ts';
import { checkerboardDrive } from '../support/drives/checkerboard.ts';

const W = 120;

describe('edge-localisation measure', () => {
  it('keeps every extended standing wave below 1/7 on each edge', () => {
    const region = localisationRegion(W, 2);
    expect(region.cells).toBe(6);
    for (let q = 1; q <= W; q++) {
      const w = Array.from({ length: W }, (_, j) => Math.sin((Math.PI * q * (j + 1)) / (W + 1)) ** 2);
      const total = w.reduce((a, b) => a + b, 0);
      const [lo, hi] = regionWeights(w.map((x) => x / total), region.cells);
      expect(localisationMeasure(lo, region.uniformWeight), `q = ${q}`).toBeLessThan(1 / 7);
      expect(localisationMeasure(hi, region.uniformWeight), `q = ${q}`).toBeLessThan(1 / 7);
    }
  });

  it('gives an exponentially localised edge state a measure near 1 on its edge and 0 on the other', () => {
    const lambda = 0.5; // |ψ_j|² ∝ λ^{2j}, decay length ξ = −1/ln λ
    const xi = -1 / Math.log(lambda);
    const region = localisationRegion(W, xi);
    const w = Array.from({ length: W }, (_, j) => lambda ** (2 * j) * (1 - lambda ** 2));
    const [lo, hi] = regionWeights(w, region.cells);
    expect(localisationMeasure(lo, region.uniformWeight)).toBeGreaterThan(0.99);
    expect(localisationMeasure(hi, region.uniformWeight)).toBe(0);
  });

  it('gives degenerate states the mean weight of their group, whatever basis the solver returned', () => {
    const region = { cells: 10, uniformWeight: 0.1 };
    // Two states at one quasienergy, returned as mixtures (0.7/0.3 and 0.3/0.7 of the two edges) or pure: same measures.
    const mixed = stateLocalisation([0.2, 0.2, 0.5], [0.7, 0.3, 0.05], [0.3, 0.7, 0.05], region);
    const pure = stateLocalisation([0.2, 0.2, 0.5], [1, 0, 0.05], [0, 1, 0.05], region);
    expect(mixed).toEqual(pure);
    expect(mixed.low[0]).toBeCloseTo((0.5 - 0.1) / 0.9, 12);
  });
});

describe('edge-localisation measure on ribbon spectra', () => {
  it('flags on a QWZ ribbon only states inside the bulk gap at their momentum, and the analytic edge states', () => {
    const m = 1, T = 0.5;
    const r = ribbonSpectrum(qwzDrive(m, T), { finiteDirection: 0, width: 60, momenta: 24, decayLength: 2 });
    let flagged = 0, bulk = 0;
    r.momenta.forEach((s, j) => {
      const ky = 2 * Math.PI * s;
      // Projected bulk band at this k_y: |E| ∈ [min_kx |d|, max_kx |d|] with d = (sin kx, sin ky, m + cos kx + cos ky).
      let dmin = Infinity;
      for (let i = 0; i < 2000; i++) {
        const kx = (2 * Math.PI * i) / 2000;
        dmin = Math.min(dmin, Math.hypot(Math.sin(kx), Math.sin(ky), m + Math.cos(kx) + Math.cos(ky)));
      }
      r.samples[j].quasienergies.forEach((e, c) => {
        const energy = (Math.abs(e) * Math.PI) / T;
        const isEdge = r.lowLocalisation[j][c] >= LOCALISATION_THRESHOLD || r.highLocalisation[j][c] >= LOCALISATION_THRESHOLD;
        if (isEdge) {
          flagged++;
          expect(energy, `flagged state at k_y = ${ky.toFixed(3)}`).toBeLessThan(dmin);
        } else if (energy > dmin + 1e-9) bulk++;
      });
      // The analytic low-edge state ε = sin k_y (λ = −(m + cos k_y)) exists for |λ| < 1 and must be flagged there.
      const lambda = -(m + Math.cos(ky));
      if (Math.abs(lambda) < 0.6) {
        const c = r.samples[j].quasienergies.findIndex((e) => Math.abs(e - (Math.sin(ky) * T) / Math.PI) < 1e-9);
        expect(r.lowLocalisation[j][c], `analytic edge state at k_y = ${ky.toFixed(3)}`).toBeGreaterThan(0.9);
      }
    });
    expect(bulk).toBeGreaterThan(20 * 100);
    expect(flagged).toBeGreaterThan(10);
  });

  it('does not flag the flat bulk bands of the checkerboard drive at full transfer', () => {
    const delta = 0.4;
    const r = ribbonSpectrum(checkerboardDrive({ hopping: Math.PI / 2, offset: delta, stepDuration: 1 }), { finiteDirection: 1, width: 32, momenta: 12 });
    const flat = delta / Math.PI; // bulk quasienergies ±Δτ/π (τ = 1)
    let checked = 0;
    r.samples.forEach((sample, j) => {
      sample.quasienergies.forEach((e, c) => {
        if (Math.abs(Math.abs(e) - flat) > 1e-9) return;
        checked++;
        expect(r.lowLocalisation[j][c] + r.highLocalisation[j][c], `flat-band state at k∥ = ${r.momenta[j]}`).toBeLessThan(LOCALISATION_THRESHOLD);
      });
    });
    expect(checked).toBeGreaterThan(12 * 40);
  });
});
