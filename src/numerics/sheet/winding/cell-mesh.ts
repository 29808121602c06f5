/**
 * The first mesh of the adaptive winding quadrature, graded towards small
 * gaps: every cell is small against its own distance from the cut to the
 * spectrum.
 *
 * The winding density is analytic in momentum while the gap at the cut is
 * open, and its radius of analyticity near a small gap scales with the
 * distance d(s) from the cut to the spectrum (winding/density.ts). A cell of
 * half-widths (h₁, h₂) whose centre c satisfies
 *     L₁h₁ + L₂h₂ ≤ κ·d(c)      (L the Lipschitz bound of quasienergies, κ < 1)
 * is small against the scale on which the density varies, so the
 * Gauss–Kronrod rule on it converges fast; with κ < 1 it would moreover keep
 * d ≥ (1 − κ)d(c) > 0 on the whole cell (a certificate that the gap stays
 * open; the quadrature uses κ ≈ 16, since L overestimates the local slope). Starting from a uniform
 * n × n mesh, cells are quartered until every cell satisfies the inequality
 * for every cut, which grades the mesh geometrically towards each near-closing
 * whatever its position: no minimum has to be found first, and none can be
 * missed. A centre closer than `closingFloor` to a cut means the gap closes:
 * that cut stops driving the refinement and its W is not defined.
 */
import type { QuadratureCell } from './adaptive-quadrature.ts';

/** A momentum where the distance to a cut has a sharp local minimum, and the widths d/v of the minimum per direction. */
export interface MeshFocus {
  centre: [number, number];
  widths: [number, number];
}

export interface MeshOptions {
  /** Quasienergies (units π/T) of U(s, T) at a reduced momentum. */
  spectrum: (s: number[]) => ArrayLike<number>;
  /** Cut quasienergies (units π/T). */
  cuts: number[];
  /** Lipschitz bounds of quasienergies per direction (units π/T per unit of reduced momentum). */
  lipschitz: number[];
  /** Cells per direction of the uniform start (default 4). */
  initial?: number;
  /** κ in L₁h₁ + L₂h₂ ≤ κ·d(c) (default 0.5). */
  fraction?: number;
  /** A cut closer than this to the spectrum (units π/T) counts as closed (default 1e-6). */
  closingFloor?: number;
  /** Most spectra evaluated (default 200000). */
  budget?: number;
  /**
   * Sharp minima found beforehand (winding/probe.ts): a cell at distance r from a
   * focus must be no wider than max(4 × width, r) in each direction, a geometric
   * grading towards each minimum down to a few of its widths.
   */
  foci?: MeshFocus[];
}

export interface CutDistance {
  /** Smallest distance from the cut to the spectrum at a cell centre (units π/T), and where. */
  smallest: number;
  at: [number, number];
  /** Certified lower bound on the distance over the whole zone: min over cells of d(c) − (L₁h₁ + L₂h₂); 0 when closed. */
  lower: number;
  /** True when a centre came within the closing floor, or a cell could not be made small enough. */
  closed: boolean;
}

export interface GradedMesh {
  cells: QuadratureCell[];
  cuts: CutDistance[];
  /** Spectra evaluated. */
  evaluations: number;
  /** False when the budget stopped the grading (the cells are then not all certified). */
  complete: boolean;
}

/** Distance (units π/T) from `cut` to the nearest quasienergy on the circle of circumference 2. */
function distanceTo(quasienergies: ArrayLike<number>, cut: number): number {
  let d = Infinity;
  for (let i = 0; i < quasienergies.length; i++) {
    const x = quasienergies[i] - cut;
    const up = x - 2 * Math.floor(x / 2);
    d = Math.min(d, up, 2 - up);
  }
  return d;
}

/** Cells narrower than this (reduced momentum) are not quartered further. */
const SMALLEST_CELL = 1e-10;
/** Ratio of a cell's width to its distance from a focus in the graded region, and to the focus' own width at the focus. */
const GRADING = 1;
const FOCUS_CELLS = 4;

/** Periodic distance from x to the interval [a, a + w) on the unit circle. */
function circleDistance(x: number, a: number, w: number): number {
  const d = x - a - Math.floor(x - a);
  return d < w ? 0 : Math.min(d - w, 1 - d);
}

/** Whether a cell is too wide for some focus (a geometric grading towards it). */
function tooWideForFoci(cell: QuadratureCell, foci: MeshFocus[]): boolean {
  for (const f of foci) {
    const r = Math.hypot(circleDistance(f.centre[0], cell.x, cell.w), circleDistance(f.centre[1], cell.y, cell.h));
    if (cell.w > Math.max(FOCUS_CELLS * f.widths[0], GRADING * r) || cell.h > Math.max(FOCUS_CELLS * f.widths[1], GRADING * r)) return true;
  }
  return false;
}

export function gradedMesh(options: MeshOptions): GradedMesh {
  const n = options.initial ?? 4;
  const kappa = options.fraction ?? 0.5;
  const floor = options.closingFloor ?? 1e-6;
  const budget = options.budget ?? 200000;
  const [l1, l2] = options.lipschitz;
  const cuts: CutDistance[] = options.cuts.map(() => ({ smallest: Infinity, at: [0, 0], lower: Infinity, closed: false }));
  const stack: QuadratureCell[] = [];
  for (let i = n - 1; i >= 0; i--) for (let j = n - 1; j >= 0; j--) stack.push({ x: i / n, y: j / n, w: 1 / n, h: 1 / n });
  const cells: QuadratureCell[] = [];
  let evaluations = 0, complete = true;
  while (stack.length > 0) {
    const cell = stack.pop()!;
    const c1 = cell.x + cell.w / 2, c2 = cell.y + cell.h / 2;
    const q = options.spectrum([c1 - Math.floor(c1), c2 - Math.floor(c2)]);
    evaluations++;
    const spread = (l1 * cell.w) / 2 + (l2 * cell.h) / 2;
    const distances = options.cuts.map((cut) => distanceTo(q, cut));
    let split = cell.w >= SMALLEST_CELL && tooWideForFoci(cell, options.foci ?? []);
    distances.forEach((d, j) => {
      const record = cuts[j];
      if (d < record.smallest) {
        record.smallest = d;
        record.at = [c1 - Math.floor(c1), c2 - Math.floor(c2)];
      }
      if (record.closed) return;
      if (d < floor) record.closed = true;
      else if (spread > kappa * d) {
        if (cell.w < SMALLEST_CELL) record.closed = true;
        else split = true;
      }
    });
    if (split && evaluations + 4 <= budget) {
      const w = cell.w / 2, h = cell.h / 2;
      stack.push({ x: cell.x, y: cell.y, w, h }, { x: cell.x + w, y: cell.y, w, h }, { x: cell.x, y: cell.y + h, w, h }, { x: cell.x + w, y: cell.y + h, w, h });
      continue;
    }
    if (split) complete = false;
    cells.push(cell);
    // Only kept cells bound the distance: a quartered cell's bound is superseded by its children's.
    distances.forEach((d, j) => (cuts[j].lower = Math.min(cuts[j].lower, d - spread)));
  }
  for (const record of cuts) record.lower = record.closed ? 0 : Math.max(0, record.lower);
  return { cells, cuts, evaluations, complete };
}
