/**
 * Workload: gap winding numbers across gaps from 10⁻³ down to 10⁻⁴ π/T, as a
 * model that lowers numerics.tolerances.gap to 10⁻⁴ would request them: the
 * certified lower bound of the gap (src/numerics/sheet/gaps.ts, decided against
 * half the gap) and W at the default tolerance 10⁻⁶. Drives: the Qi–Wu–Zhang
 * sheet (T = 0.5) at m = 2 ∓ δ, direct gap 2δT/π, W = 1 below the transition and
 * 0 above (Qi, Wu, Zhang, PRB 74, 085308 (2006)); the circularly driven honeycomb
 * at ω = 8t with A₀ chosen for a gap 9A₀²/ω² π/T at K (first-order
 * high-frequency estimate), W = 1 (test/catalogue/verify/gap-bound-fixtures.test.ts).
 */
import type { LatticeDrive } from '../../src/numerics/evolution/drive.ts';
import { gapWindingNumbers } from '../../src/numerics/sheet/winding/gap-winding.ts';
import { FloquetSampler, sampleQuasienergyGrid } from '../../src/numerics/quasienergy-bands.ts';
import { findGaps } from '../../src/numerics/sheet/gaps.ts';
import { circularHoneycombDrive } from '../../test/support/drives/honeycomb.ts';
import { qwzDrive } from '../../test/support/drives/qwz.ts';
import { measure } from '../measure.ts';

const cases: { name: string; gap: number; drive: LatticeDrive; expected: number }[] = [];
for (const gap of [1e-3, 3e-4, 1e-4]) {
  const delta = (gap * Math.PI) / (2 * 0.5);
  cases.push({ name: `Qi–Wu–Zhang m = 2 − ${delta.toExponential(2)}`, gap, drive: qwzDrive(2 - delta, 0.5), expected: 1 });
  cases.push({ name: `Qi–Wu–Zhang m = 2 + ${delta.toExponential(2)}`, gap, drive: qwzDrive(2 + delta, 0.5), expected: 0 });
  const a0 = Math.sqrt((gap * 64) / 9);
  cases.push({ name: `circular honeycomb ω = 8t, A₀ = ${a0.toFixed(4)}`, gap, drive: circularHoneycombDrive({ hopping: 1, amplitude: a0, frequency: 8 }), expected: 1 });
}

await measure('winding-small-gaps', () =>
  cases.map(({ name, gap: nominal, drive, expected }) => {
    const t0 = performance.now();
    const sampler = new FloquetSampler(drive);
    const gap = findGaps(sampler, sampleQuasienergyGrid(sampler, [24, 24]), { labels: [0, 1], gapTolerance: nominal / 2 }).find((g) => g.label === 0)!;
    const t1 = performance.now();
    const [report] = gapWindingNumbers(drive, [0]);
    const t2 = performance.now();
    return {
      model: name,
      nominalGap: nominal,
      minimalGap: gap.minimalGap,
      certifiedLowerBound: gap.certified?.lower ?? null,
      gapOpen: gap.open,
      expected,
      raw: report.winding.raw,
      distanceFromExpected: Math.abs(report.winding.raw - expected),
      converged: report.winding.converged,
      evaluations: report.quadrature?.evaluations ?? null,
      errorEstimate: report.quadrature?.errorEstimate ?? null,
      gapSeconds: (t1 - t0) / 1000,
      windingSeconds: (t2 - t1) / 1000,
      settledCorrectly: gap.open && report.winding.converged && report.winding.nearest === expected,
    };
  }),
);
