/**
 * Floquet operators of ribbons and open chains as products of band matrices.
 *
 * A drive cut open by truncateDrive numbers its states cell by cell, so every
 * H(s, t) is banded with half-bandwidth b = driveBandwidth (a few cells' worth
 * of states whatever the width). U(s, T) is built as the ordered product of
 * the segments' propagators, each a band matrix:
 *  - kicks and constant segments: one exponential, exact on disjoint blocks of
 *    the step's bond graph (the common step drives) and otherwise a Chebyshev
 *    expansion with a stated error (banded-exponential.ts);
 *  - time-dependent segments: the CF4 Magnus slices of magnus.ts (two
 *    exponentials per slice, each banded as above) multiplied in band storage
 *    (up to DENSE_SEGMENT_STATES states the dense integrator of propagator.ts
 *    is faster, and its result is taken as it is);
 *    the slice counts are settled once per drive (magnusSlicePlan), normally on
 *    a narrow copy of the ribbon, since the CF4 error is measured with local
 *    norms (row sums) that do not grow with the width.
 * Products grow the bandwidth (b₁ + b₂); entries beyond the bandwidth at which
 * the operator has decayed are cut with a bound (BandedMatrix.truncate). The
 * reported `truncation` bounds ‖U_band − U‖₂ by the sum of the exponential
 * errors and the dropped parts (every factor has norm ≤ 1 + its error, so the
 * errors add to first order); it bounds the shift of every eigenvalue (Bauer–
 * Fike for the normal U) and adds to every residual the eigensolvers certify.
 * Memory and work are linear in the number of states.
 */
import type { LatticeDrive } from './drive.ts';
import { segmentStartTimes } from './drive.ts';
import { compileConstantDrive, driveBandwidth, prepareBloch } from './bloch.ts';
import type { PropagatorOptions } from './propagator.ts';
import { magnusSegment, magnusSlicePlan } from './propagator.ts';
import { CF4_NODES, CF4_WEIGHTS } from './magnus.ts';
import { BandedMatrix, compactBandwidth, multiplyBanded } from '../linalg/banded-matrix.ts';
import { bandedExpMinusIHt, DEFAULT_EXPONENTIAL_TOLERANCE } from '../linalg/banded-exponential.ts';
import { ComponentFinder } from '../linalg/connected-components.ts';
import { truncateDrive } from '../supercell.ts';

/** Time-dependent segments of operators up to this size are integrated densely (propagator.ts). */
export const DENSE_SEGMENT_STATES = 64;

export interface BandedPropagatorOptions {
  propagator?: PropagatorOptions;
  /** Magnus slices per segment (from magnusSlicePlan, e.g. on a narrow copy of the ribbon); settled here when absent. */
  slices?: number[];
  /** Accuracy (radians) the given slice plan reached, reported with every operator. */
  sliceAccuracy?: number;
  /** Bound on the error of each exponential and each truncation of a product (default 1e-14). */
  truncationTolerance?: number;
}

export interface BandedPropagation {
  operator: BandedMatrix;
  /** Bound on ‖U_band − U_integrator‖₂ from the Chebyshev tails and band truncations (0 for exact block steps). */
  truncation: number;
  /** Time-integration accuracy of the Magnus slices (radians, as Propagation.accuracy; 0 for piecewise-constant drives). */
  accuracy: number;
  /** 'exact': every factor exponentiated on disjoint blocks; 'expanded': some factor took the Chebyshev route. */
  route: 'exact' | 'expanded';
}

/** Connected components of a segment's bond graph (structural, momentum-independent). */
function segmentBlocks(drive: LatticeDrive, index: number): number[][] {
  const finder = new ComponentFinder(drive.states.length);
  for (const t of drive.segments[index].terms) if (t.from !== t.to) finder.join(t.from, t.to);
  return finder.components();
}

export interface BandedFloquet {
  /** Number of states (matrix size). */
  size: number;
  /** Half-bandwidth of the Hamiltonians. */
  hamiltonianBandwidth: number;
  /** Magnus slices per segment (1 for constant segments and kicks). */
  slices: number[];
  at(s: ArrayLike<number>): BandedPropagation;
}

export function prepareBandedFloquet(drive: LatticeDrive, options: BandedPropagatorOptions = {}): BandedFloquet {
  if (drive.dimension > 1) throw new RangeError(`prepareBandedFloquet: expects a ribbon or chain (at most one periodic direction), got dimension ${drive.dimension}`);
  const n = drive.states.length;
  const b = driveBandwidth(drive);
  const tolerance = options.truncationTolerance ?? DEFAULT_EXPONENTIAL_TOLERANCE;
  const starts = segmentStartTimes(drive);
  const probe = prepareBloch(drive, new Array<number>(drive.dimension).fill(0));
  const constant = drive.segments.map((seg, i) => seg.duration === 0 || probe.isConstant(i));
  const blocks = drive.segments.map((_, i) => segmentBlocks(drive, i));
  let slices: number[];
  let sliceAccuracy = 0;
  if (constant.every((c) => c)) slices = drive.segments.map(() => 1);
  else if (options.slices !== undefined) {
    slices = options.slices.slice();
    sliceAccuracy = options.sliceAccuracy ?? 0;
  } else {
    const plan = magnusSlicePlan(drive, options.propagator);
    slices = plan.slices;
    sliceAccuracy = plan.accuracy;
  }
  // Piecewise-constant drives: compiled once, only the Bloch phases change with s.
  const compiled = compileConstantDrive(drive);
  const h = new BandedMatrix(n, b);
  const at = (s: ArrayLike<number>): BandedPropagation => {
    const bloch = compiled === null ? prepareBloch(drive, s) : null;
    const fill = (i: number, t: number, out: BandedMatrix) => (bloch === null ? compiled!.fillBanded(i, s, out) : bloch.segmentAtBanded(i, t, out));
    let u = BandedMatrix.identity(n);
    let truncation = 0;
    let expanded = false;
    const apply = (factor: { matrix: BandedMatrix; error: number; route: string }) => {
      truncation += factor.error;
      const product = compactBandwidth(multiplyBanded(factor.matrix, u));
      // Products of exact block factors have no tails to cut.
      if (factor.route === 'chebyshev' || expanded) {
        expanded = true;
        const cut = product.truncate(tolerance);
        u = cut.matrix;
        truncation += cut.dropped;
      } else u = product;
    };
    drive.segments.forEach((seg, i) => {
      if (seg.duration === 0) {
        fill(i, starts[i], h);
        apply(bandedExpMinusIHt(h, 1, blocks[i], tolerance));
      } else if (constant[i]) {
        fill(i, starts[i], h);
        apply(bandedExpMinusIHt(h, seg.duration, blocks[i], tolerance));
      } else if (n <= DENSE_SEGMENT_STATES) {
        const dense = magnusSegment(bloch!, i, starts[i], starts[i] + seg.duration, slices[i]);
        apply({ matrix: BandedMatrix.fromDense(dense, n - 1), error: 0, route: 'dense' });
      } else {
        // CF4 slices: exp(−iτ(α₁H₁ + α₂H₂)) · exp(−iτ(α₂H₁ + α₁H₂)) per slice (magnus.ts).
        const count = slices[i], tau = seg.duration / count;
        const [a1, a2] = CF4_WEIGHTS;
        const h1 = new BandedMatrix(n, b), h2 = new BandedMatrix(n, b), g = new BandedMatrix(n, b);
        for (let k = 0; k < count; k++) {
          fill(i, starts[i] + (k + CF4_NODES[0]) * tau, h1);
          fill(i, starts[i] + (k + CF4_NODES[1]) * tau, h2);
          for (const [c1, c2] of [[a2, a1], [a1, a2]]) {
            for (let p = 0; p < g.re.length; p++) {
              g.re[p] = c1 * h1.re[p] + c2 * h2.re[p];
              g.im[p] = c1 * h1.im[p] + c2 * h2.im[p];
            }
            apply(bandedExpMinusIHt(g, tau, blocks[i], tolerance));
          }
        }
      }
    });
    return { operator: u, truncation, accuracy: sliceAccuracy, route: expanded ? 'expanded' : 'exact' };
  };
  return { size: n, hamiltonianBandwidth: b, slices, at };
}

/** Width of the narrow copy of an open geometry on which Magnus slice counts are settled. */
export const NARROW_PLAN_CELLS = 8;

/**
 * The banded Floquet operators of `drive` cut open to `cells` cells along
 * lattice vector `finiteDirection` (a ribbon from a sheet, an open chain from
 * a chain). Time-dependent segments take the slice counts settled on a copy
 * NARROW_PLAN_CELLS cells wide: the CF4 error is measured with local norms
 * (row sums), which the width does not change.
 */
export function openBandedFloquet(drive: LatticeDrive, finiteDirection: number, cells: number, propagator?: PropagatorOptions): BandedFloquet {
  const open = truncateDrive(drive, finiteDirection, cells);
  const probe = prepareBloch(open, new Array<number>(open.dimension).fill(0));
  const timeDependent = open.segments.some((seg, i) => seg.duration > 0 && !probe.isConstant(i));
  if (!timeDependent || cells <= NARROW_PLAN_CELLS) return prepareBandedFloquet(open, { propagator });
  const plan = magnusSlicePlan(truncateDrive(drive, finiteDirection, NARROW_PLAN_CELLS), propagator);
  return prepareBandedFloquet(open, { propagator, slices: plan.slices, sliceAccuracy: plan.accuracy });
}
