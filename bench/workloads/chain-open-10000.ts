/**
 * Workload: end modes at 0 and π/T of an open two-step chain of 10,000 cells
 * (20,000 states) near the transition θ₁ = θ₂ (θ₁ = 0.7, θ₂ = 0.71): the zero
 * modes decay over about a hundred cells. The chain's Floquet operator is a band
 * matrix and only the states near 0 and π/T are computed (shift-invert with an
 * inertia count). No numpy twin: a dense 20,000 × 20,000 eigenproblem.
 */
import { openChainSpectrum } from '../../src/numerics/chain/open-chain.ts';
import { bulkGaps } from '../../src/numerics/chain/bulk-gaps.ts';
import { twoStepChain } from '../../test/support/drives/chains.ts';
import { measure } from '../measure.ts';

const cells = Number(process.env.CHAIN_CELLS ?? 10000);
const drive = twoStepChain(0.7, 0.71);
const bulk = bulkGaps(drive);
await measure('chain-open-10000', () => {
  const r = openChainSpectrum(drive, cells, { bulk });
  return {
    cells,
    states: 2 * cells,
    coverage: r.coverage,
    endModes: r.modes.map((m) => ({ label: m.label, low: m.low, high: m.high, settled: m.settled, lowDecayLength: m.lowFit?.length ?? null })),
    eigenResidual: r.eigenResidual,
  };
});
