/**
 * Supercells: cut a lattice drive open along one lattice vector.
 *
 * `truncateDrive(drive, f, cells)` keeps `cells` unit cells along lattice
 * vector a_f with open boundaries and stays periodic along the others. The
 * result is again a `LatticeDrive`, of one dimension less: a 2D sheet becomes
 * a 1D ribbon, a 1D chain a 0D cluster.
 *
 * Layout of the new basis: state (j, a) — orbital a of the original cell j
 * (j = 0 … cells−1 along a_f) — gets index j·n + a and the label "j:label".
 * Cell j = 0 is the "low" edge, cell j = cells−1 the "high" edge.
 * Positions become r_a + j·a_f, so every Cartesian hop vector
 * d = n·a + r_b − r_a, and with it every Peierls phase, is unchanged.
 *
 * A term a → b with offset n becomes, for every j with 0 ≤ j, j + n_f < cells,
 * the term (j, a) → (j + n_f, b) with the offset n with component f removed;
 * terms that would leave the strip are dropped (open boundary). The term list
 * stays sparse (one entry per bond), so propagators can exploit the block
 * structure of each segment.
 */
import type { DriveTerm, LatticeDrive } from './evolution/drive.ts';

export class SupercellInputError extends RangeError {
  override name = 'SupercellInputError';
}

export function truncateDrive(drive: LatticeDrive, finiteDirection: number, cells: number): LatticeDrive {
  if (drive.dimension < 1) {
    throw new SupercellInputError('truncateDrive: the drive has no periodic direction to cut open (dimension 0)');
  }
  if (!Number.isInteger(finiteDirection) || finiteDirection < 0 || finiteDirection >= drive.dimension) {
    throw new SupercellInputError(
      `truncateDrive: finite direction ${finiteDirection} is not one of the drive's lattice directions 0…${drive.dimension - 1}`,
    );
  }
  if (!Number.isInteger(cells) || cells < 1) {
    throw new SupercellInputError(`truncateDrive: the number of cells must be a positive integer, got ${cells}`);
  }
  const n = drive.states.length;
  const af = drive.latticeVectors[finiteDirection];
  const keep = (v: number[]): number[] => v.filter((_, i) => i !== finiteDirection);

  const states = [];
  for (let j = 0; j < cells; j++) {
    for (const state of drive.states) {
      states.push({
        label: `${j}:${state.label}`,
        position: state.position.map((x, c) => x + j * (af[c] ?? 0)),
        charge: state.charge,
      });
    }
  }

  const segments = drive.segments.map((segment) => {
    const terms: DriveTerm[] = [];
    for (const term of segment.terms) {
      const shift = term.offset[finiteDirection] ?? 0;
      const rest = keep(term.offset);
      for (let j = 0; j < cells; j++) {
        const target = j + shift;
        if (target < 0 || target >= cells) continue;
        terms.push({
          from: j * n + term.from,
          to: target * n + term.to,
          offset: rest,
          amplitude: { re: term.amplitude.re, im: term.amplitude.im },
          modulation: term.modulation,
        });
      }
    }
    const out: LatticeDrive['segments'][number] = { duration: segment.duration, terms };
    if (segment.label !== undefined) out.label = segment.label;
    if (segment.vectorPotential !== undefined) out.vectorPotential = segment.vectorPotential;
    return out;
  });

  return {
    dimension: (drive.dimension - 1) as LatticeDrive['dimension'],
    spaceDimension: drive.spaceDimension,
    latticeVectors: drive.latticeVectors.filter((_, i) => i !== finiteDirection).map((v) => v.slice()),
    states,
    period: drive.period,
    segments,
  };
}
