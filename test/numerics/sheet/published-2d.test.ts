/**
 * The 2D engine against published results. Values are from memory of the cited
 * papers (the formulas are re-derived or solved in the tests where possible).
 */
import { describe, expect, it } from 'vitest';
import type { LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import { FloquetSampler, sampleQuasienergyGrid } from '../../../src/numerics/quasienergy-bands.ts';
import { bandGroups, findGaps, orderFromCut } from '../../../src/numerics/sheet/gaps.ts';
import { chernNumber } from '../../../src/numerics/sheet/chern-fhs.ts';
import { ribbonSpectrum } from '../../../src/numerics/sheet/ribbon.ts';
import { countEdgeModes } from '../../../src/numerics/sheet/edge-modes.ts';
import { analyseSheet } from '../../../src/numerics/sheet/sheet-analysis.ts';
import { gapWindingNumbers } from '../../../src/numerics/sheet/winding/gap-winding.ts';
import { qwzDrive } from '../../support/drives/qwz.ts';
import { haldaneDrive } from '../../support/drives/haldane.ts';
import { hofstadterDrive } from '../../support/drives/hofstadter.ts';
import { checkerboardDrive } from '../../support/drives/checkerboard.ts';

/** Chern numbers of the band groups counted upward from the gap at π/T, with their gap labels. */
function bandCherns(drive: LatticeDrive, grid = 10): { cherns: number[]; labels: number[] } {
  const sampler = new FloquetSampler(drive);
  const data = sampleQuasienergyGrid(sampler, [grid, grid]);
  const ordered = orderFromCut(findGaps(sampler, data));
  const groups = bandGroups(data, ordered);
  const cherns = groups.map((g) => {
    const c = chernNumber(sampler, g.gapBelow, g.gapAbove, g.branches);
    if (!c.converged) expect.fail(`Chern number of group ${g.index} not converged: ${c.caveat}`);
    if (c.residual > 1e-9) expect.fail(`lattice sum ${c.raw} is not an integer within 1e-9`);
    return c.nearest + 0;
  });
  return { cherns, labels: ordered.map((g) => g.label) };
}

describe('Qi–Wu–Zhang model (Qi, Wu, Zhang, PRB 74, 085308 (2006))', () => {
  it('has |C| = 1 for 0 < |m| < 2 and 0 for |m| > 2, the sign flipping at m = 0; lower band C = +1 at m = 1', () => {
    const lower = new Map<number, number>();
    for (const m of [-3, -1.5, -0.5, 0.5, 1, 1.5, 3]) {
      const { cherns } = bandCherns(qwzDrive(m));
      expect(cherns.length).toBe(2);
      expect(cherns[0] + cherns[1]).toBe(0);
      expect(Math.abs(cherns[0])).toBe(Math.abs(m) < 2 ? 1 : 0);
      lower.set(m, cherns[0]);
    }
    // Sign flip between −2 < m < 0 and 0 < m < 2 (the paper's phase diagram), and our anchor at m = 1.
    for (const m of [0.5, 1.5]) expect(lower.get(-m)).toBe(-lower.get(m)!);
    expect(lower.get(1)).toBe(1);
  });
});

describe('Haldane model (Haldane, PRL 61, 2015 (1988))', () => {
  it('has C = ±1 inside |M| < 3√3 |t₂ sin φ| and 0 outside; φ → −φ flips the sign', () => {
    for (const { phi, mass } of [
      { phi: Math.PI / 2, mass: 0 },
      { phi: Math.PI / 2, mass: 0.5 },
      { phi: Math.PI / 2, mass: 1.0 },
      { phi: Math.PI / 6, mass: 0.3 },
      { phi: Math.PI / 6, mass: 0.5 },
    ]) {
      const t2 = 0.15;
      const inside = Math.abs(mass) < 3 * Math.sqrt(3) * Math.abs(t2 * Math.sin(phi));
      const plus = bandCherns(haldaneDrive({ t1: 1, t2, phi, mass })).cherns[0];
      const minus = bandCherns(haldaneDrive({ t1: 1, t2, phi: -phi, mass })).cherns[0];
      expect({ phi, mass, c: Math.abs(plus) }).toEqual({ phi, mass, c: inside ? 1 : 0 });
      expect(minus + 0).toBe(-plus + 0);
    }
  });
});

/**
 * TKNN (Thouless, Kohmoto, Nightingale, den Nijs, PRL 49, 405 (1982)): with flux p/q, the Hall integer
 * σ_r of the r-th gap solves r = q s_r + p σ_r with |σ_r| ≤ q/2; band r has C = σ_r − σ_{r−1}.
 */
function tknnBandCherns(p: number, q: number): number[] {
  const sigma = [0];
  for (let r = 1; r < q; r++) {
    let found: number | undefined;
    for (let s = -q; s <= q && found === undefined; s++) {
      const rest = r - q * s;
      if (rest % p === 0 && Math.abs(rest / p) <= q / 2) found = rest / p;
    }
    if (found === undefined) throw new Error(`no solution of ${r} = ${q}s + ${p}σ`);
    sigma.push(found);
  }
  sigma.push(0);
  return Array.from({ length: q }, (_, r) => sigma[r + 1] - sigma[r]);
}

describe('Hofstadter model (TKNN, PRL 49, 405 (1982))', () => {
  for (const q of [3, 5]) {
    it(`gives the Diophantine band Chern numbers at flux 1/${q} up to one overall sign, all flipped by reversing the flux`, () => {
      const expected = tknnBandCherns(1, q);
      const forward = bandCherns(hofstadterDrive({ p: 1, q })).cherns;
      const backward = bandCherns(hofstadterDrive({ p: -1, q })).cherns;
      const sign = forward[0] === expected[0] ? 1 : -1;
      expect(forward).toEqual(expected.map((c) => sign * c + 0));
      expect(backward).toEqual(forward.map((c) => -c + 0));
    });
  }
});

describe('static models run as drives (Rudner, Lindner, Berg, Levin, PRX 3, 031005 (2013))', () => {
  it('have W = 0 in the gap at π/T and W = Σ C of the bands below in the other gaps', () => {
    for (const drive of [qwzDrive(1), hofstadterDrive({ p: 1, q: 3 })]) {
      const { cherns, labels } = bandCherns(drive);
      const windings = gapWindingNumbers(drive, labels);
      let below = 0;
      labels.forEach((label, i) => {
        const w = windings[i].winding;
        expect(w.converged).toBe(true);
        expect({ label, w: w.nearest + 0 }).toEqual({ label, w: below });
        below += cherns[i];
      });
    }
  });
});

describe('ribbon of the QWZ model at m = 1', () => {
  it('carries one chiral mode per edge, opposite on the two edges, with count = ±C of the lower band', () => {
    const c = bandCherns(qwzDrive(1)).cherns[0];
    for (const finiteDirection of [0, 1]) {
      const ribbon = ribbonSpectrum(qwzDrive(1), { finiteDirection, width: 14, momenta: 48 });
      const [low, high] = countEdgeModes(ribbon, { label: 0, lower: -0.1, upper: 0.1 }, 1);
      expect([low.settled, high.settled]).toEqual([true, true]);
      expect(Math.abs(low.count!)).toBe(Math.abs(c));
      expect(high.count).toBe(-low.count!);
      // Sign relation derived in docs/conventions.md: finite along a₁ the low edge counts −C, along a₂ +C.
      expect(low.count).toBe(finiteDirection === 0 ? -c : c);
    }
  });
});

describe('gauge invariance of the Chern number', () => {
  const base = () => qwzDrive(0.7);

  it('is unchanged when an orbital is moved by a lattice vector with its offsets adjusted', () => {
    // Orbital 1 of cell R is relabelled as belonging to cell R − e₁ (position + a₁): a hop into it
    // gets offset n − e₁, a hop out of it offset n + e₁; Cartesian hop vectors are unchanged.
    const moved = base();
    moved.states[1].position = [moved.states[1].position[0] + 1, moved.states[1].position[1]];
    for (const term of moved.segments[0].terms) {
      const shift = (term.to === 1 ? -1 : 0) + (term.from === 1 ? 1 : 0);
      term.offset = [term.offset[0] + shift, term.offset[1]];
    }
    expect(bandCherns(moved).cherns).toEqual(bandCherns(base()).cherns);
  });

  it('is unchanged when orbitals are relabelled or the lattice vectors are given in left-handed order', () => {
    const swapped = base();
    swapped.states.reverse();
    for (const term of swapped.segments[0].terms) [term.from, term.to] = [1 - term.from, 1 - term.to];
    expect(bandCherns(swapped).cherns).toEqual(bandCherns(base()).cherns);
    const leftHanded = base();
    leftHanded.latticeVectors.reverse();
    for (const term of leftHanded.segments[0].terms) term.offset = [term.offset[1], term.offset[0]];
    expect(bandCherns(leftHanded).cherns).toEqual(bandCherns(base()).cherns);
  });
});

describe('five-step checkerboard drive at full transfer (Rudner, Lindner, Berg, Levin, PRX 3, 031005 (2013))', () => {
  it('has C = 0 for every band and one chiral mode per gap on each edge, running the same way in both gaps', () => {
    const drive = checkerboardDrive({ hopping: Math.PI / 2, offset: 0.5, stepDuration: 1 });
    const p = analyseSheet(drive, { grid: [10, 10], ribbon: { width: 10, momenta: 48 } });
    expect(p.bands.map((b) => (b.chern?.nearest ?? NaN) + 0)).toEqual([0, 0]);
    expect(p.windings.map((w) => Math.abs(w.winding.nearest))).toEqual([1, 1]);
    for (const ribbon of p.ribbons) {
      for (const edge of ['low', 'high'] as const) {
        const counts = ribbon.counts.filter((c) => c.edge === edge).map((c) => c.count);
        expect(counts.length).toBe(2);
        expect(Math.abs(counts[0]!)).toBe(1);
        expect(counts[1]).toBe(counts[0]);
      }
    }
    expect(p.consistency.filter((c) => !c.holds)).toEqual([]);
  });
});
