/**
 * Adaptive cubature over the Brillouin zone (the unit torus of reduced
 * momenta) for a vector of integrands evaluated together, with local error
 * estimates: each cell carries the tensor-product 15-point Kronrod rule and
 * the 7-point Gauss rule nested in it (winding/quadrature-rules.ts), and
 * |Kronrod − Gauss| is the cell's error estimate (Piessens et al., QUADPACK
 * (1983), without the heuristic rescaling: the estimate stays conservative).
 * The cell with the largest estimate relative to its tolerance is bisected
 * along the direction whose one-dimensional Gauss rule differs most from
 * Kronrod (the fourth-difference idea of Genz & Malik, J. Comput. Appl. Math.
 * 6, 295 (1980), read off the same 225 values), until every component's total
 * estimate is within its tolerance or the evaluation budget is spent.
 * Cells wrap around the torus, so no boundary is special.
 */
import { gaussKronrod15 } from './quadrature-rules.ts';
import { BinaryHeap } from '../../binary-heap.ts';

/** A rectangle [x, x + w) × [y, y + h) of reduced momenta. */
export interface QuadratureCell {
  x: number;
  y: number;
  w: number;
  h: number;
}

export interface CubatureOptions {
  /** Number of integrands evaluated together. */
  components: number;
  /** Writes the integrands at (s₁, s₂) into out (length `components`). */
  integrand: (s1: number, s2: number, out: Float64Array) => void;
  /** The initial mesh; together the cells must tile the torus once. */
  cells: QuadratureCell[];
  /** Absolute error target per component (of the integral over the torus). */
  tolerance: number[];
  /** Components whose error drives refinement (default all). */
  active?: boolean[];
  /** Most integrand evaluations (each cell costs 225). */
  budget: number;
  /** Called after the first pass over the mesh and whenever the evaluation count has doubled since the last call. */
  checkpoint?: (state: CubatureState) => void;
}

export interface CubatureState {
  /** Kronrod sums, the nested Gauss sums and summed |Kronrod − Gauss| per component. */
  values: Float64Array;
  gaussValues: Float64Array;
  errors: Float64Array;
  evaluations: number;
  cells: number;
}

export interface CubatureResult extends CubatureState {
  /** Per component: total error estimate within its tolerance. */
  converged: boolean[];
  /** True when the budget stopped the refinement. */
  budgetSpent: boolean;
}

interface Leaf {
  cell: QuadratureCell;
  values: Float64Array;
  gauss: Float64Array;
  errors: Float64Array;
  /** Which direction (0: s₁, 1: s₂) to bisect. */
  split: 0 | 1;
  score: number;
}


export const POINTS_PER_CELL = 225;

export function adaptiveCubature(options: CubatureOptions): CubatureResult {
  const { components, integrand, tolerance, budget } = options;
  const active = options.active ?? tolerance.map(() => true);
  const rule = gaussKronrod15();
  const m = rule.nodes.length;
  const isGauss = new Int32Array(m).fill(-1);
  rule.gaussIndices.forEach((idx, g) => (isGauss[idx] = g));
  const f = new Float64Array(components);
  const grid = new Float64Array(m * m * components);
  let evaluations = 0;

  const evaluateCell = (cell: QuadratureCell): Leaf => {
    for (let i = 0; i < m; i++) {
      const s1 = cell.x + (cell.w * (1 + rule.nodes[i])) / 2;
      for (let j = 0; j < m; j++) {
        const s2 = cell.y + (cell.h * (1 + rule.nodes[j])) / 2;
        integrand(s1 - Math.floor(s1), s2 - Math.floor(s2), f);
        grid.set(f, (i * m + j) * components);
      }
    }
    evaluations += m * m;
    const area = (cell.w * cell.h) / 4;
    const values = new Float64Array(components), gauss = new Float64Array(components), errors = new Float64Array(components);
    let worst1 = 0, worst2 = 0, score = 0;
    for (let c = 0; c < components; c++) {
      // KK: Kronrod ⊗ Kronrod; GG: Gauss ⊗ Gauss; GK, KG: Gauss along one direction only.
      let kk = 0, gg = 0, gk = 0, kg = 0;
      for (let i = 0; i < m; i++) {
        const wi = rule.kronrodWeights[i], gi = isGauss[i] >= 0 ? rule.gaussWeights[isGauss[i]] : 0;
        for (let j = 0; j < m; j++) {
          const v = grid[(i * m + j) * components + c];
          const wj = rule.kronrodWeights[j], gj = isGauss[j] >= 0 ? rule.gaussWeights[isGauss[j]] : 0;
          kk += wi * wj * v;
          gg += gi * gj * v;
          gk += gi * wj * v;
          kg += wi * gj * v;
        }
      }
      values[c] = area * kk;
      gauss[c] = area * gg;
      errors[c] = area * Math.abs(kk - gg);
      if (active[c]) {
        score = Math.max(score, errors[c] / tolerance[c]);
        worst1 = Math.max(worst1, Math.abs(kk - gk) / tolerance[c]);
        worst2 = Math.max(worst2, Math.abs(kk - kg) / tolerance[c]);
      }
    }
    // Bisect where the one-dimensional rule errs more; a square-ish cell breaks ties by its longer side.
    const split: 0 | 1 = worst1 > 1.5 * worst2 ? 0 : worst2 > 1.5 * worst1 ? 1 : cell.w >= cell.h ? 0 : 1;
    return { cell, values, gauss, errors, split, score };
  };

  const heap = new BinaryHeap<Leaf>((leaf) => leaf.score, true);
  const values = new Float64Array(components), gaussValues = new Float64Array(components), errors = new Float64Array(components);
  const add = (leaf: Leaf, sign: 1 | -1) => {
    for (let c = 0; c < components; c++) {
      values[c] += sign * leaf.values[c];
      gaussValues[c] += sign * leaf.gauss[c];
      errors[c] += sign * leaf.errors[c];
    }
  };
  for (const cell of options.cells) {
    const leaf = evaluateCell(cell);
    heap.push(leaf);
    add(leaf, 1);
  }
  const state = (): CubatureState => ({ values: values.slice(), gaussValues: gaussValues.slice(), errors: errors.slice(), evaluations, cells: heap.size });
  options.checkpoint?.(state());
  let nextCheckpoint = 2 * evaluations;
  const done = () => tolerance.every((t, c) => !active[c] || errors[c] <= t);
  let budgetSpent = false;
  while (!done()) {
    if (evaluations + 2 * POINTS_PER_CELL > budget) {
      budgetSpent = true;
      break;
    }
    const leaf = heap.pop()!;
    const { x, y, w, h } = leaf.cell;
    const halves: QuadratureCell[] =
      leaf.split === 0
        ? [{ x, y, w: w / 2, h }, { x: x + w / 2, y, w: w / 2, h }]
        : [{ x, y, w, h: h / 2 }, { x, y: y + h / 2, w, h: h / 2 }];
    add(leaf, -1);
    for (const cell of halves) {
      const child = evaluateCell(cell);
      heap.push(child);
      add(child, 1);
    }
    if (evaluations >= nextCheckpoint) {
      options.checkpoint?.(state());
      nextCheckpoint = 2 * evaluations;
    }
  }
  // Sum the leaves afresh: the running totals above accumulate rounding over many updates.
  values.fill(0);
  gaussValues.fill(0);
  errors.fill(0);
  for (const leaf of heap.all()) add(leaf, 1);
  const result: CubatureResult = { ...state(), converged: tolerance.map((t, c) => errors[c] <= t), budgetSpent };
  return result;
}
