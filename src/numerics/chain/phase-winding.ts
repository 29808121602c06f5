/**
 * Winding number of a complex function f(s) around the origin as the reduced
 * momentum s runs once around the Brillouin zone [0, 1):
 *     ν = (1/2π) Σ_steps arg( f(s_{j+1}) / f(s_j) ).
 * The sum is an exact integer multiple of 2π as soon as every step changes the
 * phase by less than π; we demand less than `maxStepPhase` (default π/4) and
 * bisect any step that exceeds it (common practice for argument-principle
 * counts). f must be periodic, f(s + 1) = f(s) (true in the periodic cell gauge
 * of drive.ts), so the closing step reuses f(0).
 */
import type { Complex } from '../linalg/complex-matrix.ts';
import type { IntegerEstimate } from '../certificates.ts';
import { integerEstimate } from '../certificates.ts';
import { formatNumber } from '../number-format.ts';

export interface PhaseWindingOptions {
  /** Uniform starting grid (default 32). */
  initialPoints?: number;
  /** Largest accepted phase change per step (default π/4). */
  maxStepPhase?: number;
  /** Smallest step the bisection may create (default 2⁻²⁴). */
  minStep?: number;
  /** Budget of function evaluations (default 20000). */
  maxEvaluations?: number;
  /** |f| below this fraction of max |f| counts as a zero of f on the loop (default 1e-9). */
  zeroTolerance?: number;
}

export interface PhaseWindingResult {
  winding: IntegerEstimate;
  /** Number of momenta in the final (adaptive) grid. */
  points: number;
  /** Largest phase change between neighbouring momenta of the final grid. */
  maxStepPhase: number;
  /** Smallest and largest |f| met; a small ratio means the loop passes near a zero. */
  minModulus: number;
  maxModulus: number;
  /** Momentum at which |f| was smallest. */
  momentumAtMinimum: number;
}

export function phaseWinding(f: (s: number) => Complex, options: PhaseWindingOptions = {}): PhaseWindingResult {
  const n0 = options.initialPoints ?? 32;
  const maxStep = options.maxStepPhase ?? Math.PI / 4;
  const minStep = options.minStep ?? 2 ** -24;
  const budget = options.maxEvaluations ?? 20000;
  const zeroTol = options.zeroTolerance ?? 1e-9;
  let evaluations = 0;
  let minMod = Infinity, maxMod = 0, argMin = 0;
  const evaluate = (s: number): Complex => {
    evaluations++;
    const z = f(s);
    const m = Math.hypot(z.re, z.im);
    if (m < minMod) {
      minMod = m;
      argMin = s;
    }
    maxMod = Math.max(maxMod, m);
    return z;
  };
  const step = (a: Complex, b: Complex): number => Math.atan2(a.re * b.im - a.im * b.re, a.re * b.re + a.im * b.im);

  const s0: number[] = [];
  const z0: Complex[] = [];
  for (let j = 0; j < n0; j++) {
    s0.push(j / n0);
    z0.push(evaluate(j / n0));
  }
  let uniformTotal = 0;
  for (let j = 0; j < n0; j++) uniformTotal += step(z0[j], z0[(j + 1) % n0]);

  let total = 0, points = 0, largest = 0;
  let unresolved: number | undefined;
  for (let j = 0; j < n0; j++) {
    // Depth-first bisection of [s_j, s_{j+1}].
    const stack: [number, Complex, number, Complex][] = [[s0[j], z0[j], j + 1 < n0 ? s0[j + 1] : 1, z0[(j + 1) % n0]]];
    while (stack.length > 0) {
      const [sa, za, sb, zb] = stack.pop()!;
      const d = step(za, zb);
      if (Math.abs(d) < maxStep || sb - sa < minStep || evaluations >= budget) {
        if (Math.abs(d) >= maxStep && unresolved === undefined) unresolved = 0.5 * (sa + sb);
        total += d;
        points++;
        largest = Math.max(largest, Math.abs(d));
        continue;
      }
      const sm = 0.5 * (sa + sb);
      const zm = evaluate(sm);
      stack.push([sm, zm, sb, zb], [sa, za, sm, zm]);
    }
  }
  const raw = total / (2 * Math.PI);
  let caveat: string | undefined;
  if (!(maxMod > 0) || minMod <= zeroTol * maxMod) {
    caveat = `the function nearly vanishes at s = ${argMin.toFixed(6)} (|f|/max|f| = ${formatNumber(maxMod > 0 ? minMod / maxMod : 0)}): a gap closes on the loop`;
  } else if (unresolved !== undefined) {
    caveat = `phase step above ${maxStep.toFixed(3)} rad not resolved near s = ${unresolved.toFixed(6)} within the step/evaluation budget`;
  }
  const winding = integerEstimate(
    raw,
    1e-6,
    [points],
    [
      { grid: [n0], value: uniformTotal / (2 * Math.PI), label: `${n0} momenta, uniform` },
      { grid: [points], value: raw, label: `${points} momenta, adaptive` },
    ],
    true,
    caveat,
  );
  return { winding, points, maxStepPhase: largest, minModulus: minMod, maxModulus: maxMod, momentumAtMinimum: argMin };
}
