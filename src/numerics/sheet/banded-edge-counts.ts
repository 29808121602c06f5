/**
 * Signed edge counts from only the ribbon states near each gap label: the
 * route for wide ribbons, in work and memory linear in the width.
 *
 * At each momentum k∥ the Floquet operator (or, for a static ribbon, the
 * Hamiltonian) is a band matrix. For the gap named by c, the states on the
 * window |ε − c| < h are found by shift-and-invert, and their number is checked
 * against an exact inertia count (ribbon-windows.ts, banded-shift-invert.ts,
 * unitary-window-count.ts); h is WINDOW_FRACTION of the distance from c to the
 * nearer bulk band edge, so every state in the window is a boundary state or
 * a bulk state pushed there by the finite width.
 *
 * Momentum grid. Every quasienergy moves at most v per unit of k∥, v the
 * bound of velocity-bound.ts (Duhamel and the matching-distance theorem). With
 * steps Δk ≤ h/v, a state that crosses c at k* lies in the window on the whole
 * interval |k − k*| < h/v, which holds at least one sample on each side of k*:
 * no crossing can happen unseen, and the two samples that bracket it both see
 * the crossing state.
 *
 * Following the states. Between neighbouring samples the states are matched
 * by the largest overlap |⟨ψ(k)|ψ(k′)⟩|² (the periodic Bloch gauge makes k and
 * k + 1 identical, which closes the loop). An interval is bisected (adaptive
 * refinement) while a state below c and one above c at the two ends have no
 * clear partners (they may be one crossing state), two states claim the same
 * partner, a crossing is tracked with overlap below CLEAN_OVERLAP, a crossing
 * state lies within its error bound of c, or a crossing is not yet located to
 * CROSSING_RESOLUTION in k∥. A crossing's direction is the sign of
 * ε(k′) − ε(k) of the matched pair, certified by the two values lying on
 * opposite sides of c by more than their error bounds (residual of the
 * eigenpair plus the truncation and time-integration bounds of the operator):
 * the sign of dε/dk∥ by a certified difference.
 *
 * Near-degenerate states of the two edges (|Δφ| < DEGENERATE_PHASE) are
 * returned by any eigensolver as arbitrary mixtures; inside such a group the
 * basis is rotated to diagonalise the weight on the low edge, which separates
 * the edges again. Decay lengths, localisation and the settled rules are those
 * of the dense route (edge-modes.ts, judgeEdgeCounts), so both routes give the
 * same counts on the same ribbon.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import { projectColumns, rotateColumnsInPlace } from '../linalg/complex-matrix.ts';
import { HermitianEigen } from '../linalg/hermitian-eigen.ts';
import type { EdgeCountReport, EdgeCrossing } from '../portrait.ts';
import { aboveCut, circularDifference } from '../quasienergy-bands.ts';
import type { WindowSource } from './ribbon-windows.ts';
import { MAX_WINDOW_STATES } from './ribbon-windows.ts';
import type { EdgeCountOptions, GapArc } from './edge-modes.ts';
import { fitDecayLength, judgeEdgeCounts } from './edge-modes.ts';
import { columnCellWeights } from './ribbon.ts';

/** Window half-width as a fraction of the distance from the label to the nearer bulk band edge. */
export const WINDOW_FRACTION = 0.8;
/** Largest window half-width (units π/T): the inertia count needs the arc well inside a half circle. */
const MAX_WINDOW = 0.45;
/** Overlap above which a crossing counts as cleanly tracked. */
export const CLEAN_OVERLAP = 0.9;
/** Crossings are located to this accuracy in k∥ (reduced units). */
export const CROSSING_RESOLUTION = 1 / 4096;
/** Eigenphases closer than this (radians) are treated as degenerate and split by edge. */
export const DEGENERATE_PHASE = 1e-8;
/**
 * Where an interval is split: not its midpoint, so that refinement of the grid
 * (j + 1/2)/n never lands on the symmetric momenta 0 and 1/2, where the two
 * edges' states are often exactly degenerate at a label.
 */
const SPLIT = 0.5 - 1 / (8 * Math.PI);

export interface BandedCountOptions extends EdgeCountOptions {
  width: number;
  edgeCells: number;
  orbitalsPerCell: number;
  /** Bound on |dε/dk∥| (units π/T per unit k∥), velocity-bound.ts. */
  velocityBound: number;
  /** Least number of momenta of the base grid (default 32). */
  minMomenta?: number;
  /** Most momenta on the base grid (default 8192); a coarser grid than the velocity bound asks for leaves the count unsettled. */
  maxMomenta?: number;
  /** Most bisection levels below a base interval (default 20). */
  maxDepth?: number;
  /** Largest accepted residual of the window eigenpairs (default 1e-10). */
  residualTolerance?: number;
}

export interface BandedGap {
  arc: GapArc;
  /** Bulk decay-length estimate used when no state crosses (cells). */
  bulkDecayLength?: number;
}

export interface BandedGapCounts {
  reports: [EdgeCountReport, EdgeCountReport];
  /** Window half-width h (units π/T). */
  window: number;
  /** Momenta at which the window states were computed (base grid and refinement). */
  momenta: number;
  /** Size of the base grid. */
  baseMomenta: number;
  /** Largest bound on the error of a window quasienergy (units π/T). */
  largestError: number;
  /** Largest truncation bound of the band operators used (radians). */
  largestTruncation: number;
}

interface WindowStates {
  k: number;
  eps: Float64Array;
  /** Bound on |ε − ε_true| per state (units π/T). */
  error: Float64Array;
  vectors: ComplexMatrix;
  low: Float64Array;
  high: Float64Array;
}

interface GapState {
  gap: BandedGap;
  c: number;
  h: number;
  first: WindowStates | null;
  previous: WindowStates | null;
  crossings: Record<'low' | 'high', EdgeCrossing[]>;
  problems: Set<string>;
  decay: number;
  momenta: number;
  largestError: number;
  largestTruncation: number;
  /** A window held more than MAX_WINDOW_STATES states: it reaches into a bulk band. */
  crowded: boolean;
  base: number;
}

/** How often a crowded window is halved before the gap is given up. */
const MAX_WINDOW_HALVINGS = 3;

/** Edge counts in every gap of `gaps` on the ribbon whose banded Floquet operators `propagator` gives. */
export function bandedEdgeCounts(source: WindowSource, gaps: BandedGap[], options: BandedCountOptions): BandedGapCounts[] {
  const { width, edgeCells, orbitalsPerCell } = options;
  const localisation = options.localisation ?? 0.5;
  const trackingOverlap = options.trackingOverlap ?? 0.5;
  const widthRatio = options.widthPerDecayLength ?? 6;
  const maxDepth = options.maxDepth ?? 20;
  const tolerance = options.residualTolerance ?? 1e-10;
  const v = Math.max(options.velocityBound, 1e-12);
  // An even number of points: (j + 1/2)/n then never equals 1/2.
  const even = (x: number) => 2 * Math.ceil(x / 2);
  const needed = (h: number) => Math.ceil(v / h);
  const maxBase = even(options.maxMomenta ?? 8192);
  const fresh = (gap: BandedGap, h: number): GapState => {
    const base = Math.min(maxBase, even(Math.max(options.minMomenta ?? 32, needed(h))));
    const g: GapState = { gap, c: gap.arc.label, h, first: null, previous: null, crossings: { low: [], high: [] }, problems: new Set(), decay: 0, momenta: 0, largestError: 0, largestTruncation: 0, crowded: false, base };
    if (base < needed(h)) {
      g.problems.add(`the momentum grid (${base} points) is coarser than the velocity bound asks for (${needed(h)} points for a window of ${h.toExponential(2)} π/T): a crossing could pass unseen`);
    }
    return g;
  };
  const cells = width;
  const edgeWeights = (vectors: ComplexMatrix, column: number): [number, number] => {
    const w = columnCellWeights(vectors, column, orbitalsPerCell);
    let lo = 0, hi = 0;
    for (let e = 0; e < edgeCells; e++) {
      lo += w[e];
      hi += w[cells - 1 - e];
    }
    return [lo, hi];
  };

  const windowAt = (g: GapState, k: number, start?: ComplexMatrix): WindowStates => {
    g.momenta++;
    const found = source.at(k, g.c, g.h, start);
    if (found.crowded) g.crowded = true;
    else if (found.caveat !== undefined) g.problems.add(`at k∥ = ${(k - Math.floor(k)).toFixed(5)}: ${found.caveat}`);
    const m = found.eps.length;
    splitDegenerate(found.eps, found.vectors, edgeCells, orbitalsPerCell);
    for (const e of found.error) g.largestError = Math.max(g.largestError, e);
    g.largestTruncation = Math.max(g.largestTruncation, found.truncation);
    const low = new Float64Array(m), high = new Float64Array(m);
    for (let j = 0; j < m; j++) [low[j], high[j]] = edgeWeights(found.vectors, j);
    return { k, eps: found.eps, error: found.error, vectors: found.vectors, low, high };
  };

  interface Traced {
    crossings: { edge: 'low' | 'high'; crossing: EdgeCrossing; decay: number; localised: boolean; where: string }[];
    problems: string[];
  }
  const flow = (t: Traced) => {
    let low = 0, high = 0;
    for (const x of t.crossings) x.edge === 'low' ? (low += x.crossing.direction) : (high += x.crossing.direction);
    return `${low},${high},${t.crossings.length}`;
  };
  /**
   * The crossings of c between the windows a and b. Refinement for correctness
   * (ambiguous partners, uncertain sides) always takes the finer result;
   * refinement only to locate a cleanly tracked crossing keeps the coarse one
   * when the finer intervals disagree with it: near the momentum where the two
   * edges' states meet at c they hybridise across a finite ribbon and anticross,
   * and only steps that jump the anticrossing follow each edge's state.
   */
  const track = (g: GapState, a: WindowStates, b: WindowStates, depth: number): Traced => {
    const ma = a.eps.length, mb = b.eps.length;
    const own: Traced = { crossings: [], problems: [] };
    if (ma === 0 && mb === 0) return own;
    const overlap = overlaps(a.vectors, b.vectors);
    const side = (x: number) => circularDifference(x, g.c) > 0;
    const bestOf = (i: number): [number, number] => {
      let best = -1, value = -1;
      for (let j = 0; j < mb; j++) if (overlap[i * mb + j] > value) { value = overlap[i * mb + j]; best = j; }
      return [best, value];
    };
    let ambiguous = false;
    const matches: [number, number, number][] = [];
    const claimed = new Map<number, number>();
    const unmatchedA: number[] = [];
    for (let i = 0; i < ma; i++) {
      const [j, o] = bestOf(i);
      if (j < 0 || o < trackingOverlap) {
        unmatchedA.push(i);
        continue;
      }
      if (claimed.has(j)) ambiguous = true;
      claimed.set(j, i);
      matches.push([i, j, o]);
    }
    const unmatchedB = Array.from({ length: mb }, (_, j) => j).filter((j) => !claimed.has(j));
    // An unpartnered state below c at one end and one above c at the other may be one state crossing c.
    for (const i of unmatchedA) for (const j of unmatchedB) if (side(a.eps[i]) !== side(b.eps[j])) ambiguous = true;
    let coarse = false;
    for (const [i, j, o] of matches) {
      if (side(a.eps[i]) === side(b.eps[j])) continue;
      const certain = Math.abs(circularDifference(a.eps[i], g.c)) > a.error[i] && Math.abs(circularDifference(b.eps[j], g.c)) > b.error[j];
      if (o < CLEAN_OVERLAP || !certain) ambiguous = true;
      else if (b.k - a.k > CROSSING_RESOLUTION) coarse = true;
      const step = circularDifference(b.eps[j], a.eps[i]);
      const low = 0.5 * (a.low[i] + b.low[j]), high = 0.5 * (a.high[i] + b.high[j]);
      const edge = low >= high ? 'low' : 'high';
      const weight = Math.max(low, high);
      // Linear interpolation of the crossing momentum inside the interval.
      const da = circularDifference(g.c, a.eps[i]);
      const fraction = step !== 0 ? Math.min(1, Math.max(0, da / step)) : 0.5;
      const momentum = a.k + fraction * (b.k - a.k);
      const where = `near k∥ = ${(momentum - Math.floor(momentum)).toFixed(4)}`;
      own.crossings.push({
        edge,
        crossing: { momentum: momentum - Math.floor(momentum), direction: step > 0 ? 1 : -1, weight },
        decay: Math.max(fitDecayLength(columnCellWeights(a.vectors, i, orbitalsPerCell), edge), fitDecayLength(columnCellWeights(b.vectors, j, orbitalsPerCell), edge)),
        localised: weight >= localisation,
        where: `${where} (weights ${low.toFixed(2)} low, ${high.toFixed(2)} high in ${edgeCells} cells)`,
      });
    }
    if ((ambiguous || coarse) && depth < maxDepth) {
      const km = a.k + SPLIT * (b.k - a.k);
      const mid = windowAt(g, km, a.vectors);
      if (g.crowded) return own;
      const left = track(g, a, mid, depth + 1), right = track(g, mid, b, depth + 1);
      const finer: Traced = { crossings: [...left.crossings, ...right.crossings], problems: [...left.problems, ...right.problems] };
      if (ambiguous || (finer.problems.length === 0 && flow(finer) === flow(own))) return finer;
      return own;
    }
    if (ambiguous) own.problems.push(`near k∥ = ${(a.k - Math.floor(a.k)).toFixed(5)} the states near ${g.c.toFixed(4)} could not be followed down to Δk∥ = ${(b.k - a.k).toExponential(1)}`);
    return own;
  };

  const record = (g: GapState, t: Traced) => {
    for (const p of t.problems) g.problems.add(p);
    for (const x of t.crossings) {
      g.crossings[x.edge].push(x.crossing);
      g.decay = Math.max(g.decay, x.decay);
      if (!x.localised) g.problems.add(`a state crossing ${g.c.toFixed(4)} ${x.where} is not localised on either edge`);
    }
  };

  /** Follows the windows of the gaps `active`, all on one momentum grid, so the states of a momentum share one operator. */
  const sweep = (active: GapState[]) => {
    const base = Math.max(...active.map((g) => g.base));
    for (const g of active) g.base = base;
    for (let step = 0; step <= base; step++) {
      const k = (step + 0.5) / base;
      // The last step returns to the first momentum, one period later (k and k + 1 are the same operator).
      for (const g of active) {
        if (g.crowded) continue;
        const here = step < base ? windowAt(g, k, g.previous?.vectors) : { ...g.first!, k };
        if (g.crowded) continue;
        if (g.previous !== null) record(g, track(g, g.previous, here, 0));
        if (step === 0) g.first = here;
        g.previous = here;
      }
    }
  };

  let states = gaps.map((gap) => fresh(gap, Math.min(MAX_WINDOW, WINDOW_FRACTION * Math.min(aboveCut(gap.arc.label, gap.arc.lower), aboveCut(gap.arc.upper, gap.arc.label)))));
  sweep(states);
  // A window reaching into a bulk band (the bulk grid overstated the gap): halve it and follow that gap again.
  for (let round = 0; round < MAX_WINDOW_HALVINGS && states.some((g) => g.crowded); round++) {
    const again = states.filter((g) => g.crowded).map((g) => fresh(g.gap, g.h / 2));
    sweep(again);
    states = states.map((g) => (g.crowded ? again.shift()! : g));
  }
  for (const g of states) {
    if (g.crowded) g.problems.add(`even a window of ${g.h.toExponential(2)} π/T around ${g.c.toFixed(4)} holds more than ${MAX_WINDOW_STATES} states: the bulk gap is narrower than the bulk grid shows`);
  }

  return states.map((g) => {
    g.crossings.low.sort((x, y) => x.momentum - y.momentum);
    g.crossings.high.sort((x, y) => x.momentum - y.momentum);
    const reports = judgeEdgeCounts({
      gap: g.c,
      width,
      crossings: g.crossings,
      problems: [...g.problems],
      fittedDecay: g.decay,
      bulkDecayLength: g.gap.bulkDecayLength,
      widthPerDecayLength: widthRatio,
    });
    return { reports, window: g.h, momenta: g.momenta, baseMomenta: g.base, largestError: g.largestError, largestTruncation: g.largestTruncation };
  });
}

/** |⟨a_i|b_j⟩|², row-major (columns of a × columns of b). */
function overlaps(a: ComplexMatrix, b: ComplexMatrix): Float64Array {
  const n = a.rows, ma = a.cols, mb = b.cols;
  const out = new Float64Array(ma * mb);
  for (let i = 0; i < ma; i++) {
    for (let j = 0; j < mb; j++) {
      let re = 0, im = 0;
      for (let r = 0; r < n; r++) {
        const p = r * ma + i, q = r * mb + j;
        re += a.re[p] * b.re[q] + a.im[p] * b.im[q];
        im += a.re[p] * b.im[q] - a.im[p] * b.re[q];
      }
      out[i * mb + j] = re * re + im * im;
    }
  }
  return out;
}

/**
 * Inside every group of quasienergies closer than DEGENERATE_PHASE/π (ordered), rotates the
 * columns to diagonalise the weight in the first `edgeCells` cells: degenerate
 * states of the two edges come out separated, one per edge.
 */
function splitDegenerate(eps: Float64Array, v: ComplexMatrix, edgeCells: number, orbitalsPerCell: number): void {
  const m = eps.length;
  let start = 0;
  for (let j = 1; j <= m; j++) {
    if (j < m && Math.abs(circularDifference(eps[j], eps[j - 1])) * Math.PI < DEGENERATE_PHASE) continue;
    if (j - start > 1) rotateByLowWeight(v, Array.from({ length: j - start }, (_, t) => start + t), edgeCells * orbitalsPerCell);
    start = j;
  }
}

function rotateByLowWeight(v: ComplexMatrix, cols: number[], rows: number): void {
  const z = new HermitianEigen(projectColumns(v, v, cols, rows), { hermiticityTolerance: Infinity }).vectors;
  rotateColumnsInPlace(v, cols, z);
}
