/**
 * Haldane model (Haldane, PRL 61, 2015 (1988)) on the honeycomb geometry of
 * honeycomb.ts: nearest-neighbour hopping t₁, next-nearest-neighbour hopping
 * t₂ e^{iνφ} and a sublattice mass ±M. The orientation sign ν of a hop from
 * site i to site j through their common neighbour k is the sign of
 * (r_k − r_i) × (r_j − r_k), so hops that turn left pick up e^{+iφ}.
 */
import type { LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import type { StaticHopping } from './static.ts';
import { staticDrive } from './static.ts';
import { HONEYCOMB_BONDS, HONEYCOMB_STATES, HONEYCOMB_VECTORS } from './honeycomb.ts';

export interface HaldaneParameters {
  t1: number;
  t2: number;
  phi: number;
  mass: number;
}

function cartesian(n: readonly number[]): number[] {
  return [0, 1].map((c) => n[0] * HONEYCOMB_VECTORS[0][c] + n[1] * HONEYCOMB_VECTORS[1][c]);
}

const cross = (a: number[], b: number[]): number => a[0] * b[1] - a[1] * b[0];

/** Cartesian A → B nearest-neighbour vectors δ₁, δ₂, δ₃. */
export function honeycombNeighbours(): number[][] {
  const rB = HONEYCOMB_STATES[1].position;
  return HONEYCOMB_BONDS.map((n) => cartesian(n).map((x, c) => x + rB[c]));
}

/** Orientation sign ν of the next-nearest-neighbour hop by lattice vector n on sublattice A (0) or B (1). */
export function haldaneOrientation(sub: 0 | 1, n: readonly number[]): number {
  const d = cartesian(n);
  // Neighbours of an A site are at +δ, of a B site at −δ.
  const steps = honeycombNeighbours().map((delta) => delta.map((x) => (sub === 0 ? x : -x)));
  for (const first of steps) {
    const second = [d[0] - first[0], d[1] - first[1]];
    if (Math.abs(Math.hypot(second[0], second[1]) - 1) < 1e-9) return Math.sign(cross(first, second));
  }
  throw new RangeError(`haldaneOrientation: [${n.join(', ')}] is not a next-nearest-neighbour vector`);
}

export function haldaneDrive(p: HaldaneParameters, period?: number): LatticeDrive {
  const hoppings: StaticHopping[] = HONEYCOMB_BONDS.map((n) => ({ from: 0, to: 1, offset: [n[0], n[1]], amplitude: p.t1 }));
  for (const n of [
    [1, 0],
    [0, 1],
    [-1, 1],
  ]) {
    for (const sub of [0, 1] as const) {
      const nu = haldaneOrientation(sub, n);
      hoppings.push({ from: sub, to: sub, offset: n, amplitude: [p.t2 * Math.cos(nu * p.phi), p.t2 * Math.sin(nu * p.phi)] });
    }
  }
  hoppings.push({ from: 0, to: 0, offset: [0, 0], amplitude: p.mass });
  hoppings.push({ from: 1, to: 1, offset: [0, 0], amplitude: -p.mass });
  return staticDrive(
    { latticeVectors: HONEYCOMB_VECTORS.map((v) => v.slice()), states: HONEYCOMB_STATES.map((s) => ({ ...s, position: s.position.slice() })), hoppings },
    period,
  );
}
