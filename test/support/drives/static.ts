/**
 * Static tight-binding models run as drives: one constant segment of duration T.
 *
 * With every eigenvalue E of H(s) inside (−π/T, π/T), the quasienergies are the
 * energies themselves and the gap at π/T contains the top and bottom of the
 * spectrum. `staticDrive` picks T from a Gershgorin bound B ≥ max|E| (the
 * largest row sum of |amplitudes|, counting each hopping on both of its states):
 * T = π/(1.25 B), so the whole spectrum lies within 80 % of the window.
 */
import type { BasisState, DriveTerm, LatticeDrive } from '../../../src/numerics/evolution/drive.ts';

export interface StaticHopping {
  from: number;
  to: number;
  offset: number[];
  /** Real amplitude or [re, im]. */
  amplitude: number | readonly [number, number];
}

export interface StaticModel {
  latticeVectors: number[][];
  states: BasisState[];
  hoppings: StaticHopping[];
}

/** Upper bound on the spectral radius of every H(s) (Gershgorin, common practice). */
export function spectralBound(model: StaticModel): number {
  const rows = new Float64Array(model.states.length);
  for (const h of model.hoppings) {
    const a = typeof h.amplitude === 'number' ? Math.abs(h.amplitude) : Math.hypot(h.amplitude[0], h.amplitude[1]);
    const onsite = h.from === h.to && h.offset.every((x) => x === 0);
    if (onsite) rows[h.from] += a;
    else if (h.from === h.to) rows[h.from] += 2 * a;
    else {
      rows[h.from] += a;
      rows[h.to] += a;
    }
  }
  return Math.max(...rows);
}

export function staticDrive(model: StaticModel, period?: number): LatticeDrive {
  const T = period ?? Math.PI / (1.25 * Math.max(spectralBound(model), 1e-12));
  const terms: DriveTerm[] = model.hoppings.map((h) => ({
    from: h.from,
    to: h.to,
    offset: h.offset.slice(),
    amplitude: typeof h.amplitude === 'number' ? { re: h.amplitude, im: 0 } : { re: h.amplitude[0], im: h.amplitude[1] },
    modulation: { kind: 'constant' },
  }));
  return {
    dimension: model.latticeVectors.length as LatticeDrive['dimension'],
    spaceDimension: model.states[0]?.position.length ?? model.latticeVectors.length,
    latticeVectors: model.latticeVectors.map((v) => v.slice()),
    states: model.states.map((s) => ({ ...s, position: s.position.slice() })),
    period: T,
    segments: [{ label: 'static', duration: T, terms }],
  };
}
