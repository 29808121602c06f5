// High-symmetry points of two-dimensional Bravais lattices, checked against the
// textbook values (common practice; e.g. Ashcroft & Mermin, ch. 5): for lattice
// constant a, a square lattice has X at |k| = π/a and M at √2·π/a; a hexagonal
// (triangular) lattice has M at 2π/(√3 a) and K at 4π/(3a). The checks use the
// defining property of the zone (no reciprocal vector G is closer to a zone
// point than Γ) rather than our own output.
import { describe, expect, it } from 'vitest';
import { bravaisKind, brillouinZone, highSymmetryPath, reciprocalVectors, type Vec2 } from '../../../src/catalogue/records/brillouin-zone.ts';

function cartesian(s: Vec2, a1: Vec2, a2: Vec2): Vec2 {
  const [b1, b2] = reciprocalVectors(a1, a2);
  return [s[0] * b1[0] + s[1] * b2[0], s[0] * b1[1] + s[1] * b2[1]];
}
const length = (k: Vec2) => Math.hypot(k[0], k[1]);

describe('Bravais lattice types', () => {
  it('recognises square, hexagonal, rectangular, centred rectangular and oblique lattices whatever the basis', () => {
    expect(bravaisKind([1, 0], [0, 1])).toBe('square');
    expect(bravaisKind([1, 1], [-1, 1])).toBe('square');
    expect(bravaisKind([0, 1], [1, 0])).toBe('square'); // left-handed
    expect(bravaisKind([1, 0], [0.5, Math.sqrt(3) / 2])).toBe('hexagonal');
    expect(bravaisKind([1, 0], [-0.5, Math.sqrt(3) / 2])).toBe('hexagonal');
    expect(bravaisKind([1, 0], [1.5, Math.sqrt(3) / 2])).toBe('hexagonal'); // a non-reduced basis
    expect(bravaisKind([2, 0], [0, 1])).toBe('rectangular');
    expect(bravaisKind([1, 0.6], [1, -0.6])).toBe('centred-rectangular');
    expect(bravaisKind([1, 0], [0.3, 0.8])).toBe('oblique');
  });
});

describe('high-symmetry paths', () => {
  it('square lattice: Γ → X → M → Γ with X = b₁/2 and M = (b₁+b₂)/2', () => {
    const { kind, corners } = highSymmetryPath([1, 0], [0, 1]);
    expect(kind).toBe('square');
    expect(corners.map((c) => c.label)).toEqual(['Γ', 'X', 'M', 'Γ']);
    expect(corners[1].reduced).toEqual([0.5, 0]);
    expect(corners[2].reduced).toEqual([0.5, 0.5]);
  });

  it('hexagonal lattice: M at 2π/(√3 a) and K at 4π/(3a), in either handedness', () => {
    for (const [a1, a2] of [[[1, 0], [0.5, Math.sqrt(3) / 2]], [[0.5, Math.sqrt(3) / 2], [1, 0]]] as [Vec2, Vec2][]) {
      const { corners } = highSymmetryPath(a1, a2);
      expect(corners.map((c) => c.label)).toEqual(['Γ', 'M', 'K', 'Γ']);
      expect(length(cartesian(corners[1].reduced, a1, a2))).toBeCloseTo((2 * Math.PI) / Math.sqrt(3), 10);
      expect(length(cartesian(corners[2].reduced, a1, a2))).toBeCloseTo((4 * Math.PI) / 3, 10);
    }
  });

  it('rectangular lattice: Γ → X → S → Y → Γ', () => {
    const a1: Vec2 = [2, 0], a2: Vec2 = [0, 1];
    const { corners } = highSymmetryPath(a1, a2);
    expect(corners.map((c) => c.label)).toEqual(['Γ', 'X', 'S', 'Y', 'Γ']);
    const lengths = corners.slice(1, 4).map((c) => length(cartesian(c.reduced, a1, a2)));
    // X at π/2 (short reciprocal direction, |b₁|/2 = π/2), Y at π, S at the corner √(π²/4 + π²).
    expect(lengths[0]).toBeCloseTo(Math.PI / 2, 10);
    expect(lengths[1]).toBeCloseTo(Math.hypot(Math.PI / 2, Math.PI), 10);
    expect(lengths[2]).toBeCloseTo(Math.PI, 10);
  });

  it('zone vertices are equidistant from Γ and their nearest reciprocal vectors', () => {
    const a1: Vec2 = [1, 0], a2: Vec2 = [0.3, 0.8];
    const [b1, b2] = reciprocalVectors(a1, a2);
    for (const p of brillouinZone(a1, a2)) {
      let nearest = Infinity;
      for (let m = -3; m <= 3; m++) for (let n = -3; n <= 3; n++) {
        if (m === 0 && n === 0) continue;
        nearest = Math.min(nearest, Math.hypot(p[0] - m * b1[0] - n * b2[0], p[1] - m * b1[1] - n * b2[1]));
      }
      expect(nearest).toBeCloseTo(length(p), 9);
    }
  });
});
