/**
 * Workload: Floquet spectrum and end modes of an open two-step chain of L cells
 * (L = 400 by default, CHAIN_CELLS overrides) at (θ₁, θ₂) = (1.5, 2.0), the
 * (1, 1) phase. Prints one JSON line with wall time and the end-mode counts;
 * the numpy twin (bench/numpy/chain-open-spectrum.py) does the same.
 */
import { openChainSpectrum } from '../../src/numerics/chain/open-chain.ts';
import { bulkGaps } from '../../src/numerics/chain/bulk-gaps.ts';
import { twoStepChain } from '../../test/support/drives/chains.ts';

const cells = Number(process.env.CHAIN_CELLS ?? 400);
const drive = twoStepChain(1.5, 2.0);
const bulk = bulkGaps(drive);
const start = performance.now();
const r = openChainSpectrum(drive, cells, { bulk });
const seconds = (performance.now() - start) / 1000;
console.log(
  JSON.stringify({
    workload: 'chain-open-spectrum',
    cells,
    states: 2 * cells,
    seconds,
    endModes: r.modes.map((m) => ({ label: m.label, low: m.low, high: m.high })),
    eigenResidual: r.eigenResidual,
  }),
);
