import { describe, expect, it } from 'vitest';
import { blochHamiltonian, kickGenerator, prepareBloch } from '../../../src/numerics/evolution/bloch.ts';
import type { DriveTerm, LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import { distance, hermiticityDefect, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import { seededRandom } from '../../support/random.ts';
import { expectBelow, expectWithin } from '../linalg/comparisons.ts';

const constant = { kind: 'constant' } as const;
const hop = (from: number, to: number, offset: number[], re: number, im = 0): DriveTerm => ({ from, to, offset, amplitude: { re, im }, modulation: constant });

/** SSH chain: intracell v (A→B), intercell w (B → A of the next cell). */
function sshChain(v: number, w: number): LatticeDrive {
  return {
    dimension: 1,
    spaceDimension: 1,
    latticeVectors: [[1]],
    states: [{ label: 'A', position: [0], charge: 1 }, { label: 'B', position: [0.5], charge: 1 }],
    period: 1,
    segments: [{ duration: 1, terms: [hop(0, 1, [0], v), hop(1, 0, [1], w)] }],
  };
}

/** A random two-dimensional three-orbital drive with complex hoppings, onsite terms and a harmonic segment. */
function randomSheet(seed: number): LatticeDrive {
  const r = seededRandom(seed);
  const terms: DriveTerm[] = [];
  for (let k = 0; k < 9; k++) {
    const from = Math.floor(r() * 3), to = Math.floor(r() * 3);
    const offset = [Math.floor(r() * 5) - 2, Math.floor(r() * 5) - 2];
    if (from === to && offset[0] === 0 && offset[1] === 0) offset[0] = 1;
    terms.push(hop(from, to, offset, r() - 0.5, r() - 0.5));
  }
  terms.push(hop(2, 2, [0, 0], 0.7));
  return {
    dimension: 2,
    spaceDimension: 2,
    latticeVectors: [[1, 0], [0.5, Math.sqrt(3) / 2]],
    states: [0, 1, 2].map((i) => ({ label: `s${i}`, position: [0.1 * i, 0.2 * i], charge: 1 })),
    period: 2,
    segments: [
      { duration: 0.8, terms },
      {
        duration: 1.2,
        terms: terms.map((t) => ({ ...t, modulation: { kind: 'harmonic', mean: 0.3, components: [{ amplitude: 0.5, harmonic: 2, phase: 0.4 }] } })),
        vectorPotential: [{ amplitude: [0.4, -0.2], harmonic: 1, phase: 0.1 }],
      },
    ],
  };
}

describe('blochHamiltonian', () => {
  it('builds the SSH Bloch matrix H_BA = v + w e^{2πis} (derived from the conventions in drive.ts)', () => {
    // Term A→B, offset 0, amplitude v: element (B, A) gets v. Term B→A, offset 1, amplitude w:
    // element (A, B) gets w e^{−2πis}, hence (B, A) gets its conjugate w e^{+2πis}.
    const v = 0.7, w = 1.3;
    for (const s of [0, 0.13, 0.5, 0.91]) {
      const h = blochHamiltonian(sshChain(v, w), [s], 0.2);
      expectWithin(`s=${s} Re H_BA`, h.re[2], v + w * Math.cos(2 * Math.PI * s), 1e-15);
      expectWithin(`s=${s} Im H_BA`, h.im[2], w * Math.sin(2 * Math.PI * s), 1e-15);
      expect(h.re[0]).toBe(0);
      expect(h.re[3]).toBe(0);
    }
  });

  it('is Hermitian and periodic under s → s + e_i at every time (exact convention: periodic gauge)', () => {
    const drive = randomSheet(51);
    const r = seededRandom(52);
    for (let k = 0; k < 10; k++) {
      const s = [r(), r()], t = 2 * r();
      const h = blochHamiltonian(drive, s, t);
      expectBelow('‖H − H†‖_F', hermiticityDefect(h), 1e-15);
      expectBelow('‖H(s + e₁) − H(s)‖_F', distance(blochHamiltonian(drive, [s[0] + 1, s[1]], t), h), 1e-13);
      expectBelow('‖H(s + e₂) − H(s)‖_F', distance(blochHamiltonian(drive, [s[0], s[1] - 1], t), h), 1e-13);
    }
  });

  it('adds an onsite term once and follows a harmonic modulation f(t) = mean + a cos(hωt + φ)', () => {
    const drive: LatticeDrive = {
      dimension: 0, spaceDimension: 1, latticeVectors: [], period: 4,
      states: [{ label: 'a', position: [0], charge: 1 }],
      segments: [{ duration: 4, terms: [{ from: 0, to: 0, offset: [], amplitude: { re: 2, im: 0 }, modulation: { kind: 'harmonic', mean: 0.5, components: [{ amplitude: 1.5, harmonic: 3, phase: 0.2 }] } }] }],
    };
    const t = 1.1, omega = (2 * Math.PI) / 4;
    expectWithin('H(t)', blochHamiltonian(drive, [], t).re[0], 2 * (0.5 + 1.5 * Math.cos(3 * omega * t + 0.2)), 1e-15);
  });

  it('Peierls substitution: a chain in a constant vector potential A equals the chain at k − qA (reduced s − qA·a/2π)', () => {
    // Single-orbital chain, hopping J to the right neighbour, lattice constant a = 1.7, charge q = 1.
    // H(s) = J e^{iqAa} e^{−2πis} + c.c. = 2J cos(2πs − qAa).
    const a = 1.7, J = 0.9, A = 0.37;
    const chain = (withPotential: boolean): LatticeDrive => ({
      dimension: 1, spaceDimension: 1, latticeVectors: [[a]], period: 1,
      states: [{ label: 'x', position: [0], charge: 1 }],
      segments: [{ duration: 1, terms: [hop(0, 0, [1], J)], ...(withPotential ? { vectorPotential: [{ amplitude: [A], harmonic: 0, phase: 0 }] } : {}) }],
    });
    for (const s of [0, 0.2, 0.77]) {
      const withA = blochHamiltonian(chain(true), [s], 0.5);
      const shifted = blochHamiltonian(chain(false), [s - (A * a) / (2 * Math.PI)], 0.5);
      expectBelow(`s=${s}`, distance(withA, shifted), 1e-14);
      expectWithin(`s=${s} closed form`, withA.re[0], 2 * J * Math.cos(2 * Math.PI * s - A * a), 1e-14);
    }
  });

  it('prepareBloch agrees with blochHamiltonian and marks constant segments', () => {
    const drive = randomSheet(53);
    const p = prepareBloch(drive, [0.3, 0.6]);
    expect(p.isConstant(0)).toBe(true);
    expect(p.isConstant(1)).toBe(false);
    for (const t of [0, 0.5, 0.8, 1.3, 2]) expect(distance(p.at(t), blochHamiltonian(drive, [0.3, 0.6], t))).toBe(0);
    // At the boundary t = 0.8 the later segment applies (the harmonic one, mean 0.3 …).
    expect(p.segmentIndexAt(0.8)).toBe(1);
    expect(p.segmentIndexAt(2)).toBe(1);
    // Node tables (shared across momenta) give the same matrices as direct evaluation.
    const times = [0.9, 1.4, 1.95];
    const other = prepareBloch(drive, [0.8, 0.1]);
    const first = p.tableSampler(1, 'probe', times), second = other.tableSampler(1, 'probe', times);
    times.forEach((t, j) => {
      expectBelow(`node ${j} at s=(0.3, 0.6)`, distance(first(j, zeros(3, 3)), p.segmentAt(1, t)), 1e-15);
      expectBelow(`node ${j} at s=(0.8, 0.1)`, distance(second(j, zeros(3, 3)), other.segmentAt(1, t)), 1e-15);
    });
  });

  it('returns the kick generator K of a zero-duration segment', () => {
    const drive: LatticeDrive = { ...sshChain(0.4, 0.6), segments: [...sshChain(0.4, 0.6).segments, { duration: 0, terms: [hop(0, 0, [0], Math.PI / 2)] }] };
    const k = kickGenerator(drive, [0.1], 1);
    expect(Array.from(k.re)).toEqual([Math.PI / 2, 0, 0, 0]);
    expect(() => kickGenerator(drive, [0.1], 0)).toThrow('kickGenerator: segment 0 has duration 1; only zero-duration segments are kicks');
  });

  it('rejects inconsistent input with located messages', () => {
    const drive = sshChain(1, 1);
    expect(() => blochHamiltonian(drive, [0.1, 0.2], 0)).toThrow('blochHamiltonian: momentum has 2 components, the lattice has dimension 1');
    expect(() => blochHamiltonian(drive, [Number.NaN], 0)).toThrow('blochHamiltonian: momentum component 0 is not finite (NaN)');
    expect(() => blochHamiltonian(drive, [0], 1.5)).toThrow('blochHamiltonian: time 1.5 outside the period [0, 1]');
    const bad: LatticeDrive = { ...drive, segments: [{ label: 'pump', duration: 1, terms: [hop(0, 5, [0], 1)] }] };
    expect(() => blochHamiltonian(bad, [0], 0)).toThrow('blochHamiltonian: segment 0 ("pump"), term 0: state index out of range (from 0, to 5; the model has 2 states)');
    const complexOnsite: LatticeDrive = { ...drive, segments: [{ duration: 1, terms: [hop(1, 1, [0], 1, 0.5)] }] };
    expect(() => blochHamiltonian(complexOnsite, [0], 0)).toThrow('blochHamiltonian: segment 0, term 0: an onsite amplitude must be real (imaginary part 0.5)');
  });
});
