/**
 * Edge counts on ribbons by the two routes (every state at every momentum, or
 * only the states near each label by shift-invert on band matrices), and the
 * width the engine chooses. Expected counts come from outside this code:
 *  - Qi–Wu–Zhang (PRB 74, 085308 (2006)), lower band C = +1 for 0 < m < 2, −1 for
 *    −2 < m < 0, 0 for |m| > 2 (from memory; our sign anchor, docs/conventions.md);
 *    edge counts follow the table of docs/conventions.md (finite along a₁: low = −C,
 *    high = +C in the gap above the lower band; a₂: swapped), 0 in the gap at π/T.
 *  - Haldane (PRL 61, 2015 (1988)): |C| = 1 when |M| < 3√3|t₂ sin φ| (from memory).
 *  - Five-step checkerboard drive at full transfer (Rudner, Lindner, Berg, Levin,
 *    PRX 3, 031005 (2013), from memory): one chiral mode per gap on each edge.
 *  - Three-step honeycomb drive near full transfer (Kitagawa, Berg, Rudner, Demler,
 *    PRB 82, 235114 (2010), from memory): chiral modes in both gaps.
 * Both routes must give identical counts on every model; the values must match the above.
 */
import { describe, expect, it } from 'vitest';
import type { LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import { analyseSheet } from '../../../src/numerics/sheet/sheet-analysis.ts';
import { ribbonEdgeCounts } from '../../../src/numerics/sheet/ribbon-edge-counts.ts';
import { bulkDecayLength } from '../../../src/numerics/sheet/sheet-analysis.ts';
import { FloquetSampler, sampleQuasienergyGrid } from '../../../src/numerics/quasienergy-bands.ts';
import { qwzDrive } from '../../support/drives/qwz.ts';
import { haldaneDrive } from '../../support/drives/haldane.ts';
import { checkerboardDrive } from '../../support/drives/checkerboard.ts';
import { circularHoneycombDrive, threeStepHoneycombDrive } from '../../support/drives/honeycomb.ts';

function gapsOf(drive: LatticeDrive) {
  const p = analyseSheet(drive, { run: { chern: false, winding: false, edges: false }, grid: [24, 24] });
  const data = sampleQuasienergyGrid(new FloquetSampler(drive), [24, 24]);
  const ordered = p.gaps.filter((g) => g.open).sort((a, b) => a.label - b.label);
  return (f: number) => ordered.map((arc) => ({ arc, bulkDecayLength: bulkDecayLength(data, arc, f) }));
}

/** Counts as { label: [low, high] } (null when unsettled) on a ribbon of fixed width by one route. */
function counts(drive: LatticeDrive, f: number, width: number, route: 'dense' | 'banded', momenta?: number) {
  const r = ribbonEdgeCounts(drive, gapsOf(drive)(f), { finiteDirection: f, width, maxWidth: width, denseStates: route === 'dense' ? Infinity : 0, ...(momenta ? { momenta } : {}) });
  expect(r.route).toBe(route);
  expect(r.width).toBe(width);
  const out: Record<string, [number | null, number | null]> = {};
  for (const c of r.counts) {
    const key = c.gap.toFixed(3);
    out[key] ??= [null, null];
    out[key][c.edge === 'low' ? 0 : 1] = c.count;
  }
  return out;
}

// Half the QWZ ribbon's width: the period 0.5 keeps the static spectrum inside one quasienergy zone.
const models: { name: string; drive: LatticeDrive; width: number; expected: (f: number) => Record<string, [number, number]> }[] = [
  { name: 'QWZ m = 1', drive: qwzDrive(1, 0.5), width: 14, expected: (f) => ({ '0.000': f === 0 ? [-1, 1] : [1, -1], '1.000': [0, 0] }) },
  { name: 'QWZ m = −1', drive: qwzDrive(-1, 0.5), width: 14, expected: (f) => ({ '0.000': f === 0 ? [1, -1] : [-1, 1], '1.000': [0, 0] }) },
  { name: 'QWZ m = 3', drive: qwzDrive(3, 0.5), width: 14, expected: () => ({ '0.000': [0, 0], '1.000': [0, 0] }) },
  {
    name: 'checkerboard, full transfer',
    drive: checkerboardDrive({ hopping: Math.PI / 2, offset: 0.5, stepDuration: 1 }),
    width: 12,
    expected: (f) => ({ '0.000': f === 0 ? [-1, 1] : [1, -1], '1.000': f === 0 ? [-1, 1] : [1, -1] }),
  },
  {
    name: 'three-step honeycomb, Jτ = 0.45π',
    drive: threeStepHoneycombDrive({ hopping: 0.45 * Math.PI, stepDuration: 1, mass: 0.3 }),
    width: 16,
    expected: (f) => ({ '0.000': f === 0 ? [-1, 1] : [1, -1], '1.000': f === 0 ? [-1, 1] : [1, -1] }),
  },
];

describe('edge counts by the dense and the banded route', () => {
  for (const m of models) {
    it(`agree with each other and with the published counts: ${m.name}`, () => {
      for (const f of [0, 1]) {
        const dense = counts(m.drive, f, m.width, 'dense');
        const banded = counts(m.drive, f, m.width, 'banded');
        expect(banded, `finite along a${f + 1}`).toEqual(dense);
        expect(dense, `finite along a${f + 1}`).toEqual(m.expected(f));
      }
    });
  }

  it('agree on a Haldane ribbon (|C| = 1 inside the Haldane phase boundary) and on a step drive that needs the Chebyshev route', () => {
    // t₂ = 0.3, φ = π/2, M = 0.5 < 3√3·0.3: |C| = 1; static, period 0.5 keeps one quasienergy zone.
    const haldane = haldaneDrive({ t1: 1, t2: 0.3, phi: Math.PI / 2, mass: 0.5 }, 0.5);
    const dense = counts(haldane, 1, 14, 'dense');
    expect(counts(haldane, 1, 14, 'banded')).toEqual(dense);
    expect(Math.abs(dense['0.000'][0] as number)).toBe(1);
    // QWZ split into two half steps: each step's bond graph is connected, so its exponential is a
    // Chebyshev expansion (the same operator U = e^{−iHT}, hence the same counts as the static ribbon).
    const whole = qwzDrive(1, 0.5);
    const split: LatticeDrive = { ...whole, segments: [0, 1].map(() => ({ duration: 0.25, terms: whole.segments[0].terms })) };
    expect(counts(split, 0, 14, 'banded')).toEqual({ '0.000': [-1, 1], '1.000': [0, 0] });
  });

  it('agree on a time-dependent drive (circularly polarised light on the honeycomb lattice)', () => {
    // High frequency: a Haldane-like gap opens at ε = 0 with |C| = 1 (Oka & Aoki, PRB 79, 081406(R) (2009); from memory).
    const drive = circularHoneycombDrive({ hopping: 1, amplitude: 0.8, frequency: 8 });
    const dense = counts(drive, 1, 12, 'dense', 64);
    expect(counts(drive, 1, 12, 'banded', 32)).toEqual(dense);
    expect(Math.abs(dense['0.000'][0] as number)).toBe(1);
  });
});

describe('width chosen by the physics', () => {
  it('widens a ribbon that is too narrow for the decay length and reports the widths tried', () => {
    // QWZ at m = 1.9: the low-edge state crossing ε = 0 at k_y = π decays as |m + cos k_y|^{2j} = 0.9^{2j}
    // (ribbon.test.ts derives it), decay length ξ = −1/ln 0.9 ≈ 9.5 cells: the default 24-cell ribbon is too narrow.
    const drive = qwzDrive(1.9, 0.5);
    const gaps = gapsOf(drive)(0);
    const xi = -1 / Math.log(0.9);
    const narrow = ribbonEdgeCounts(drive, gaps, { finiteDirection: 0, width: 24, maxWidth: 24 });
    expect(narrow.counts.some((c) => !c.settled && /narrower than 6 decay lengths.*the width budget \(24 cells\) allows no wider ribbon/.test(c.reason ?? ''))).toBe(true);
    const wide = ribbonEdgeCounts(drive, gaps, { finiteDirection: 0, width: 24 });
    expect(wide.widths[0]).toBe(24);
    expect(wide.widths.length).toBeGreaterThan(1);
    expect(wide.counts.every((c) => c.settled)).toBe(true);
    expect(wide.width).toBeGreaterThanOrEqual(6 * xi);
    const crossing = wide.counts.find((c) => c.gap === 0 && c.edge === 'low')!;
    expect(Math.abs(crossing.decayLength - xi)).toBeLessThan(0.1 * xi);
    // C = +1 below the gap at 0 (0 < m < 2); finite along a₁: low −1, high +1; nothing crosses π/T.
    expect(wide.counts.map((c) => [c.gap.toFixed(0), c.edge, c.count])).toEqual([
      ['0', 'low', -1], ['0', 'high', 1], ['1', 'low', 0], ['1', 'high', 0],
    ]);
  });

  it('widens only for the gaps it is asked to settle', () => {
    // Same QWZ ribbon (ξ ≈ 9.5 cells at ε = 0): asked to settle only the π gap, whose counts are settled at
    // 24 cells, it keeps the starting width and leaves the gap at 0 unsettled; asked for the gap at 0 it widens.
    const drive = qwzDrive(1.9, 0.5);
    const gaps = gapsOf(drive)(0);
    const piOnly = ribbonEdgeCounts(drive, gaps, { finiteDirection: 0, width: 24, widenFor: [1] });
    expect(piOnly.widths).toEqual([24]);
    expect(piOnly.counts.some((c) => c.gap === 0 && !c.settled)).toBe(true);
    expect(piOnly.counts.every((c) => c.gap !== 0 || !/width budget/.test(c.reason ?? ''))).toBe(true);
    const zero = ribbonEdgeCounts(drive, gaps, { finiteDirection: 0, width: 24, widenFor: [0] });
    expect(zero.widths.length).toBeGreaterThan(1);
    expect(zero.counts.every((c) => c.settled)).toBe(true);
  });
});
