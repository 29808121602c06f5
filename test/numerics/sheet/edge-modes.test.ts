import { describe, expect, it } from 'vitest';
import { countEdgeModes, fitDecayLength } from '../../../src/numerics/sheet/edge-modes.ts';
import { ribbonSpectrum } from '../../../src/numerics/sheet/ribbon.ts';
import { qwzDrive } from '../../support/drives/qwz.ts';

function expectWithin(label: string, actual: number, expected: number, tolerance: number): void {
  const delta = Math.abs(actual - expected);
  if (!(delta <= tolerance)) expect.fail(`${label}: actual ${actual}, expected ${expected}, |Δ| ${delta.toExponential(2)} > tolerance ${tolerance.toExponential(2)}`);
}

/** The gap at 0 of a static QWZ model, as an arc well inside the bulk gap (units π/T). */
const gapAtZero = { label: 0, lower: -0.1, upper: 0.1 };

describe('fitDecayLength', () => {
  it('recovers ξ from |ψ_j|² ∝ e^{−2j/ξ}, also under a cell-to-cell oscillation', () => {
    for (const xi of [0.8, 2.5, 6]) {
      const w = Float64Array.from({ length: 40 }, (_, j) => Math.exp((-2 * j) / xi));
      expectWithin(`low edge ξ = ${xi}`, fitDecayLength(w, 'low'), xi, 1e-9 * xi);
      expectWithin(`high edge ξ = ${xi}`, fitDecayLength(w.slice().reverse(), 'high'), xi, 1e-9 * xi);
      // cos² modulation: the envelope fit stays within 25 % (the envelope is a staircase of the true decay).
      const wiggly = w.map((x, j) => x * (0.2 + Math.cos(j * 1.3) ** 2));
      expectWithin(`oscillating ξ = ${xi}`, fitDecayLength(wiggly, 'low'), xi, 0.25 * xi);
    }
  });

  it('reports an unbounded decay length for a flat profile and a tiny one for a state in one cell', () => {
    expect(fitDecayLength(new Float64Array(20).fill(0.05), 'low')).toBe(Infinity);
    const single = new Float64Array(20);
    single[0] = 1;
    expect(fitDecayLength(single, 'low')).toBeLessThan(0.1);
  });
});

describe('countEdgeModes on QWZ ribbons', () => {
  // Derivation in docs/conventions.md: for a ribbon finite along a₁ the high edge counts +C(bands below),
  // the low edge −C; finite along a₂ the signs swap. The lower QWZ band has C = +1 for 0 < m < 2.
  it('counts one mode per edge with opposite signs, low = −1 along a₁ and +1 along a₂ (m = 1)', () => {
    const along1 = countEdgeModes(ribbonSpectrum(qwzDrive(1), { finiteDirection: 0, width: 14, momenta: 48 }), gapAtZero, 1);
    expect(along1.map((r) => [r.edge, r.count, r.settled])).toEqual([['low', -1, true], ['high', 1, true]]);
    expect(along1[0].crossings.length).toBe(1);
    // The crossing is where the analytic edge state ε = sin k_y vanishes, k_y = π.
    expectWithin('crossing momentum', along1[0].crossings[0].momentum, 0.5, 1 / 48);
    const along2 = countEdgeModes(ribbonSpectrum(qwzDrive(1), { finiteDirection: 1, width: 14, momenta: 48 }), gapAtZero, 1);
    expect(along2.map((r) => r.count)).toEqual([1, -1]);
  });

  it('flips the counts when the Chern number flips (m = −1) and counts zero in a trivial gap (m = 3)', () => {
    const flipped = countEdgeModes(ribbonSpectrum(qwzDrive(-1), { width: 14, momenta: 48 }), gapAtZero, 1);
    expect(flipped.map((r) => r.count)).toEqual([1, -1]);
    const trivial = countEdgeModes(ribbonSpectrum(qwzDrive(3), { width: 14, momenta: 48 }), gapAtZero, 0.5);
    expect(trivial.map((r) => [r.count, r.crossings.length])).toEqual([[0, 0], [0, 0]]);
    expectWithin('decay length falls back to the bulk estimate', trivial[0].decayLength, 0.5, 0);
  });

  it('refuses to count on a ribbon narrower than six decay lengths, and says why', () => {
    // m = 1.8: the edge state decays as |m + cos k_y|^j, slowly near the gap edges.
    const [low, high] = countEdgeModes(ribbonSpectrum(qwzDrive(1.8), { width: 6, momenta: 48 }), { label: 0, lower: -0.02, upper: 0.02 }, 3);
    expect(low.settled).toBe(false);
    expect(low.count).toBeNull();
    expect(high.count).toBeNull();
    expect(low.reason).toMatch(/narrower than 6 decay lengths/);
  });

  it('refuses to count without crossings when no bulk decay estimate is given', () => {
    const [low] = countEdgeModes(ribbonSpectrum(qwzDrive(3), { width: 8, momenta: 16 }), gapAtZero);
    expect(low.settled).toBe(false);
    expect(low.reason).toMatch(/no state crosses the gap and no bulk estimate/);
  });
});
