import { describe, expect, it } from 'vitest';
import { phaseWinding } from '../../../src/numerics/chain/phase-winding.ts';

describe('phaseWinding', () => {
  it.each([-3, -1, 0, 1, 2, 5])('counts the winding %i of (1.5 + cos 2πs)·e^{2πi m s} (analytic)', (m) => {
    const f = (s: number) => {
      const r = 1.5 + Math.cos(2 * Math.PI * s);
      return { re: r * Math.cos(2 * Math.PI * m * s), im: r * Math.sin(2 * Math.PI * m * s) };
    };
    const out = phaseWinding(f);
    expect(out.winding.nearest).toBe(m);
    expect(out.winding.residual).toBeLessThanOrEqual(1e-9);
    expect(out.winding.converged).toBe(true);
    expect(out.maxStepPhase).toBeLessThan(Math.PI / 4);
  });

  it('refines a fast phase change: z(s) = e^{2πis} − 0.98 winds once with most phase near s = 0', () => {
    // Argument principle: the loop e^{2πis} encloses the zero at 0.98 once.
    const out = phaseWinding((s) => ({ re: Math.cos(2 * Math.PI * s) - 0.98, im: Math.sin(2 * Math.PI * s) }));
    expect(out.winding.nearest).toBe(1);
    expect(out.points).toBeGreaterThan(32);
    expect(out.maxStepPhase).toBeLessThan(Math.PI / 4);
  });

  it('flags a loop through a zero instead of returning a number silently', () => {
    const out = phaseWinding((s) => ({ re: Math.cos(2 * Math.PI * s) - 1, im: Math.sin(2 * Math.PI * s) }));
    expect(out.winding.converged).toBe(false);
    expect(out.winding.caveat).toMatch(/nearly vanishes at s = 0\.000000/);
  });
});
