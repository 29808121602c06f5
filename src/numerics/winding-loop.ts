/**
 * The time loop over which the gap winding number is integrated, as a sequence
 * of pieces with a constant generator each.
 *
 * - A constant segment is one piece: U ← exp(−iHτ)U.
 * - A kick exp(−iK) (zero duration) becomes a virtual piece of duration τ_K with
 *   constant generator K/τ_K: exp(−i(K/τ_K)τ_K) = exp(−iK). This reparametrises
 *   the loop U(k, ·) (it inserts a path that the instantaneous kick jumps over);
 *   V(k, ·) stays a closed loop from 1 to 1 with the same end point U(T), so its
 *   homotopy class and hence W are unchanged. τ_K only changes the length T′ of
 *   the loop parameter, and H_eff is taken with respect to T′ (see
 *   winding-integral.ts), which keeps V(T′) = 1.
 * - A time-dependent segment is split into the slices of the fourth-order
 *   commutator-free Magnus integrator used by the propagator (magnus.ts), each
 *   slice being two exponentials of Hermitian generators, i.e. two pieces of
 *   duration h/2 with generators 2(α₂H₁ + α₁H₂) and 2(α₁H₁ + α₂H₂). This loop
 *   is a piecewise-constant drive whose U(T) differs from the exact one by the
 *   propagator's tolerance; as long as that is far below the gap at the cut,
 *   the straight-line homotopy between the two drives keeps the gap open, so
 *   the two have the same W.
 */
import type { ComplexMatrix } from './linalg/complex-matrix.ts';
import type { LatticeDrive } from './drive.ts';
import { segmentStartTimes } from './drive.ts';
import type { PreparedBloch } from './bloch.ts';
import { prepareBloch } from './bloch.ts';
import { CF4_NODES, CF4_WEIGHTS } from './magnus.ts';
import type { PropagatorOptions } from './propagator.ts';
import { floquetOperator } from './propagator.ts';

export interface LoopPiece {
  /** Index of the drive segment the piece belongs to. */
  segment: number;
  kind: 'step' | 'kick' | 'slice';
  /** Duration in the loop parameter (physical time except for kicks). */
  duration: number;
  /** The piece's generator is Σ weight · H_segment(time). */
  samples: { time: number; weight: number }[];
}

export interface LoopPlan {
  pieces: LoopPiece[];
  /** Length T′ of the loop parameter: the period plus the virtual durations of kicks. */
  length: number;
}

/**
 * Pieces of the loop. `slices[i]` is the Magnus slice count of segment i (used
 * only for time-dependent segments; see magnusSliceCounts).
 */
export function planLoop(drive: LatticeDrive, bloch: PreparedBloch, slices: number[]): LoopPlan {
  const starts = segmentStartTimes(drive);
  const kickDuration = drive.period / drive.segments.length;
  const pieces: LoopPiece[] = [];
  let length = 0;
  drive.segments.forEach((seg, i) => {
    if (seg.duration === 0) {
      pieces.push({ segment: i, kind: 'kick', duration: kickDuration, samples: [{ time: starts[i], weight: 1 / kickDuration }] });
      length += kickDuration;
      return;
    }
    length += seg.duration;
    if (bloch.isConstant(i)) {
      pieces.push({ segment: i, kind: 'step', duration: seg.duration, samples: [{ time: starts[i], weight: 1 }] });
      return;
    }
    const m = Math.max(1, slices[i] ?? 1);
    const h = seg.duration / m;
    const [c1, c2] = CF4_NODES;
    const [a1, a2] = CF4_WEIGHTS;
    for (let k = 0; k < m; k++) {
      const t1 = starts[i] + (k + c1) * h, t2 = starts[i] + (k + c2) * h;
      // exp(−ih(α₂H₁ + α₁H₂)) acts first, then exp(−ih(α₁H₁ + α₂H₂)) (magnus.ts).
      pieces.push({ segment: i, kind: 'slice', duration: h / 2, samples: [{ time: t1, weight: 2 * a2 }, { time: t2, weight: 2 * a1 }] });
      pieces.push({ segment: i, kind: 'slice', duration: h / 2, samples: [{ time: t1, weight: 2 * a1 }, { time: t2, weight: 2 * a2 }] });
    }
  });
  return { pieces, length };
}

/**
 * Magnus slice counts per segment: the largest the propagator chose over the
 * given momenta (1 for constant segments and kicks).
 */
export function magnusSliceCounts(drive: LatticeDrive, momenta: number[][], options?: PropagatorOptions): number[] {
  const counts = drive.segments.map(() => 1);
  const bloch = prepareBloch(drive, new Array(drive.dimension).fill(0));
  if (drive.segments.every((seg, i) => seg.duration === 0 || bloch.isConstant(i))) return counts;
  for (const s of momenta) {
    const p = floquetOperator(drive, s, options);
    p.slices.forEach((m, i) => (counts[i] = Math.max(counts[i], m)));
  }
  return counts;
}

/** Writes the generator of `piece` at the momentum `bloch` was prepared for into `out`. */
export function pieceGenerator(bloch: PreparedBloch, piece: LoopPiece, out: ComplexMatrix, scratch: ComplexMatrix): ComplexMatrix {
  const nn = out.re.length;
  out.re.fill(0);
  out.im.fill(0);
  for (const { time, weight } of piece.samples) {
    bloch.segmentAt(piece.segment, time, scratch);
    for (let q = 0; q < nn; q++) {
      out.re[q] += weight * scratch.re[q];
      out.im[q] += weight * scratch.im[q];
    }
  }
  return out;
}
