import { describe, expect, it } from 'vitest';
import { truncateDrive, SupercellInputError } from '../../src/numerics/supercell.ts';
import { blochHamiltonian } from '../../src/numerics/evolution/bloch.ts';
import { HermitianEigen } from '../../src/numerics/linalg/hermitian-eigen.ts';
import type { LatticeDrive } from '../../src/numerics/evolution/drive.ts';
import { qwzDrive } from '../support/drives/qwz.ts';
import { circularHoneycombDrive } from '../support/drives/honeycomb.ts';
import { staticDrive } from '../support/drives/static.ts';

function expectWithin(label: string, actual: number, expected: number, tolerance: number): void {
  const delta = Math.abs(actual - expected);
  if (!(delta <= tolerance)) expect.fail(`${label}: actual ${actual}, expected ${expected}, |Δ| ${delta.toExponential(2)} > tolerance ${tolerance.toExponential(2)}`);
}

/** Uniform chain with hopping −1 (one orbital per cell, a = x̂). */
function chain(): LatticeDrive {
  return staticDrive({ latticeVectors: [[1, 0]], states: [{ label: 's', position: [0, 0], charge: 1 }], hoppings: [{ from: 0, to: 0, offset: [1], amplitude: -1 }] });
}

describe('truncateDrive', () => {
  it('labels states "j:orb", shifts positions by j·a_f and drops one lattice direction', () => {
    const ribbon = truncateDrive(qwzDrive(1), 0, 3);
    expect(ribbon.dimension).toBe(1);
    expect(ribbon.latticeVectors).toEqual([[0, 1]]);
    expect(ribbon.states.map((s) => s.label)).toEqual(['0:a', '0:b', '1:a', '1:b', '2:a', '2:b']);
    expect(ribbon.states[4].position).toEqual([2, 0]);
    expect(ribbon.period).toBe(qwzDrive(1).period);
  });

  it('reproduces the block-tridiagonal QWZ ribbon Hamiltonian derived by hand', () => {
    // H(k) = sin k_x σx + sin k_y σy + (m + cos k_x + cos k_y) σz. In real space along x the
    // block coupling cell j to j+1 is the coefficient of e^{−ik_x}: (i/2)σx + (1/2)σz; the
    // diagonal block is sin k_y σy + (m + cos k_y) σz (derived from drive.ts conventions).
    const m = 0.7, width = 4, s = 0.23, ky = 2 * Math.PI * s;
    const h = blochHamiltonian(truncateDrive(qwzDrive(m), 0, width), [s], 0);
    const n = 2 * width;
    const expected = (r: number, c: number): [number, number] => {
      const [jr, a] = [Math.floor(r / 2), r % 2];
      const [jc, b] = [Math.floor(c / 2), c % 2];
      const sz = a === b ? (a === 0 ? 1 : -1) : 0;
      if (jr === jc) {
        const dz = m + Math.cos(ky);
        if (a === b) return [dz * sz, 0];
        return a === 0 ? [0, -Math.sin(ky)] : [0, Math.sin(ky)];
      }
      // block(j+1, j) = (1/2)σz + (i/2)σx; block(j, j+1) is its adjoint.
      if (jr === jc + 1) return a === b ? [sz / 2, 0] : [0, 0.5];
      if (jc === jr + 1) return a === b ? [sz / 2, 0] : [0, -0.5];
      return [0, 0];
    };
    for (let r = 0; r < n; r++) {
      for (let c = 0; c < n; c++) {
        const [re, im] = expected(r, c);
        expectWithin(`Re H[${r},${c}]`, h.re[r * n + c], re, 1e-14);
        expectWithin(`Im H[${r},${c}]`, h.im[r * n + c], im, 1e-14);
      }
    }
  });

  it('turns a chain into an open cluster with the analytic spectrum −2cos(πj/(N+1))', () => {
    // Open tight-binding chain of N sites, hopping −1: E_j = −2 cos(π j/(N+1)), j = 1…N (textbook result).
    const N = 9;
    const cluster = truncateDrive(chain(), 0, N);
    expect(cluster.dimension).toBe(0);
    const values = Array.from(new HermitianEigen(blochHamiltonian(cluster, [], 0)).values);
    const expected = Array.from({ length: N }, (_, j) => -2 * Math.cos((Math.PI * (j + 1)) / (N + 1))).sort((a, b) => a - b);
    values.forEach((v, j) => expectWithin(`E_${j}`, v, expected[j], 1e-12));
  });

  it('keeps Cartesian hop vectors, so Peierls phases of a vector potential are unchanged', () => {
    const drive = circularHoneycombDrive({ hopping: 1, amplitude: 0.4, frequency: 9 });
    const ribbon = truncateDrive(drive, 1, 3);
    const n = drive.states.length;
    for (const term of ribbon.segments[0].terms) {
      const from = ribbon.states[term.from].position, to = ribbon.states[term.to].position;
      const d = [0, 1].map((c) => to[c] - from[c] + term.offset[0] * ribbon.latticeVectors[0][c]);
      // The same bond in the sheet: orbitals from % n → to % n, with the cell offset restored.
      const cellShift = Math.floor(term.to / n) - Math.floor(term.from / n);
      const original = drive.segments[0].terms.find(
        (t) => t.from === term.from % n && t.to === term.to % n && t.offset[1] === cellShift && t.offset[0] === term.offset[0],
      );
      expect(original).toBeDefined();
      const r0 = drive.states[original!.from].position, r1 = drive.states[original!.to].position;
      const d0 = [0, 1].map((c) => r1[c] - r0[c] + original!.offset[0] * drive.latticeVectors[0][c] + original!.offset[1] * drive.latticeVectors[1][c]);
      expectWithin('hop vector x', d[0], d0[0], 1e-12);
      expectWithin('hop vector y', d[1], d0[1], 1e-12);
    }
    expect(ribbon.segments[0].vectorPotential).toEqual(drive.segments[0].vectorPotential);
  });

  it('drops bonds that leave the strip and keeps one term per bond', () => {
    const ribbon = truncateDrive(qwzDrive(1), 1, 5);
    // QWZ terms with offset along y (index 1): 4 of 10; they survive in 4 of the 5 cells, the others in all 5.
    expect(ribbon.segments[0].terms.length).toBe(6 * 5 + 4 * 4);
  });

  it('rejects bad arguments with a located message', () => {
    expect(() => truncateDrive(qwzDrive(1), 2, 4)).toThrow(SupercellInputError);
    expect(() => truncateDrive(qwzDrive(1), 2, 4)).toThrow(/finite direction 2 is not one of the drive's lattice directions 0…1/);
    expect(() => truncateDrive(qwzDrive(1), 0, 0)).toThrow(/positive integer, got 0/);
    expect(() => truncateDrive(truncateDrive(chain(), 0, 2), 0, 2)).toThrow(/dimension 0/);
  });
});
