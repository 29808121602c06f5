/**
 * Branch and bound with a Lipschitz constant (certified-minimum.ts) on
 * functions whose minimum is known in closed form.
 */
import { describe, expect, it } from 'vitest';
import { certifiedMinimum } from '../../src/numerics/certified-minimum.ts';

/** A Dirac-like valley on the torus: f(s) = √(g² + v²|s − c|²), |·| the periodic distance; Lipschitz v per direction. */
function valley(g: number, v: number, centre: number[]) {
  return (s: number[]) => {
    let r2 = 0;
    for (let d = 0; d < s.length; d++) {
      const x = s[d] - centre[d];
      const w = x - Math.round(x);
      r2 += w * w;
    }
    return Math.sqrt(g * g + v * v * r2);
  };
}

function grid(n: number[], f: (s: number[]) => number) {
  const out = [];
  const total = n.reduce((a, b) => a * b, 1);
  for (let i = 0; i < total; i++) {
    const s = n.length === 1 ? [i / n[0]] : [Math.floor(i / n[1]) / n[0], (i % n[1]) / n[1]];
    out.push({ value: f(s) });
  }
  return out;
}

describe('certified lower bound of a minimum over the zone', () => {
  it('brackets the minimum g of a valley placed between grid points, above the decision level', () => {
    // Minimum g = 0.03 at an irrational point; on a 24² grid the nearest sample sees about √(g² + (v·h)²) ≫ g.
    const g = 0.03, v = 5, centre = [0.3141, 0.7071];
    const f = valley(g, v, centre);
    // |f(s) − f(s′)| ≤ v·‖s − s′‖₂ ≤ v·(|δ₁| + |δ₂|): Lipschitz constant v per direction.
    const r = certifiedMinimum({ evaluate: (s) => ({ value: f(s) }), lipschitz: [v, v], grid: [24, 24], initial: grid([24, 24], f), decisionLevel: 1e-3, relative: 0.1 });
    expect(r.status).toBe('above');
    expect(r.lower).toBeLessThanOrEqual(g);
    expect(r.best).toBeGreaterThanOrEqual(g);
    expect(r.lower).toBeGreaterThanOrEqual(0.9 * r.best);
    expect(r.best - g).toBeLessThan(0.1 * g);
  });

  it('reports a sample below the decision level', () => {
    const f = valley(2e-4, 3, [0.5, 0.25]);
    const r = certifiedMinimum({ evaluate: (s) => ({ value: f(s) }), lipschitz: [3, 3], grid: [16, 16], initial: grid([16, 16], f), decisionLevel: 1e-3 });
    expect(r.status).toBe('below');
    expect(r.best).toBeLessThanOrEqual(1e-3);
  });

  it('stops undecided within its budget when the minimum sits just above the decision level', () => {
    const f = valley(1.0001e-3, 4, [0.123, 0.456]);
    const r = certifiedMinimum({ evaluate: (s) => ({ value: f(s) }), lipschitz: [4, 4], grid: [8, 8], initial: grid([8, 8], f), decisionLevel: 1e-3, budget: 400 });
    expect(r.status).toBe('undecided');
    expect(r.evaluations).toBeLessThanOrEqual(400);
    expect(r.lower).toBeLessThanOrEqual(1e-3);
  });

  it('never bounds a cell whose guard may vanish: the guard is refined first', () => {
    // f is large everywhere, but the guard (distance of a label to a band) touches zero at s = 0.61:
    // the bound must stay undecided or below 0, never above.
    const f = () => 1;
    const guard = (s: number[]) => Math.abs(Math.sin(Math.PI * (s[0] - 0.61)));
    const r = certifiedMinimum({
      evaluate: (s) => ({ value: f(), guard: guard(s) }), lipschitz: [0.1], guardLipschitz: [Math.PI], grid: [10],
      initial: Array.from({ length: 10 }, (_, j) => ({ value: 1, guard: guard([j / 10]) })), decisionLevel: 1e-3, budget: 200,
    });
    expect(r.status).toBe('undecided');
    expect(r.lower).toBeLessThanOrEqual(0);
    expect(r.smallestGuard).toBeLessThan(0.01);
  });

  it('rejects inconsistent input with the reason', () => {
    expect(() => certifiedMinimum({ evaluate: () => ({ value: 1 }), lipschitz: [1], grid: [4, 4], initial: [], decisionLevel: 0 })).toThrow(/2 directions but 1 Lipschitz constants/);
  });
});
