/**
 * Workload: Rudner–Lindner–Berg–Levin winding numbers in both gaps (0 and π)
 * of the five-step checkerboard drive at Jτ = 0.4π, Δτ = 0.3 (τ = 1), refined
 * until |W − round W| ≤ 10⁻³ on two successive grids.
 */
import { gapWindingNumbers } from '../../src/numerics/sheet/winding/gap-winding.ts';
import { checkerboardDrive } from '../../test/support/drives/checkerboard.ts';
import { measure } from '../measure.ts';

await measure('gap-winding', () => {
  const drive = checkerboardDrive({ hopping: 0.4 * Math.PI, offset: 0.3, stepDuration: 1 });
  return gapWindingNumbers(drive, [0, 1], { tolerance: 1e-3 }).map((r) => ({
    gap: r.gap,
    winding: r.winding.nearest,
    raw: r.winding.raw,
    converged: r.winding.converged,
    grids: r.winding.history.map((h) => h.grid),
  }));
});
