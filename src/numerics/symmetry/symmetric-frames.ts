/**
 * Symmetric time frames of a chiral drive (Asbóth & Obuse, PRB 88, 121406(R)
 * (2013); Asbóth, Tarasinski, Delplace, PRB 90, 125143 (2014)): times t₀ with
 *     Γ H(s, t₀ + τ) Γ† = −H(s, t₀ − τ)   for all τ, s.
 * In such a frame the Floquet operator started at t₀ obeys Γ U Γ† = U†.
 * If t₀ is symmetric, so is t₀ + T/2 (shift τ by T/2 and use periodicity), and
 * the two frames are the inequivalent pair whose windings give ν₀ and ν_π.
 *
 * Search: candidates are segment boundaries and midpoints (where symmetric
 * points of piecewise drives sit) and, only if none of them qualifies, a
 * uniform scan; every candidate is reduced modulo T/2. The smallest residual
 * wins; ties go to the earliest time.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import type { LatticeDrive } from '../evolution/drive.ts';
import { segmentStartTimes } from '../evolution/drive.ts';
import { adjoint, multiply } from '../linalg/complex-matrix.ts';
import { reflectionResidual } from './reflection-residual.ts';
import type { ReflectionRelation } from './reflection-residual.ts';

export interface FrameSearchOptions {
  /** Accepted reflection residual (relative, see reflection-residual.ts), default 1e-10. */
  tolerance?: number;
  /** Points of the uniform scan over [0, T/2), default 64. */
  scanPoints?: number;
}

export interface SymmetricFrameSearch {
  /** The two frame times t₀ and t₀ + T/2 (absolute units), empty when none was found. */
  frames: number[];
  /** Residual at the chosen t₀ (or the best candidate when none qualified). */
  residual: number;
  /** Best candidate time when no frame qualified. */
  bestCandidate: number;
  tolerance: number;
  /** Number of candidate times examined. */
  candidates: number;
}

export function chiralRelation(gamma: ComplexMatrix): ReflectionRelation {
  const gammaDagger = adjoint(gamma);
  return { transform: (h) => multiply(multiply(gamma, h), gammaDagger), sign: -1, reverseMomentum: false };
}

export function findSymmetricFrames(drive: LatticeDrive, relation: ReflectionRelation, options: FrameSearchOptions = {}): SymmetricFrameSearch {
  const tolerance = options.tolerance ?? 1e-10;
  const scan = options.scanPoints ?? 64;
  const T = drive.period, half = T / 2;
  const starts = segmentStartTimes(drive);
  const structural: number[] = [];
  drive.segments.forEach((seg, i) => {
    structural.push(starts[i], starts[i] + seg.duration / 2);
  });
  const seen: number[] = [];
  let best = { t: 0, r: Infinity };
  const consider = (raw: number) => {
    let t = raw - half * Math.floor(raw / half);
    if (half - t <= 1e-12 * T) t = 0;
    if (seen.some((x) => Math.abs(x - t) <= 1e-12 * T)) return;
    seen.push(t);
    const r = reflectionResidual(drive, t, relation);
    if (r < best.r - 1e-15 || (Math.abs(r - best.r) <= 1e-15 && t < best.t)) best = { t, r };
  };
  for (const t of structural) consider(t);
  if (!(best.r <= tolerance)) for (let j = 0; j < scan; j++) consider((j * half) / scan);
  const found = best.r <= tolerance;
  return {
    frames: found ? [best.t, best.t + half] : [],
    residual: best.r,
    bestCandidate: best.t,
    tolerance,
    candidates: seen.length,
  };
}
