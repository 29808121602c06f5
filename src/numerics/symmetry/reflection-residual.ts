/**
 * Residual of a time-reflection relation of a drive about a time t₀,
 *     X[H(s, t₀ + τ)] = σ · H(s′, t₀ − τ)   for all τ and s,
 * and of its kicks (a kick K at t₀ + τ must face a kick K′ at t₀ − τ with
 * X[K(s)] = σ K′(s′)). Chiral symmetry in a symmetric time frame is
 * X[H] = Γ H Γ†, σ = −1, s′ = s (Asbóth & Obuse, PRB 88, 121406(R) (2013));
 * Floquet time reversal is X[H] = U_T H* U_T†, σ = +1, s′ = −s.
 *
 * The drive is rotated to start at t₀ (time-shift.ts); then the relation reads
 * X[H′(s, τ)] = σ H′(s′, T − τ). For piecewise-constant segments the pair
 * (H′(τ), H′(T − τ)) is constant between the breakpoints {b_i} ∪ {T − b_i}, so one
 * sample per piece checks the relation exactly; time-dependent pieces get extra
 * interior samples. Several momenta, generic and particle–hole symmetric, are
 * checked. The residual is max ‖X[H] − σH′‖_F / max(1, max ‖H‖_F).
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import type { LatticeDrive } from '../evolution/drive.ts';
import { segmentStartTimes } from '../evolution/drive.ts';
import { distance, frobeniusNorm } from '../linalg/complex-matrix.ts';
import { prepareBloch } from '../evolution/bloch.ts';
import { shiftTimeOrigin, TIME_MATCH } from '../evolution/time-shift.ts';

export interface ReflectionRelation {
  /** X[H]. */
  transform: (h: ComplexMatrix) => ComplexMatrix;
  /** σ = ±1. */
  sign: 1 | -1;
  /** true: s′ = −s (time reversal); false: s′ = s (chiral). */
  reverseMomentum: boolean;
}

/**
 * Momenta checked by default: the time-reversal and particle–hole invariant
 * points (s = −s modulo the zone) and generic ones (for sheets also K and K′ of
 * a triangular Bravais lattice, s = (1/3, 2/3) and (2/3, 1/3)).
 */
export function checkMomenta(dimension: number): number[][] {
  if (dimension === 0) return [[]];
  if (dimension === 1) return [0, 0.5, 0.1234, 0.3771, 0.618, 0.8529].map((s) => [s]);
  return [[0, 0], [0.5, 0], [0, 0.5], [0.5, 0.5], [0.1234, 0.3771], [0.618, 0.2137], [0.8529, 0.5361], [1 / 3, 2 / 3], [2 / 3, 1 / 3]];
}

/** −s in the zone [0, 1)^d. */
export function mirrorMomentum(s: number[]): number[] {
  return s.map((x) => (1 - x) % 1);
}
/** Extra samples inside a time-dependent piece. */
const DYNAMIC_SAMPLES = 5;

export function reflectionResidual(drive: LatticeDrive, t0: number, relation: ReflectionRelation, momenta = checkMomenta(drive.dimension)): number {
  const rotated = shiftTimeOrigin(drive, t0);
  const T = rotated.period;
  const starts = segmentStartTimes(rotated);
  const kicks = rotated.segments.map((s, i) => i).filter((i) => rotated.segments[i].duration === 0);
  const positive = rotated.segments.map((s, i) => i).filter((i) => rotated.segments[i].duration > 0);
  const times = samplingTimes(rotated, starts, positive);
  let worst = 0, scale = 0;
  const kickTimesMatch = kicks.every((i, j) => Math.abs(starts[i] + starts[kicks[kicks.length - 1 - j]] - T) <= 1e4 * TIME_MATCH * T);
  for (const s of momenta) {
    const here = prepareBloch(rotated, s);
    const there = relation.reverseMomentum ? prepareBloch(rotated, mirrorMomentum(s)) : here;
    for (const tau of times) {
      const a = here.at(tau), b = there.at(T - tau);
      scale = Math.max(scale, frobeniusNorm(a));
      worst = Math.max(worst, mismatch(relation.transform(a), b, relation.sign));
    }
    for (let j = 0; j < kicks.length; j++) {
      const ka = here.segmentAt(kicks[j], starts[kicks[j]]);
      const kb = there.segmentAt(kicks[kicks.length - 1 - j], starts[kicks[kicks.length - 1 - j]]);
      scale = Math.max(scale, frobeniusNorm(ka));
      worst = Math.max(worst, kickTimesMatch ? mismatch(relation.transform(ka), kb, relation.sign) : frobeniusNorm(ka) + frobeniusNorm(kb));
    }
  }
  return worst / Math.max(1, scale);
}

function mismatch(x: ComplexMatrix, b: ComplexMatrix, sign: 1 | -1): number {
  if (sign === 1) return distance(x, b);
  let s = 0;
  for (let p = 0; p < x.re.length; p++) {
    const dr = x.re[p] + b.re[p], di = x.im[p] + b.im[p];
    s += dr * dr + di * di;
  }
  return Math.sqrt(s);
}

function samplingTimes(drive: LatticeDrive, starts: number[], positive: number[]): number[] {
  const T = drive.period;
  const breaks = new Set<number>([0, T]);
  for (const i of positive) {
    for (const b of [starts[i], starts[i] + drive.segments[i].duration]) {
      breaks.add(b);
      breaks.add(T - b);
    }
  }
  const sorted = [...breaks].filter((b) => b >= 0 && b <= T).sort((x, y) => x - y);
  const dynamic = positive.some((i) => isTimeDependent(drive, i));
  const times: number[] = [];
  for (let j = 0; j + 1 < sorted.length; j++) {
    const a = sorted[j], b = sorted[j + 1];
    if (b - a <= 1e3 * TIME_MATCH * T) continue;
    if (!dynamic) times.push(0.5 * (a + b));
    else for (let q = 0; q < DYNAMIC_SAMPLES; q++) times.push(a + ((q + 0.5) / DYNAMIC_SAMPLES) * (b - a));
  }
  return times;
}

export function isTimeDependent(drive: LatticeDrive, index: number): boolean {
  const seg = drive.segments[index];
  if (seg.vectorPotential !== undefined && seg.vectorPotential.some((c) => c.harmonic !== 0 && c.amplitude.some((x) => x !== 0))) return true;
  return seg.terms.some((t) => t.modulation.kind === 'harmonic' && t.modulation.components.some((c) => c.harmonic !== 0 && c.amplitude !== 0));
}
