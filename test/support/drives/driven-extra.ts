/**
 * Re-timed copies of a drive, for tests of invariance under a change of the
 * time origin and of the order of the steps.
 *
 * - `reorderSegments(drive, order)` applies the segments in a new order
 *   (0-based indices into drive.segments). A cyclic rotation moves the time
 *   origin by whole steps; the reversed list runs the protocol backwards, which
 *   is the time-reversed protocol only when every segment is constant in time
 *   (otherwise each segment would also have to run backwards inside).
 * - `shiftTimeOrigin(drive, t0)` gives H′(t) = H(t + t0 mod T): the segment
 *   containing t0 is split in two, and every harmonic (modulations and vector
 *   potentials, whose times are absolute in drive.ts) gets the phase
 *   harmonic·ω·t0 so that it takes at t the value the original took at t + t0.
 *
 * Both return deep copies and leave the input untouched.
 */
import type { DriveSegment, DriveTerm, LatticeDrive, Modulation, VectorPotentialComponent } from '../../../src/numerics/evolution/drive.ts';

function copyTerm(term: DriveTerm, phaseShift: (harmonic: number) => number): DriveTerm {
  const modulation: Modulation =
    term.modulation.kind === 'constant'
      ? { kind: 'constant' }
      : {
          kind: 'harmonic',
          mean: term.modulation.mean,
          components: term.modulation.components.map((c) => ({ amplitude: c.amplitude, harmonic: c.harmonic, phase: c.phase + phaseShift(c.harmonic) })),
        };
  return { from: term.from, to: term.to, offset: term.offset.slice(), amplitude: { ...term.amplitude }, modulation };
}

function copySegment(segment: DriveSegment, duration: number, phaseShift: (harmonic: number) => number = () => 0): DriveSegment {
  const copy: DriveSegment = { duration, terms: segment.terms.map((t) => copyTerm(t, phaseShift)) };
  if (segment.label !== undefined) copy.label = segment.label;
  if (segment.vectorPotential !== undefined) {
    copy.vectorPotential = segment.vectorPotential.map(
      (c): VectorPotentialComponent => ({ amplitude: c.amplitude.slice(), harmonic: c.harmonic, phase: c.phase + phaseShift(c.harmonic) }),
    );
  }
  return copy;
}

function withSegments(drive: LatticeDrive, segments: DriveSegment[]): LatticeDrive {
  return {
    dimension: drive.dimension,
    spaceDimension: drive.spaceDimension,
    latticeVectors: drive.latticeVectors.map((v) => v.slice()),
    states: drive.states.map((s) => ({ ...s, position: s.position.slice() })),
    period: drive.period,
    segments,
  };
}

/** The drive with its segments applied in `order` (a permutation of 0 … segments−1). */
export function reorderSegments(drive: LatticeDrive, order: number[]): LatticeDrive {
  const n = drive.segments.length;
  if (order.length !== n || [...order].sort((a, b) => a - b).some((x, i) => x !== i)) {
    throw new RangeError(`reorderSegments: order must be a permutation of 0…${n - 1}, got [${order.join(', ')}]`);
  }
  return withSegments(drive, order.map((i) => copySegment(drive.segments[i], drive.segments[i].duration)));
}

/** The segments rotated cyclically so that segment `first` comes first. */
export function rotateSegments(drive: LatticeDrive, first: number): LatticeDrive {
  const n = drive.segments.length;
  return reorderSegments(drive, Array.from({ length: n }, (_, i) => (first + i) % n));
}

/** The segments in reverse order. */
export function reverseSegments(drive: LatticeDrive): LatticeDrive {
  return reorderSegments(drive, drive.segments.map((_, i) => drive.segments.length - 1 - i));
}

/** H′(t) = H(t + t0 mod T) for 0 ≤ t0 < T (integer harmonics only, so that H stays T-periodic). */
export function shiftTimeOrigin(drive: LatticeDrive, t0: number): LatticeDrive {
  const T = drive.period;
  if (!(t0 >= 0 && t0 < T)) throw new RangeError(`shiftTimeOrigin: t0 must lie in [0, ${T}), got ${t0}`);
  const omega = (2 * Math.PI) / T;
  const shift = (harmonic: number): number => {
    if (!Number.isInteger(harmonic)) throw new RangeError(`shiftTimeOrigin: harmonic ${harmonic} is not an integer; the drive would not be periodic`);
    return harmonic * omega * t0;
  };
  const before: DriveSegment[] = [];
  const after: DriveSegment[] = [];
  let start = 0;
  for (const segment of drive.segments) {
    const end = start + segment.duration;
    if (end <= t0 && !(segment.duration === 0 && start === t0)) before.push(copySegment(segment, segment.duration, shift));
    else if (start >= t0) after.push(copySegment(segment, segment.duration, shift));
    else {
      // t0 falls strictly inside this segment: its tail opens the new period, its head closes it.
      after.push(copySegment(segment, end - t0, shift));
      before.push(copySegment(segment, t0 - start, shift));
    }
    start = end;
  }
  return withSegments(drive, [...after, ...before]);
}
