/**
 * Workload: (ν₀, ν_π) of the two-step chain on an N×N grid of (θ₁, θ₂) ∈ (0, π)²
 * (a phase diagram; N = 201 by default, CHAIN_GRID overrides). Prints one JSON
 * line: wall time, points per second, and the phase counts, which the numpy
 * twin (bench/numpy/chain-phase-diagram.py) reproduces.
 */
import { fromArrays } from '../../src/numerics/linalg/complex-matrix.ts';
import { chiralInvariants } from '../../src/numerics/chain/chiral-winding.ts';
import { twoStepChain } from '../../test/support/drives/chains.ts';

const n = Number(process.env.CHAIN_GRID ?? 201);
const gamma = fromArrays([[1, 0], [0, -1]]);
const counts: Record<string, number> = {};
let unsettled = 0;
const start = performance.now();
for (let i = 0; i < n; i++) {
  for (let j = 0; j < n; j++) {
    const t1 = ((i + 0.5) / n) * Math.PI, t2 = ((j + 0.5) / n) * Math.PI;
    const r = chiralInvariants(twoStepChain(t1, t2), gamma);
    if (!r.zero?.converged || !r.pi?.converged) {
      unsettled++;
      continue;
    }
    const key = `${Math.abs(r.zero.nearest)},${Math.abs(r.pi.nearest)}`;
    counts[key] = (counts[key] ?? 0) + 1;
  }
}
const seconds = (performance.now() - start) / 1000;
console.log(JSON.stringify({ workload: 'chain-phase-diagram', grid: [n, n], seconds, pointsPerSecond: (n * n) / seconds, phases: counts, unsettled }));
