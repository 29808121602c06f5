import { describe, expect, it } from 'vitest';
import {
  aboveCut,
  circularDifference,
  FloquetSampler,
  gridMomentum,
  gridNeighbour,
  quasienergiesFromEigenphases,
  sampleQuasienergyGrid,
  wrapQuasienergy,
} from '../../src/numerics/quasienergy-bands.ts';
import { qwzDrive } from '../support/drives/qwz.ts';
import { checkerboardDrive } from '../support/drives/checkerboard.ts';

function expectWithin(label: string, actual: number, expected: number, tolerance: number): void {
  const delta = Math.abs(actual - expected);
  if (!(delta <= tolerance)) expect.fail(`${label}: actual ${actual}, expected ${expected}, |Δ| ${delta.toExponential(2)} > tolerance ${tolerance.toExponential(2)}`);
}

describe('quasienergy circle helpers', () => {
  it('wraps into (−1, 1] with π/T (1) kept and −π/T mapped to 1', () => {
    expect(wrapQuasienergy(1)).toBe(1);
    expect(wrapQuasienergy(-1)).toBe(1);
    expectWithin('2.25 → 0.25', wrapQuasienergy(2.25), 0.25, 1e-15);
    expectWithin('−1.5 → 0.5', wrapQuasienergy(-1.5), 0.5, 1e-15);
    expectWithin('circular difference across π', circularDifference(-0.9, 0.9), 0.2, 1e-15);
    expectWithin('above cut across π', aboveCut(-0.9, 0.9), 0.2, 1e-15);
  });

  it('converts eigenphases φ of U = e^{−iεT} to ε = −φ/π (units π/T)', () => {
    // A phase e^{iφ} with φ = 0.3π is the quasienergy ε = −0.3 π/T by definition.
    const { values, order } = quasienergiesFromEigenphases(Float64Array.from([0.3 * Math.PI, -0.8 * Math.PI, Math.PI]));
    expect(Array.from(values).map((x) => Number(x.toFixed(12)))).toEqual([-0.3, 0.8, 1]);
    expect(order).toEqual([0, 1, 2]);
  });
});

describe('grid indexing', () => {
  it('enumerates s = j/n with the last direction fastest and periodic neighbours', () => {
    expect(gridMomentum([3, 4], 7)).toEqual([1 / 3, 3 / 4]);
    expect(gridNeighbour([3, 4], 7, 1)).toBe(4); // (1, 3) → (1, 0)
    expect(gridNeighbour([3, 4], 7, 0)).toBe(11); // (1, 3) → (2, 3)
    expect(gridNeighbour([3, 4], 3, 0, -1)).toBe(11); // (0, 3) → (2, 3)
  });
});

describe('FloquetSampler', () => {
  it('gives the static QWZ energies ±|d(k)|·T/π for a static model run as a drive', () => {
    // Analytic: eigenvalues of d·σ are ±|d|, d = (sin kx, sin ky, m + cos kx + cos ky).
    const m = 1.3;
    const drive = qwzDrive(m);
    const sampler = new FloquetSampler(drive);
    const data = sampleQuasienergyGrid(sampler, [5, 7]);
    data.samples.forEach((sample) => {
      const [kx, ky] = sample.momentum.map((x) => 2 * Math.PI * x);
      const d = Math.hypot(Math.sin(kx), Math.sin(ky), m + Math.cos(kx) + Math.cos(ky));
      const e = (d * drive.period) / Math.PI;
      expectWithin(`lower at ${sample.momentum}`, sample.quasienergies[0], -e, 1e-12);
      expectWithin(`upper at ${sample.momentum}`, sample.quasienergies[1], e, 1e-12);
    });
    expect(sampler.evaluations).toBe(35);
    sampleQuasienergyGrid(sampler, [5, 7]);
    expect(sampler.evaluations).toBe(35);
  });

  it('returns eigenvectors of U(T): checkerboard at full transfer has U = e^{−iΔτσz} up to a phase', () => {
    // Rudner et al., PRX 3, 031005 (2013): at Jτ = π/2 the four hops return a bulk particle to its site,
    // so U(T) = e^{−iΔτσz} and the quasienergies are ±Δ·τ, i.e. ±Δτ/π in units of π/T.
    const tau = 1, delta = 0.4;
    const sampler = new FloquetSampler(checkerboardDrive({ hopping: Math.PI / 2, offset: delta, stepDuration: tau }));
    for (const s of [[0.1, 0.2], [0.5, 0.5], [0.77, 0.31]]) {
      const sample = sampler.at(s);
      expectWithin(`ε at ${s}`, Math.abs(sample.quasienergies[0]), (delta * tau) / Math.PI, 1e-10);
      expectWithin(`ε sum at ${s}`, sample.quasienergies[0] + sample.quasienergies[1], 0, 1e-10);
      expectWithin('residual', sample.eigenResidual, 0, 1e-12);
    }
  });

  it('refuses a grid of the wrong dimension or with a non-positive size', () => {
    const sampler = new FloquetSampler(qwzDrive(1));
    expect(() => sampleQuasienergyGrid(sampler, [4])).toThrow(/1-direction grid for a drive of dimension 2/);
    expect(() => sampleQuasienergyGrid(sampler, [4, 0])).toThrow(/positive integers, got \[4, 0\]/);
  });
});
