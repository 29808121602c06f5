/**
 * Workload: Rudner–Lindner–Berg–Levin winding numbers by adaptive Gauss–Kronrod
 * quadrature (src/numerics/sheet/winding/), one gap per call, at the default
 * tolerance 10⁻⁶ and budget, on drives whose open gaps are all ≥ 0.01 π/T:
 * the five-step checkerboard (Jτ = 0.4π, Δτ = 0.3), the circularly driven
 * honeycomb with a 0.032 π/T gap at K (A₀ = 0.5, ω = 8t) and with W = −2 in its
 * π gap (A₀ = 1, ω = 4t), and the static Qi–Wu–Zhang sheet (m = 1, T = 0.5).
 * Target: |W − n| ≤ 10⁻⁶ for every gap, each in under 30 s.
 * Expected integers: published values and derivations in
 * test/numerics/sheet/winding/gap-winding.test.ts.
 */
import type { LatticeDrive } from '../../src/numerics/evolution/drive.ts';
import { gapWindingNumbers } from '../../src/numerics/sheet/winding/gap-winding.ts';
import { FloquetSampler, sampleQuasienergyGrid } from '../../src/numerics/quasienergy-bands.ts';
import { findGaps } from '../../src/numerics/sheet/gaps.ts';
import { checkerboardDrive } from '../../test/support/drives/checkerboard.ts';
import { circularHoneycombDrive } from '../../test/support/drives/honeycomb.ts';
import { qwzDrive } from '../../test/support/drives/qwz.ts';
import { measure } from '../measure.ts';

const cases: { name: string; drive: LatticeDrive; expected: Record<number, number> }[] = [
  { name: 'checkerboard Jτ = 0.4π, Δτ = 0.3', drive: checkerboardDrive({ hopping: 0.4 * Math.PI, offset: 0.3, stepDuration: 1 }), expected: { 0: 1, 1: 1 } },
  { name: 'circular honeycomb A₀ = 0.5, ω = 8t', drive: circularHoneycombDrive({ hopping: 1, amplitude: 0.5, frequency: 8 }), expected: { 0: 1, 1: 0 } },
  { name: 'circular honeycomb A₀ = 1, ω = 4t', drive: circularHoneycombDrive({ hopping: 1, amplitude: 1, frequency: 4 }), expected: { 0: 1, 1: -2 } },
  { name: 'Qi–Wu–Zhang m = 1, T = 0.5', drive: qwzDrive(1, 0.5), expected: { 0: 1, 1: 0 } },
];

await measure('winding-adaptive', () =>
  cases.flatMap(({ name, drive, expected }) => {
    const sampler = new FloquetSampler(drive);
    const gaps = findGaps(sampler, sampleQuasienergyGrid(sampler, [24, 24]), { labels: [0, 1] });
    return [0, 1].map((label) => {
      const gap = gaps.find((g) => g.label === label)!;
      const t0 = performance.now();
      const [report] = gapWindingNumbers(drive, [label]);
      const seconds = (performance.now() - t0) / 1000;
      const w = report.winding;
      return {
        model: name,
        gap: label,
        minimalGap: gap.minimalGap,
        certifiedLowerBound: gap.certified?.lower ?? null,
        expected: expected[label],
        raw: w.raw,
        distanceFromExpected: Math.abs(w.raw - expected[label]),
        converged: w.converged,
        evaluations: report.quadrature?.evaluations ?? null,
        cells: report.quadrature?.cells ?? null,
        errorEstimate: report.quadrature?.errorEstimate ?? null,
        seconds,
        met: w.converged && Math.abs(w.raw - expected[label]) <= 1e-6 && seconds < 30,
      };
    });
  }),
);
