import { describe, expect, it } from 'vitest';
import { bandGroups, directGapAt, findGaps, groupColumns, orderFromCut } from '../../../src/numerics/sheet/gaps.ts';
import { FloquetSampler, sampleQuasienergyGrid } from '../../../src/numerics/quasienergy-bands.ts';
import type { LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import { qwzDrive } from '../../support/drives/qwz.ts';
import { hofstadterDrive } from '../../support/drives/hofstadter.ts';
import { staticDrive } from '../../support/drives/static.ts';

function expectWithin(label: string, actual: number, expected: number, tolerance: number): void {
  const delta = Math.abs(actual - expected);
  if (!(delta <= tolerance)) expect.fail(`${label}: actual ${actual}, expected ${expected}, |Δ| ${delta.toExponential(2)} > tolerance ${tolerance.toExponential(2)}`);
}

/** QWZ with a constant vector potential A, which moves the Dirac point off every grid. */
function shiftedQwz(m: number, shift: [number, number]): LatticeDrive {
  const drive = qwzDrive(m);
  drive.segments[0].vectorPotential = [{ amplitude: shift, harmonic: 0, phase: 0 }];
  return drive;
}

describe('findGaps', () => {
  it('does not mistake the space between samples of a steep band for a gap', () => {
    // One band ε = −2cos k_x (hopping −1 along x): on a 4-point grid the samples are ±2 and 0, leaving
    // empty arcs inside the band; only the arc outside [−2, 2] (through π/T) is a gap.
    const drive = staticDrive(
      { latticeVectors: [[1, 0], [0, 1]], states: [{ label: 's', position: [0, 0], charge: 1 }], hoppings: [{ from: 0, to: 0, offset: [1, 0], amplitude: -1 }] },
      1,
    );
    const sampler = new FloquetSampler(drive);
    const gaps = findGaps(sampler, sampleQuasienergyGrid(sampler, [4, 4]));
    expect(gaps.length).toBe(1);
    const edge = 2 / Math.PI; // energy 2 at T = 1, in units of π/T
    expectWithin('label', gaps[0].label, 1, 1e-12);
    expectWithin('lower edge', gaps[0].lower, edge, 1e-12);
    expectWithin('upper edge', gaps[0].upper, -edge, 1e-12);
    // With a single band, the eigenvalues bounding the gap at each k are the same one: the direct gap is the whole circle, 2.
    expectWithin('direct gap', gaps[0].minimalGap, 2, 1e-12);
  });

  it('finds a near-closing between grid points by local refinement (QWZ, m = 2 − η, shifted Dirac point)', () => {
    // Analytic: at m = 2 − η the gap at 0 is 2|m − 2| = 2η in energy, at k = (π, π) − A; in units π/T: 2ηT/π.
    const eta = 0.01;
    const drive = shiftedQwz(2 - eta, [0.37, 0.61]);
    const sampler = new FloquetSampler(drive);
    const data = sampleQuasienergyGrid(sampler, [8, 8]);
    const gap = findGaps(sampler, data, { gapTolerance: 1e-3 }).find((g) => Math.abs(g.label) < 0.5)!;
    const exact = (2 * eta * drive.period) / Math.PI;
    const onGrid = Math.min(...data.samples.map((s) => directGapAt(s.quasienergies, gap.label)));
    expect(onGrid).toBeGreaterThan(5 * exact); // the grid alone misses it
    expectWithin('refined minimal gap', gap.minimalGap, exact, 0.02 * exact);
    // The Peierls factor e^{iA·d} and the Bloch factor e^{−ik·d} combine to e^{−i(k − A)·d}, so H_A(k) = H(k − A):
    // the Dirac point of the gap at 0 moves from (π, π) to (π, π) + A.
    const where = [0.5 + 0.37 / (2 * Math.PI), 0.5 + 0.61 / (2 * Math.PI)];
    expectWithin('s1 at minimum', gap.momentumAtMinimum[0], where[0], 2e-3);
    expectWithin('s2 at minimum', gap.momentumAtMinimum[1], where[1], 2e-3);
    expect(gap.open).toBe(true);
    expect(findGaps(sampler, data, { gapTolerance: 2 * exact }).find((g) => Math.abs(g.label) < 0.5)!.open).toBe(false);
  });

  it('names a gap by a claimed label inside it, else by the middle of the arc', () => {
    const sampler = new FloquetSampler(qwzDrive(1));
    const data = sampleQuasienergyGrid(sampler, [6, 6]);
    const labels = findGaps(sampler, data, { labels: [0.05] }).map((g) => g.label).sort();
    expect(labels[0]).toBe(0.05);
    expectWithin('π gap label', labels[1], 1, 1e-12);
  });
});

describe('band groups', () => {
  it('orders Hofstadter p/q = 1/3 bands upward from the π gap, one branch each', () => {
    const sampler = new FloquetSampler(hofstadterDrive({ p: 1, q: 3 }));
    const data = sampleQuasienergyGrid(sampler, [6, 6]);
    const ordered = orderFromCut(findGaps(sampler, data));
    expect(ordered.length).toBe(3);
    expectWithin('cut gap', ordered[0].label, 1, 1e-12);
    const groups = bandGroups(data, ordered);
    expect(groups.map((g) => g.branches)).toEqual([1, 1, 1]);
    expect(groups.every((g) => g.consistent && !g.touching)).toBe(true);
    // The lowest band lies below the middle one: ranges increase upward from the cut.
    expect(groups[0].range[1]).toBeLessThan(groups[1].range[0]);
  });

  it('groups degenerate bands and flags them as touching (two uncoupled QWZ copies)', () => {
    const one = qwzDrive(1);
    const terms = one.segments[0].terms;
    const drive: LatticeDrive = {
      ...one,
      states: [...one.states, ...one.states.map((s) => ({ ...s, label: `${s.label}'` }))],
      segments: [{ duration: one.period, terms: [...terms, ...terms.map((t) => ({ ...t, from: t.from + 2, to: t.to + 2 }))] }],
    };
    const sampler = new FloquetSampler(drive);
    const data = sampleQuasienergyGrid(sampler, [6, 6]);
    const groups = bandGroups(data, orderFromCut(findGaps(sampler, data)));
    expect(groups.map((g) => g.branches)).toEqual([2, 2]);
    expect(groups.every((g) => g.touching)).toBe(true);
    expectWithin('internal gap of degenerate copies', groups[0].minimalInternalGap, 0, 1e-10);
  });

  it('selects the columns between two gap labels counter-clockwise, through π when needed', () => {
    const values = Float64Array.from([-0.9, -0.2, 0.3, 0.95]);
    expect(groupColumns(values, 0.5, 0)).toEqual([0, 1, 3]);
    expect(groupColumns(values, 0, 0.5)).toEqual([2]);
    expect(groupColumns(values, 0.5, 0.5)).toEqual([0, 1, 2, 3]);
    expect(groupColumns(values, null, null)).toEqual([0, 1, 2, 3]);
  });
});
