import { describe, expect, it } from 'vitest';
import { chernNumber, fhsFieldStrength, selectColumns } from '../../../src/numerics/sheet/chern-fhs.ts';
import { FloquetSampler } from '../../../src/numerics/quasienergy-bands.ts';
import type { ComplexMatrix } from '../../../src/numerics/linalg/complex-matrix.ts';
import { multiply } from '../../../src/numerics/linalg/complex-matrix.ts';
import { qwzDrive } from '../../support/drives/qwz.ts';
import { seededRandom } from '../../support/random.ts';

function expectWithin(label: string, actual: number, expected: number, tolerance: number): void {
  const delta = Math.abs(actual - expected);
  if (!(delta <= tolerance)) expect.fail(`${label}: actual ${actual}, expected ${expected}, |Δ| ${delta.toExponential(2)} > tolerance ${tolerance.toExponential(2)}`);
}

/**
 * Independent route to the Chern number of the lower QWZ band: the continuum formula
 * C = (1/2πi) ∫d²s (⟨∂₁u|∂₂u⟩ − ⟨∂₂u|∂₁u⟩) with first-order perturbation theory
 * |∂u₋⟩ = |u₊⟩⟨u₊|∂H|u₋⟩/(E₋ − E₊) (+ a multiple of |u₋⟩, which drops out), giving
 * C₋ = (1/2πi) ∫d²s Tr(P₋ ∂₁H P₊ ∂₂H − P₋ ∂₂H P₊ ∂₁H)/(2|d|)², P± = (1 ± d̂·σ)/2,
 * ∂ᵢ = 2π ∂/∂kᵢ. Evaluated by the midpoint rule with plain 2×2 arithmetic.
 */
function continuumLowerChern(m: number, n: number): number {
  type C2 = [number, number][][]; // 2×2 complex
  const mul = (a: C2, b: C2): C2 =>
    [0, 1].map((i) =>
      [0, 1].map((j) => {
        let re = 0, im = 0;
        for (let k = 0; k < 2; k++) {
          re += a[i][k][0] * b[k][j][0] - a[i][k][1] * b[k][j][1];
          im += a[i][k][0] * b[k][j][1] + a[i][k][1] * b[k][j][0];
        }
        return [re, im] as [number, number];
      }),
    );
  const pauli = (x: number, y: number, z: number, c = 0): C2 => [
    [[c + z, 0], [x, -y]],
    [[x, y], [c - z, 0]],
  ];
  let sum = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const kx = (2 * Math.PI * (i + 0.5)) / n, ky = (2 * Math.PI * (j + 0.5)) / n;
      const d = [Math.sin(kx), Math.sin(ky), m + Math.cos(kx) + Math.cos(ky)];
      const norm = Math.hypot(d[0], d[1], d[2]);
      const pMinus = pauli(-d[0] / (2 * norm), -d[1] / (2 * norm), -d[2] / (2 * norm), 0.5);
      const pPlus = pauli(d[0] / (2 * norm), d[1] / (2 * norm), d[2] / (2 * norm), 0.5);
      const d1H = pauli(2 * Math.PI * Math.cos(kx), 0, -2 * Math.PI * Math.sin(kx));
      const d2H = pauli(0, 2 * Math.PI * Math.cos(ky), -2 * Math.PI * Math.sin(ky));
      const a = mul(mul(mul(pMinus, d1H), pPlus), d2H);
      const b = mul(mul(mul(pMinus, d2H), pPlus), d1H);
      const traceIm = a[0][0][1] + a[1][1][1] - b[0][0][1] - b[1][1][1];
      sum += traceIm / (4 * norm * norm); // (1/2πi)·(i·Im) = Im/2π; the real parts cancel
    }
  }
  return sum / (2 * Math.PI * n * n);
}

describe('chernNumber (Fukui–Hatsugai–Suzuki)', () => {
  it('agrees with the continuum Kubo-type integral for QWZ (sign convention included)', () => {
    for (const m of [-1.2, 0.6, 1.4, 2.6]) {
      const reference = continuumLowerChern(m, 200);
      const c = chernNumber(new FloquetSampler(qwzDrive(m)), 1, 0, 1);
      expect(c.converged).toBe(true);
      expectWithin(`m = ${m}: FHS vs continuum`, c.raw, reference, 1e-2);
      expectWithin(`m = ${m}: lattice sum is an integer`, c.residual, 0, 1e-9);
    }
  });

  it('reports a certificate: two grids with the same integer, flux below π/3, history', () => {
    const c = chernNumber(new FloquetSampler(qwzDrive(1)), 1, 0, 1, { initialGrid: 4 });
    expect(c.history.length).toBeGreaterThanOrEqual(2);
    const last = c.history.slice(-2).map((h) => Math.round(h.value));
    expect(last[0]).toBe(last[1]);
    expect(c.maxPlaquetteFlux).toBeLessThan(Math.PI / 3);
    expect(c.grid).toEqual(c.history[c.history.length - 1].grid);
    expect(c.fluxThreshold).toBeCloseTo(Math.PI / 3, 15);
  });

  it('refuses to converge near a gap closing when the grid is capped', () => {
    // m = 2 − 0.02: the lower band's Berry flux is concentrated within |k − (π, π)| ≲ 0.02.
    const c = chernNumber(new FloquetSampler(qwzDrive(1.98)), 1, 0, 1, { initialGrid: 4, maxGrid: 8 });
    expect(c.converged).toBe(false);
    expect(c.caveat).toMatch(/not converged at the largest grid 8×8/);
  });

  it('says so, without claiming a change between grids, when the starting grid is past the refinement limit', () => {
    // QWZ at m = 1 is deep in its C = 1 phase; only the single grid keeps it unsettled.
    const c = chernNumber(new FloquetSampler(qwzDrive(1)), 1, 0, 1, { initialGrid: 16, maxGrid: 8 });
    expect(c.history).toHaveLength(1);
    expect(c.converged).toBe(false);
    expect(c.caveat).toBe('computed on the single grid 16×16: the starting grid is at or above the refinement limit 8×8, so there is no second grid to compare with');
    expect(c.caveat).not.toMatch(/changed between/);
  });

  it('is invariant under arbitrary phases of the eigenvectors and under basis changes inside a group (seeded)', () => {
    const random = seededRandom(7);
    const sampler = new FloquetSampler(qwzDrive(0.8));
    const n = 12;
    const frames: ComplexMatrix[] = [];
    const rephased: ComplexMatrix[] = [];
    for (let i = 0; i < n * n; i++) {
      const s = [Math.floor(i / n) / n, (i % n) / n];
      const v = selectColumns(sampler.at(s).vectors, [0, 1]); // both bands: a rank-2 group, C = 0
      frames.push(selectColumns(sampler.at(s).vectors, [0]));
      const phi = 2 * Math.PI * random();
      const rotation = { rows: 2, cols: 2, re: new Float64Array([Math.cos(phi), -Math.sin(phi), Math.sin(phi), Math.cos(phi)]), im: new Float64Array(4) };
      rephased.push(multiply(v, rotation));
      const theta = 2 * Math.PI * random();
      const f = frames[i];
      const re = f.re.map((x, p) => x * Math.cos(theta) - f.im[p] * Math.sin(theta));
      const im = f.im.map((y, p) => f.re[p] * Math.sin(theta) + y * Math.cos(theta));
      frames[i] = { rows: f.rows, cols: f.cols, re, im };
    }
    expectWithin('lower band with random phases', fhsFieldStrength(frames, n, n).raw, 1, 1e-9);
    expectWithin('both bands, random rotations', fhsFieldStrength(rephased, n, n).raw, 0, 1e-9);
  });

  it('rejects a drive that is not a sheet', () => {
    const chain = { ...qwzDrive(1), dimension: 1 as const };
    expect(() => chernNumber(new FloquetSampler(chain), 1, 0, 1)).toThrow(/two periodic directions, got dimension 1/);
  });
});
