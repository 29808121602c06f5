/**
 * The numerics-side description of a periodically driven tight-binding model:
 * every parameter already evaluated to a number, every orbital resolved to an
 * index. The catalogue layer compiles validated model files into this form
 * (src/catalogue/compile.ts); the numerics never see JSON or expressions.
 *
 * Conventions (docs/conventions.md holds the full statement):
 * - ħ = 1; time runs over one period [0, T); ω = 2π/T.
 * - Basis states are indexed 0 … n−1 within a unit cell. For superconducting
 *   (Bogoliubov–de Gennes) chains the states are Nambu components; see bdg.ts.
 * - A term with `from` = a, `to` = b, `offset` = n contributes
 *       amplitude · f(t) · e^{i q A(t)·d} |b, R+n⟩⟨a, R|   summed over cells R,
 *   plus its Hermitian conjugate (added by the tool, never by the user), where
 *   d = n₁a₁ + n₂a₂ + r_b − r_a is the Cartesian hop vector, f(t) the term's
 *   modulation, A(t) the segment's vector potential and q the states' charge.
 *   An onsite term (a = b, n = 0) adds amplitude · f(t) once (it must be real).
 * - Bloch matrices use the periodic (cell) gauge: H(s)_{ba} = Σ_n t_{a→b,n} e^{−2πi s·n}
 *   with reduced momenta s ∈ [0,1)^dimension, k = Σ sᵢ bᵢ, bᵢ·aⱼ = 2πδᵢⱼ, so
 *   H(s + e_i) = H(s) exactly. Positions enter only through Peierls phases and
 *   real-space geometry (edges, localisation).
 */
import type { Complex } from '../linalg/complex-matrix.ts';

export interface BasisState {
  /** Human-readable label, e.g. "A", "B↑", "h:A" for the hole component of A. */
  label: string;
  /** Cartesian position inside the cell (lattice constants), length = spaceDimension. */
  position: number[];
  /** Charge in units of the particle's, +1 for particles and −1 for Nambu holes; multiplies Peierls phases. */
  charge: number;
}

/** f(t) = mean + Σ_j amplitude_j · cos(harmonic_j · ω t + phase_j), t the absolute time in the period. */
export interface HarmonicModulation {
  kind: 'harmonic';
  mean: number;
  components: { amplitude: number; harmonic: number; phase: number }[];
}

export type Modulation = { kind: 'constant' } | HarmonicModulation;

/** A(t) = Σ_j amplitude_j · cos(harmonic_j · ω t + phase_j), amplitude_j a Cartesian vector. */
export interface VectorPotentialComponent {
  amplitude: number[];
  harmonic: number;
  phase: number;
}

export interface DriveTerm {
  /** Source state index a. */
  from: number;
  /** Target state index b. */
  to: number;
  /** Integer cell offset n (length = dimension). All zeros with from = to: an onsite term. */
  offset: number[];
  amplitude: Complex;
  modulation: Modulation;
}

export interface DriveSegment {
  /** Optional name shown in reports ("step 1: bond a"). */
  label?: string;
  /** Duration τ ≥ 0. Zero duration means an instantaneous kick: U = exp(−i K), K built from the terms. */
  duration: number;
  terms: DriveTerm[];
  /** Vector potential applied as a Peierls phase to every hopping term of the segment. */
  vectorPotential?: VectorPotentialComponent[];
}

export interface LatticeDrive {
  /** Number of periodic directions: 2 for a sheet, 1 for a chain or ribbon, 0 for a finite cluster. */
  dimension: 0 | 1 | 2 | 3;
  /** Number of Cartesian components of positions and lattice vectors (≥ dimension; a ribbon keeps 2). */
  spaceDimension: number;
  /** Cartesian Bravais vectors of the periodic directions, `dimension` of them. */
  latticeVectors: number[][];
  states: BasisState[];
  /** Period T > 0; the durations of the segments sum to it. */
  period: number;
  /** Consecutive segments starting at t = 0. */
  segments: DriveSegment[];
}

/** Start time of each segment (cumulative durations). */
export function segmentStartTimes(drive: LatticeDrive): number[] {
  const starts: number[] = [];
  let t = 0;
  for (const segment of drive.segments) {
    starts.push(t);
    t += segment.duration;
  }
  return starts;
}

/** ω = 2π/T. */
export function angularFrequency(drive: LatticeDrive): number {
  return (2 * Math.PI) / drive.period;
}
