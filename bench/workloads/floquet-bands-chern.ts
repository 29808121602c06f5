/**
 * Workload: quasienergy bands of the five-step checkerboard drive at Jτ = π/2,
 * Δτ = 0.5 (τ = 1) on a 100 × 100 momentum grid, and the Fukui–Hatsugai–Suzuki
 * Chern number of each of the two bands on that grid.
 */
import { FloquetSampler, sampleQuasienergyGrid } from '../../src/numerics/quasienergy-bands.ts';
import { fhsFieldStrength, latticeOrientation, selectColumns } from '../../src/numerics/sheet/chern-fhs.ts';
import { groupColumns } from '../../src/numerics/sheet/gaps.ts';
import { checkerboardDrive } from '../../test/support/drives/checkerboard.ts';
import { measure } from '../measure.ts';

await measure('floquet-bands-chern', () => {
  const drive = checkerboardDrive({ hopping: Math.PI / 2, offset: 0.5, stepDuration: 1 });
  const n = 100;
  const data = sampleQuasienergyGrid(new FloquetSampler(drive), [n, n]);
  const bands = [
    [1, 0],
    [0, 1],
  ].map(([lower, upper]) => {
    const frames = data.samples.map((sample) => selectColumns(sample.vectors, groupColumns(sample.quasienergies, lower, upper)));
    const field = fhsFieldStrength(frames, n, n);
    return { between: [lower, upper], chern: field.raw * latticeOrientation(drive), maxFlux: field.maxFlux };
  });
  let lowest = Infinity, highest = -Infinity;
  for (const s of data.samples) for (const q of s.quasienergies) [lowest, highest] = [Math.min(lowest, q), Math.max(highest, q)];
  return { grid: [n, n], quasienergyRange: [lowest, highest], bands };
});
