/**
 * Honeycomb lattice geometry and two driven honeycomb models.
 *
 * Geometry (nearest-neighbour distance 1): a₁ = (√3, 0), a₂ = (√3/2, 3/2)
 * (right-handed), A at (0, 0), B at (0, 1). The three B neighbours of the A site
 * in cell 0 lie in cells (0,0), (0,−1), (1,−1), at Cartesian vectors
 * δ₁ = (0, 1), δ₂ = (−√3/2, −1/2), δ₃ = (√3/2, −1/2).
 *
 * 1. Three-step drive (Kitagawa, Berg, Rudner, Demler, PRB 82, 235114 (2010)):
 *    the period is split into three equal steps; in step n only bond δ_n hops
 *    (amplitude J); a sublattice potential ±δ acts throughout.
 * 2. Circularly polarised light (Oka & Aoki, PRB 79, 081406(R) (2009);
 *    Kitagawa, Oka, Brataas, Fu, Demler, PRB 84, 235108 (2011)): static hopping
 *    −t on all bonds with the Peierls vector potential
 *    A(t) = A₀ (cos ωt, χ sin ωt), χ = ±1 the helicity, T = 2π/ω.
 */
import type { DriveSegment, DriveTerm, LatticeDrive } from '../../../src/numerics/evolution/drive.ts';

const SQRT3 = Math.sqrt(3);
export const HONEYCOMB_VECTORS: number[][] = [
  [SQRT3, 0],
  [SQRT3 / 2, 1.5],
];
/** Cell offsets of the B neighbours of A in cell 0, for δ₁, δ₂, δ₃. */
export const HONEYCOMB_BONDS: readonly (readonly [number, number])[] = [
  [0, 0],
  [0, -1],
  [1, -1],
];
export const HONEYCOMB_STATES = [
  { label: 'A', position: [0, 0], charge: 1 },
  { label: 'B', position: [0, 1], charge: 1 },
];

const constant = { kind: 'constant' } as const;

function bond(n: number, amplitude: number): DriveTerm {
  const [n1, n2] = HONEYCOMB_BONDS[n];
  return { from: 0, to: 1, offset: [n1, n2], amplitude: { re: amplitude, im: 0 }, modulation: constant };
}

function sublattice(mass: number): DriveTerm[] {
  if (mass === 0) return [];
  return [
    { from: 0, to: 0, offset: [0, 0], amplitude: { re: mass, im: 0 }, modulation: constant },
    { from: 1, to: 1, offset: [0, 0], amplitude: { re: -mass, im: 0 }, modulation: constant },
  ];
}

function honeycomb(period: number, segments: DriveSegment[]): LatticeDrive {
  return {
    dimension: 2,
    spaceDimension: 2,
    latticeVectors: HONEYCOMB_VECTORS.map((v) => v.slice()),
    states: HONEYCOMB_STATES.map((s) => ({ ...s, position: s.position.slice() })),
    period,
    segments,
  };
}

export interface ThreeStepParameters {
  /** Hopping J of the active bond. */
  hopping: number;
  /** Duration of each of the three steps (T = 3τ). */
  stepDuration: number;
  /** Sublattice potential δ (A at +δ, B at −δ), on during all steps. */
  mass?: number;
}

export function threeStepHoneycombDrive(p: ThreeStepParameters): LatticeDrive {
  const segments: DriveSegment[] = [0, 1, 2].map((n) => ({
    label: `step ${n + 1}: bond δ${n + 1}`,
    duration: p.stepDuration,
    terms: [bond(n, p.hopping), ...sublattice(p.mass ?? 0)],
  }));
  return honeycomb(3 * p.stepDuration, segments);
}

export interface CircularParameters {
  /** Nearest-neighbour hopping t (the term amplitude is −t). */
  hopping: number;
  /** Field amplitude A₀ (charge 1, lattice units), dimensionless A₀·|δ|. */
  amplitude: number;
  /** Angular frequency ω; T = 2π/ω. */
  frequency: number;
  /** Helicity χ = ±1 (default +1: counter-clockwise rotation of A). */
  helicity?: 1 | -1;
  mass?: number;
}

export function circularHoneycombDrive(p: CircularParameters): LatticeDrive {
  const T = (2 * Math.PI) / p.frequency;
  const chi = p.helicity ?? 1;
  return honeycomb(T, [
    {
      label: 'circular drive',
      duration: T,
      terms: [bond(0, -p.hopping), bond(1, -p.hopping), bond(2, -p.hopping), ...sublattice(p.mass ?? 0)],
      vectorPotential: [
        { amplitude: [p.amplitude, 0], harmonic: 1, phase: 0 },
        { amplitude: [0, p.amplitude], harmonic: 1, phase: (-chi * Math.PI) / 2 },
      ],
    },
  ]);
}
