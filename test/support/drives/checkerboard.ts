/**
 * Five-step checkerboard drive of Rudner, Lindner, Berg, Levin, PRX 3, 031005
 * (2013), as a `LatticeDrive`.
 *
 * Geometry: a square lattice of nearest-neighbour distance 1 split into two
 * sublattices A (at the origin) and B (at (1, 0)); Bravais vectors a₁ = (1, 1),
 * a₂ = (−1, 1) (right-handed). The four B neighbours of the A site in cell 0 lie
 * in the directions +x, +y, −x, −y, i.e. in cells (0,0), (0,1), (−1,1), (−1,0).
 * Step j = 1…4 switches on only the bond in direction j (hopping J, real);
 * step 5 switches off hopping and applies the sublattice offset +Δ on A, −Δ on B.
 * Every step lasts τ, so T = 5τ.
 *
 * At Jτ = π/2 each of the first four steps transfers a particle fully across its
 * bond; a bulk particle goes round one plaquette and comes back, so the bulk
 * Floquet operator is exp(−iΔτσ_z) up to a phase, whereas at an edge the
 * circuit is interrupted and particles are carried along it (the anomalous
 * phase, same paper).
 */
import type { DriveSegment, DriveTerm, LatticeDrive } from '../../../src/numerics/evolution/drive.ts';

export interface CheckerboardParameters {
  /** Hopping J on the active bond. */
  hopping: number;
  /** Sublattice offset Δ of step 5 (A at +Δ, B at −Δ). */
  offset: number;
  /** Duration τ of each step. */
  stepDuration: number;
  /**
   * Order in which the five steps are applied, as step numbers 1…5 (default
   * [1, 2, 3, 4, 5]). A cyclic rotation moves the time origin by whole steps;
   * [4, 3, 2, 1, 5] runs the bond sequence backwards.
   */
  order?: number[];
}

/** Cell offsets (in units of a₁, a₂) of the B neighbour reached from A in cell 0 along +x, +y, −x, −y. */
export const CHECKERBOARD_BOND_OFFSETS: readonly (readonly [number, number])[] = [
  [0, 0],
  [0, 1],
  [-1, 1],
  [-1, 0],
];

const constant = { kind: 'constant' } as const;

function bondStep(j: number, hopping: number, tau: number): DriveSegment {
  const [n1, n2] = CHECKERBOARD_BOND_OFFSETS[j - 1];
  const term: DriveTerm = { from: 0, to: 1, offset: [n1, n2], amplitude: { re: hopping, im: 0 }, modulation: constant };
  return { label: `step ${j}: bond ${['+x', '+y', '−x', '−y'][j - 1]}`, duration: tau, terms: [term] };
}

function offsetStep(offset: number, tau: number): DriveSegment {
  return {
    label: 'step 5: sublattice offset',
    duration: tau,
    terms: [
      { from: 0, to: 0, offset: [0, 0], amplitude: { re: offset, im: 0 }, modulation: constant },
      { from: 1, to: 1, offset: [0, 0], amplitude: { re: -offset, im: 0 }, modulation: constant },
    ],
  };
}

export function checkerboardDrive(p: CheckerboardParameters): LatticeDrive {
  const order = p.order ?? [1, 2, 3, 4, 5];
  if (order.length !== 5 || [...order].sort().join() !== '1,2,3,4,5') {
    throw new RangeError(`checkerboardDrive: order must be a permutation of 1…5, got [${order.join(', ')}]`);
  }
  const segments = order.map((j) => (j === 5 ? offsetStep(p.offset, p.stepDuration) : bondStep(j, p.hopping, p.stepDuration)));
  return {
    dimension: 2,
    spaceDimension: 2,
    latticeVectors: [
      [1, 1],
      [-1, 1],
    ],
    states: [
      { label: 'A', position: [0, 0], charge: 1 },
      { label: 'B', position: [1, 0], charge: 1 },
    ],
    period: 5 * p.stepDuration,
    segments,
  };
}
