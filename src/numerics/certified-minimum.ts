/**
 * A lower bound on the minimum of a function over the Brillouin zone (the
 * torus [0, 1)^d of reduced momenta), by branch and bound with a Lipschitz
 * constant (Piyavskii–Shubert style; common practice in global optimisation,
 * e.g. Horst & Tuy, Global Optimization (1996), ch. 11).
 *
 * A cell is a box with centre c and half-widths h_d. If f is Lipschitz with
 * |f(s) − f(s′)| ≤ Σ_d L_d |s_d − s′_d| inside the cell, then
 *     min over the cell ≥ f(c) − Σ_d L_d h_d − margin,
 * with `margin` the error of one evaluation of f. The search starts from the
 * cells of a coarse grid (their centres are the grid points, already
 * evaluated), repeatedly splits the cell with the lowest bound into 2^d
 * children, and stops when
 *   - the lowest bound of any cell exceeds both `decisionLevel` and
 *     (1 − relative) × (best value seen): the minimum is then bracketed
 *     between the lowest bound and the best value; or
 *   - the best value seen is at or below `decisionLevel` (a sample proves it); or
 *   - `budget` evaluations are spent, or a cell to split is narrower than
 *     10⁻¹² (the bracket is reported as it stands).
 *
 * f may only be Lipschitz where a guard g stays positive (a gap's direct gap is
 * continuous only while no band crosses the label; the guard is the label's
 * distance to the spectrum, with its own Lipschitz constants). A cell whose
 * guard bound g(c) − Σ L′_d h_d − margin is not positive has no valid bound on f
 * and is split first.
 */

import { gridMomentum } from './quasienergy-bands.ts';
import { BinaryHeap } from './binary-heap.ts';

export interface CellValue {
  /** f at the cell centre. */
  value: number;
  /** The guard at the cell centre (omit when f is Lipschitz everywhere). */
  guard?: number;
}

export interface CertifiedMinimumOptions {
  /** Evaluates f (and the guard) at a reduced momentum. */
  evaluate: (s: number[]) => CellValue;
  /** Lipschitz constants of f per direction (units of f per unit of reduced momentum). */
  lipschitz: number[];
  /** Lipschitz constants of the guard (default: those of f). */
  guardLipschitz?: number[];
  /** Coarse grid n_d per direction whose points are the first cell centres. */
  grid: number[];
  /** Values at the grid points, row-major (last direction fastest), as gridMomentum numbers them. */
  initial: CellValue[];
  /** The level the caller decides against (e.g. a gap tolerance). */
  decisionLevel: number;
  /** Requested relative width of the bracket once above the decision level (default 0.1). */
  relative?: number;
  /** Most evaluations of f (default 20000). */
  budget?: number;
  /** Error of one evaluation of f and of the guard (default 0). */
  margin?: number;
  /** A value of f found elsewhere (e.g. by a local search), counted as the best value seen. */
  knownBest?: { value: number; at: number[] };
}

export interface CertifiedMinimum {
  /** Smallest value of f evaluated, and where. */
  best: number;
  at: number[];
  /** Lower bound on the minimum of f over the whole zone (−Infinity while a guard is unresolved). */
  lower: number;
  /** 'above': lower > decisionLevel; 'below': best ≤ decisionLevel; 'undecided': the budget ran out in between. */
  status: 'above' | 'below' | 'undecided';
  /** Evaluations of f spent by the search (the coarse grid not counted) and cells examined. */
  evaluations: number;
  cells: number;
  /** Smallest guard value seen (Infinity without a guard). */
  smallestGuard: number;
}

/** Smallest half-width of a cell (reduced momentum): finer cells are lost in the rounding of their centres. */
export const MINIMAL_HALF_WIDTH = 1e-12;

interface Cell {
  centre: number[];
  half: number[];
  bound: number;
}


export function certifiedMinimum(options: CertifiedMinimumOptions): CertifiedMinimum {
  const { evaluate, lipschitz, grid, initial, decisionLevel } = options;
  const guardL = options.guardLipschitz ?? lipschitz;
  const relative = options.relative ?? 0.1;
  const budget = options.budget ?? 20000;
  const margin = options.margin ?? 0;
  const dims = grid.length;
  if (lipschitz.length !== dims || guardL.length !== dims) throw new RangeError(`certifiedMinimum: ${dims} directions but ${lipschitz.length} Lipschitz constants`);
  const total = grid.reduce((a, b) => a * b, 1);
  if (initial.length !== total) throw new RangeError(`certifiedMinimum: ${initial.length} initial values for a grid of ${total} points`);

  let best = Infinity, at: number[] = [], smallestGuard = Infinity, evaluations = 0, cells = 0;
  const bound = (value: CellValue, half: number[]): number => {
    let spread = 0, guardSpread = 0;
    for (let d = 0; d < dims; d++) {
      spread += lipschitz[d] * half[d];
      guardSpread += guardL[d] * half[d];
    }
    const lower = value.value - spread - margin;
    if (value.guard === undefined) return lower;
    const guardLower = value.guard - guardSpread - margin;
    return guardLower > 0 ? lower : Math.min(lower, guardLower);
  };
  const record = (value: CellValue, s: number[]) => {
    if (value.value < best) {
      best = value.value;
      at = s.map((x) => x - Math.floor(x));
    }
    if (value.guard !== undefined) smallestGuard = Math.min(smallestGuard, value.guard);
  };

  if (options.knownBest !== undefined) record({ value: options.knownBest.value }, options.knownBest.at);
  const heap = new BinaryHeap<Cell>((cell) => cell.bound);
  const firstHalf = grid.map((n) => 0.5 / n);
  initial.forEach((value, i) => {
    const centre = gridMomentum(grid, i);
    record(value, centre);
    heap.push({ centre, half: firstHalf, bound: bound(value, firstHalf) });
    cells++;
  });
  const goal = () => Math.max(decisionLevel, (1 - relative) * best);
  for (;;) {
    const top = heap.peek()!;
    if (best <= decisionLevel) return { best, at, lower: Math.min(top.bound, best), status: 'below', evaluations, cells, smallestGuard };
    if (top.bound > goal()) return { best, at, lower: top.bound, status: 'above', evaluations, cells, smallestGuard };
    // Below 10⁻¹² the centres of child cells are no longer representable apart from their parent's: stop, undecided.
    if (evaluations + (1 << dims) > budget || top.half.some((h) => h < MINIMAL_HALF_WIDTH)) {
      return { best, at, lower: top.bound, status: top.bound > decisionLevel ? 'above' : 'undecided', evaluations, cells, smallestGuard };
    }
    heap.pop();
    const half = top.half.map((h) => h / 2);
    for (let corner = 0; corner < 1 << dims; corner++) {
      const centre = top.centre.map((c, d) => c + ((corner >> d) & 1 ? half[d] : -half[d]));
      const value = evaluate(centre.map((x) => x - Math.floor(x)));
      evaluations++;
      cells++;
      record(value, centre);
      heap.push({ centre, half, bound: bound(value, half) });
    }
  }
}
