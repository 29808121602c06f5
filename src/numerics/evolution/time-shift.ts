/**
 * Moving the time origin of a drive: the Floquet operator "started at t₀",
 *     U_{t₀} = U(t₀ + T, t₀) = U(t₀) U(T) U(t₀)†,
 * is the Floquet operator of the same drive with its segments rotated so that
 * time t′ = 0 of the new drive is time t₀ of the old one. Quasienergies do not
 * depend on t₀; eigenvectors and the symmetry properties of U do (this is what
 * symmetric time frames exploit: Asbóth & Obuse, PRB 88, 121406(R) (2013)).
 *
 * Rules of the rotation:
 * - a segment of positive duration that contains t₀ strictly inside is split in two;
 * - harmonic modulations and vector potentials, which depend on absolute time,
 *   get their phases advanced by harmonic·ω·t₀ (harmonics are integers, so the
 *   wrapped-around segments need no further change);
 * - kicks (zero-duration segments) sitting exactly at t₀ form the "centre
 *   group": its second half opens the new period and its first half closes it;
 *   with an odd number of kicks the middle kick is split into two half kicks
 *   (K → K/2 twice, exact because both halves have the same generator).
 *   This places t₀ in the middle of the kick group, which is what a symmetric
 *   frame through a kick needs.
 */
import type { DriveSegment, DriveTerm, LatticeDrive, Modulation } from './drive.ts';
import { angularFrequency, segmentStartTimes } from './drive.ts';

/** Times closer than this fraction of T are treated as equal. */
export const TIME_MATCH = 1e-12;

export function shiftTimeOrigin(drive: LatticeDrive, t0: number): LatticeDrive {
  const T = drive.period;
  if (!Number.isFinite(t0)) throw new RangeError(`shiftTimeOrigin: time origin ${t0} is not finite`);
  let t = t0 - T * Math.floor(t0 / T);
  const eps = TIME_MATCH * T;
  if (T - t <= eps) t = 0;
  const omega = angularFrequency(drive);
  const starts = segmentStartTimes(drive);
  const before: DriveSegment[] = [];
  const after: DriveSegment[] = [];
  const centreAtEnd: DriveSegment[] = []; // kicks at time T (≡ 0), come first in the cyclic order at 0
  const centre: DriveSegment[] = [];
  drive.segments.forEach((segment, i) => {
    const a = starts[i], b = a + segment.duration;
    if (segment.duration === 0) {
      if (Math.abs(a - t) <= eps) centre.push(segment);
      else if (t === 0 && Math.abs(a - T) <= eps) centreAtEnd.push(segment);
      else if (a < t) before.push(segment);
      else after.push(segment);
      return;
    }
    if (b <= t + eps) before.push(segment);
    else if (a >= t - eps) after.push(segment);
    else {
      before.push({ ...segment, duration: t - a });
      after.push({ ...segment, duration: b - t });
    }
  });
  const group = [...centreAtEnd, ...centre];
  const m = group.length;
  let opening: DriveSegment[], closing: DriveSegment[];
  if (m % 2 === 0) {
    closing = group.slice(0, m / 2);
    opening = group.slice(m / 2);
  } else {
    const mid = (m - 1) / 2;
    closing = [...group.slice(0, mid), halfKick(group[mid])];
    opening = [halfKick(group[mid]), ...group.slice(mid + 1)];
  }
  const rotated = [...opening, ...after, ...before, ...closing].map((s) => advancePhases(s, omega * t));
  return { ...drive, segments: rotated };
}

/** The same kick with half its generator: exp(−iK/2), twice, is exp(−iK). */
export function halfKick(segment: DriveSegment): DriveSegment {
  return {
    ...segment,
    terms: segment.terms.map((term) => ({ ...term, amplitude: { re: 0.5 * term.amplitude.re, im: 0.5 * term.amplitude.im } })),
  };
}

function advancePhases(segment: DriveSegment, angle: number): DriveSegment {
  if (angle === 0) return segment;
  const out: DriveSegment = { ...segment, terms: segment.terms.map((term) => advanceTerm(term, angle)) };
  if (segment.vectorPotential !== undefined) {
    out.vectorPotential = segment.vectorPotential.map((c) => ({ ...c, phase: c.phase + c.harmonic * angle }));
  }
  return out;
}

function advanceTerm(term: DriveTerm, angle: number): DriveTerm {
  const modulation: Modulation =
    term.modulation.kind === 'constant'
      ? term.modulation
      : { ...term.modulation, components: term.modulation.components.map((c) => ({ ...c, phase: c.phase + c.harmonic * angle })) };
  return { ...term, modulation };
}

/**
 * The evolution over the first half period of the frame t₀, F = U(t₀ + T/2, t₀),
 * as a drive of the same period: the segments of the drive rotated to t₀ up
 * to T/2 (a segment across T/2 is cut there; of a kick group sitting exactly at
 * T/2, the first half, as the rotation splits a group at t₀), followed by an idle
 * second half with no terms. Its Floquet operator is F; harmonics keep their
 * absolute times because the period is unchanged.
 */
export function halfPeriodDrive(drive: LatticeDrive, t0: number): LatticeDrive {
  const rotated = shiftTimeOrigin(drive, t0);
  const T = rotated.period, half = T / 2, eps = TIME_MATCH * T;
  const starts = segmentStartTimes(rotated);
  const first: DriveSegment[] = [];
  const group: DriveSegment[] = [];
  rotated.segments.forEach((segment, i) => {
    const a = starts[i];
    if (segment.duration === 0) {
      if (Math.abs(a - half) <= eps) group.push(segment);
      else if (a < half) first.push(segment);
      return;
    }
    const b = a + segment.duration;
    if (b <= half + eps) first.push(segment);
    else if (a < half - eps) first.push({ ...segment, duration: half - a });
  });
  const m = group.length;
  if (m % 2 === 0) first.push(...group.slice(0, m / 2));
  else first.push(...group.slice(0, (m - 1) / 2), halfKick(group[(m - 1) / 2]));
  // Durations up to T/2 sum to half within rounding; the idle half closes the period exactly.
  const used = first.reduce((x, s) => x + s.duration, 0);
  first.push({ label: 'second half (idle)', duration: T - used, terms: [] });
  return { ...rotated, segments: first };
}
